import { EntitySchema } from 'typeorm';
import type { FocusPhase, TargetDirection } from '@shared/plan';
import type { FocusStatus } from '@shared/schemas/plan.schema';
import type { BandMetricKey } from '@shared/tolerance';
import { foreignKey, idColumn, nullableUuidColumn, timestampColumn, uuidColumn } from './columns';

/** One ranked item of an athlete's season plan: a metric with a phase and target, or free text. */
export interface FocusPoint {
  id: string;
  athleteId: string;
  seasonId: string;
  rank: number;
  title: string;
  cue: string;
  metric: BandMetricKey | null;
  phase: FocusPhase | null;
  targetMin: number | null;
  targetMax: number | null;
  direction: TargetDirection | null;
  status: FocusStatus;
  createdById: string | null;
  createdAt: Date;
  updatedAt: Date;
}

export const FocusPointEntity = new EntitySchema<FocusPoint>({
  name: 'FocusPoint',
  tableName: 'focus_point',
  columns: {
    id: idColumn,
    athleteId: uuidColumn,
    seasonId: uuidColumn,
    rank: { type: 'integer' },
    title: { type: 'varchar', length: 120 },
    cue: { type: 'text', default: '' },
    metric: { type: 'varchar', length: 60, nullable: true },
    phase: { type: 'varchar', length: 12, nullable: true },
    targetMin: { type: 'real', nullable: true },
    targetMax: { type: 'real', nullable: true },
    direction: { type: 'varchar', length: 10, nullable: true },
    status: { type: 'varchar', length: 12, default: 'planned' },
    createdById: nullableUuidColumn,
    createdAt: timestampColumn,
    updatedAt: timestampColumn,
  },
  foreignKeys: [
    foreignKey('Athlete', 'athleteId', 'CASCADE'),
    foreignKey('Season', 'seasonId', 'CASCADE'),
    foreignKey('User', 'createdById', 'SET NULL'),
  ],
  indices: [{ name: 'IDX_focus_point_plan', columns: ['athleteId', 'seasonId', 'rank'] }],
});
