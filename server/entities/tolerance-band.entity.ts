import { EntitySchema } from 'typeorm';
import type { View } from '@shared/keypoints';
import { foreignKey, idColumn, nullableUuidColumn, timestampColumn, uuidColumn } from './columns';

/** The accepted range of one metric for one age group and camera view. */
export interface ToleranceBand {
  id: string;
  clubId: string;
  ageGroupId: string;
  metric: string;
  /** The view the metric is measured in; "both" for metrics of either view. */
  view: View | 'both';
  min: number | null;
  max: number | null;
  target: number | null;
  /** "common practice" for seeded rules of thumb, "club" once a coach sets it. */
  source: 'common practice' | 'club';
  /** 1 when seeded, one more with every change (tolerance_band_change keeps each). */
  version: number;
  updatedById: string | null;
  updatedAt: Date;
}

export const ToleranceBandEntity = new EntitySchema<ToleranceBand>({
  name: 'ToleranceBand',
  tableName: 'tolerance_band',
  columns: {
    id: idColumn,
    clubId: uuidColumn,
    ageGroupId: uuidColumn,
    metric: { type: 'varchar', length: 60 },
    view: { type: 'varchar', length: 10 },
    min: { type: 'real', nullable: true },
    max: { type: 'real', nullable: true },
    target: { type: 'real', nullable: true },
    source: { type: 'varchar', length: 20, default: 'common practice' },
    version: { type: 'integer', default: 1 },
    updatedById: nullableUuidColumn,
    updatedAt: timestampColumn,
  },
  foreignKeys: [
    foreignKey('Club', 'clubId', 'CASCADE'),
    foreignKey('AgeGroup', 'ageGroupId', 'CASCADE'),
    foreignKey('User', 'updatedById', 'SET NULL'),
  ],
  uniques: [{ name: 'UQ_tolerance_band_group_metric_view', columns: ['ageGroupId', 'metric', 'view'] }],
});
