import { EntitySchema } from 'typeorm';
import type { PoseModelName } from '@shared/keypoints';
import type { FlagStatus } from '@shared/schemas/flag.schema';
import {
  foreignKey,
  idColumn,
  nullableTimestampColumn,
  nullableUuidColumn,
  timestampColumn,
  uuidColumn,
} from './columns';

/**
 * A coaching point: one habit (a band's metric) outside the clip's age-group band in one turn, or in
 * one stretch of frames outside turns, with its worst value and frame. Its review state outlives
 * re-evaluation: a flag found again under the same clip, model, metric and group keeps it.
 */
export interface Flag {
  id: string;
  clipId: string;
  model: PoseModelName;
  metric: string;
  /** "t3" = turn 3, "r120" = the stretch outside turns from frame 120 (see shared groupFlags). */
  groupKey: string;
  turnIndex: number | null;
  firstFrame: number;
  lastFrame: number;
  frameCount: number;
  /** The worst frame: where the flag opens the clip. */
  frameIndex: number;
  value: number;
  /** The band as it was when the flag was raised, and its version. */
  bandMin: number | null;
  bandMax: number | null;
  toleranceBandId: string | null;
  bandVersion: number;
  /** How far outside the band, in the metric's unit; always positive. */
  distance: number;
  /** low = below the band's minimum, high = above its maximum. */
  severity: 'low' | 'high';
  /** Copied from the clip's first tagged athlete, so the club's inbox filters without joins. */
  athleteId: string | null;
  ageGroupId: string | null;
  status: FlagStatus;
  statusComment: string | null;
  statusById: string | null;
  statusAt: Date | null;
  createdAt: Date;
  updatedAt: Date;
}

export const FlagEntity = new EntitySchema<Flag>({
  name: 'Flag',
  tableName: 'flag',
  columns: {
    id: idColumn,
    clipId: uuidColumn,
    model: { type: 'varchar', length: 20, default: 'lightning' },
    metric: { type: 'varchar', length: 60 },
    groupKey: { type: 'varchar', length: 20 },
    turnIndex: { type: 'integer', nullable: true },
    firstFrame: { type: 'integer' },
    lastFrame: { type: 'integer' },
    frameCount: { type: 'integer' },
    frameIndex: { type: 'integer' },
    value: { type: 'real' },
    bandMin: { type: 'real', nullable: true },
    bandMax: { type: 'real', nullable: true },
    toleranceBandId: nullableUuidColumn,
    bandVersion: { type: 'integer', default: 1 },
    distance: { type: 'real', default: 0 },
    severity: { type: 'varchar', length: 10 },
    athleteId: nullableUuidColumn,
    ageGroupId: nullableUuidColumn,
    status: { type: 'varchar', length: 12, default: 'unreviewed' },
    statusComment: { type: 'text', nullable: true },
    statusById: nullableUuidColumn,
    statusAt: nullableTimestampColumn,
    createdAt: timestampColumn,
    updatedAt: timestampColumn,
  },
  foreignKeys: [
    foreignKey('Clip', 'clipId', 'CASCADE'),
    foreignKey('ToleranceBand', 'toleranceBandId', 'SET NULL'),
    foreignKey('Athlete', 'athleteId', 'SET NULL'),
    foreignKey('AgeGroup', 'ageGroupId', 'SET NULL'),
    foreignKey('User', 'statusById', 'SET NULL'),
  ],
  uniques: [{ name: 'UQ_flag_clip_model_metric_group', columns: ['clipId', 'model', 'metric', 'groupKey'] }],
  indices: [
    { name: 'IDX_flag_clip_model', columns: ['clipId', 'model'] },
    { name: 'IDX_flag_inbox', columns: ['ageGroupId', 'status', 'createdAt'] },
    { name: 'IDX_flag_athlete', columns: ['athleteId', 'createdAt'] },
  ],
});
