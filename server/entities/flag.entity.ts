import { EntitySchema } from 'typeorm';
import { foreignKey, idColumn, nullableUuidColumn, timestampColumn, uuidColumn } from './columns';

/** A frame whose metric fell outside the athlete's age-group tolerance band. */
export interface Flag {
  id: string;
  clipId: string;
  frameResultId: string | null;
  toleranceBandId: string | null;
  frameIndex: number;
  metric: string;
  value: number;
  severity: 'low' | 'high';
  createdAt: Date;
}

export const FlagEntity = new EntitySchema<Flag>({
  name: 'Flag',
  tableName: 'flag',
  columns: {
    id: idColumn,
    clipId: uuidColumn,
    frameResultId: nullableUuidColumn,
    toleranceBandId: nullableUuidColumn,
    frameIndex: { type: 'integer' },
    metric: { type: 'varchar', length: 60 },
    value: { type: 'real' },
    severity: { type: 'varchar', length: 10 },
    createdAt: timestampColumn,
  },
  foreignKeys: [
    foreignKey('Clip', 'clipId', 'CASCADE'),
    foreignKey('FrameResult', 'frameResultId', 'CASCADE'),
    foreignKey('ToleranceBand', 'toleranceBandId', 'SET NULL'),
  ],
  indices: [{ name: 'IDX_flag_clip_frame', columns: ['clipId', 'frameIndex'] }],
});
