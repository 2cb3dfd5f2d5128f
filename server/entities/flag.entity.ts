import { EntitySchema } from 'typeorm';
import type { PoseModelName } from '@shared/keypoints';
import { foreignKey, idColumn, nullableUuidColumn, timestampColumn, uuidColumn } from './columns';

/**
 * A value outside the athlete's age-group tolerance band: one frame's metric, or one turn's
 * transitionRise (turnIndex set, frameIndex = the turn's end frame).
 */
export interface Flag {
  id: string;
  clipId: string;
  frameResultId: string | null;
  toleranceBandId: string | null;
  model: PoseModelName;
  frameIndex: number;
  turnIndex: number | null;
  metric: string;
  value: number;
  /** The band as it was when the flag was raised. */
  bandMin: number | null;
  bandMax: number | null;
  /** How far outside the band, in the metric's unit; always positive. */
  distance: number;
  /** low = below the band's minimum, high = above its maximum. */
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
    model: { type: 'varchar', length: 20, default: 'lightning' },
    frameIndex: { type: 'integer' },
    turnIndex: { type: 'integer', nullable: true },
    metric: { type: 'varchar', length: 60 },
    value: { type: 'real' },
    bandMin: { type: 'real', nullable: true },
    bandMax: { type: 'real', nullable: true },
    distance: { type: 'real', default: 0 },
    severity: { type: 'varchar', length: 10 },
    createdAt: timestampColumn,
  },
  foreignKeys: [
    foreignKey('Clip', 'clipId', 'CASCADE'),
    foreignKey('FrameResult', 'frameResultId', 'CASCADE'),
    foreignKey('ToleranceBand', 'toleranceBandId', 'SET NULL'),
  ],
  indices: [
    { name: 'IDX_flag_clip_frame', columns: ['clipId', 'frameIndex'] },
    { name: 'IDX_flag_clip_model', columns: ['clipId', 'model'] },
  ],
});
