import { EntitySchema } from 'typeorm';
import { foreignKey, idColumn, nullableUuidColumn, timestampColumn, uuidColumn } from './columns';

/** One ranked item of an athlete's season plan, optionally tied to a metric and target range. */
export interface FocusPoint {
  id: string;
  athleteId: string;
  createdById: string | null;
  rank: number;
  title: string;
  metric: string | null;
  targetMin: number | null;
  targetMax: number | null;
  baselineClipId: string | null;
  status: 'active' | 'achieved' | 'dropped';
  createdAt: Date;
}

export const FocusPointEntity = new EntitySchema<FocusPoint>({
  name: 'FocusPoint',
  tableName: 'focus_point',
  columns: {
    id: idColumn,
    athleteId: uuidColumn,
    createdById: nullableUuidColumn,
    rank: { type: 'integer' },
    title: { type: 'varchar', length: 200 },
    metric: { type: 'varchar', length: 60, nullable: true },
    targetMin: { type: 'real', nullable: true },
    targetMax: { type: 'real', nullable: true },
    baselineClipId: nullableUuidColumn,
    status: { type: 'varchar', length: 12, default: 'active' },
    createdAt: timestampColumn,
  },
  foreignKeys: [
    foreignKey('Athlete', 'athleteId', 'CASCADE'),
    foreignKey('User', 'createdById', 'SET NULL'),
    foreignKey('Clip', 'baselineClipId', 'SET NULL'),
  ],
  indices: [{ name: 'IDX_focus_point_athlete_rank', columns: ['athleteId', 'rank'] }],
});
