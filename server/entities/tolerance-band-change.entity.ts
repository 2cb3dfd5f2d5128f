import { EntitySchema } from 'typeorm';
import { foreignKey, idColumn, nullableUuidColumn, timestampColumn, uuidColumn } from './columns';

/** One change of a tolerance band, kept for good: who, when, and the band before and after. */
export interface ToleranceBandChange {
  id: string;
  clubId: string;
  ageGroupId: string;
  metric: string;
  /** The band's version after the change. */
  version: number;
  action: 'edit' | 'reset';
  /** Null when the band did not exist before (a metric with no seeded band). */
  before: BandValues | null;
  after: BandValues;
  changedById: string | null;
  changedAt: Date;
}

export interface BandValues {
  min: number | null;
  max: number | null;
  target: number | null;
  source: 'common practice' | 'club';
}

export const ToleranceBandChangeEntity = new EntitySchema<ToleranceBandChange>({
  name: 'ToleranceBandChange',
  tableName: 'tolerance_band_change',
  columns: {
    id: idColumn,
    clubId: uuidColumn,
    ageGroupId: uuidColumn,
    metric: { type: 'varchar', length: 60 },
    version: { type: 'integer' },
    action: { type: 'varchar', length: 10 },
    before: { type: 'simple-json', nullable: true },
    after: { type: 'simple-json' },
    changedById: nullableUuidColumn,
    changedAt: timestampColumn,
  },
  foreignKeys: [
    foreignKey('Club', 'clubId', 'CASCADE'),
    foreignKey('AgeGroup', 'ageGroupId', 'CASCADE'),
    foreignKey('User', 'changedById', 'SET NULL'),
  ],
  indices: [{ name: 'IDX_tolerance_band_change_club_time', columns: ['clubId', 'changedAt'] }],
});
