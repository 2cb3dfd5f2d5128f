import { EntitySchema } from 'typeorm';
import type { Keypoint, PoseModelName } from '@shared/keypoints';
import { foreignKey, idColumn, timestampColumn, uuidColumn } from './columns';

/** Pose keypoints and the metrics computed from them for one frame of a clip. */
export interface FrameResult {
  id: string;
  clipId: string;
  frameIndex: number;
  timeMs: number;
  model: PoseModelName;
  keypoints: Keypoint[];
  /** Metric name -> value (units per docs/metrics.md); recomputed on the server from keypoints. */
  metrics: Record<string, number | null>;
  /** Metric name -> why it is null ("missing: left_knee", "wrong view"). */
  reasons: Record<string, string>;
  /** True when a coach moved keypoints by hand. */
  corrected: boolean;
  /** True when the frame was read carefully: with its mirror image, averaged (docs/accuracy.md). */
  careful: boolean;
  createdAt: Date;
  updatedAt: Date;
}

export const FrameResultEntity = new EntitySchema<FrameResult>({
  name: 'FrameResult',
  tableName: 'frame_result',
  columns: {
    id: idColumn,
    clipId: uuidColumn,
    frameIndex: { type: 'integer' },
    timeMs: { type: 'real' },
    model: { type: 'varchar', length: 20 },
    keypoints: { type: 'simple-json' },
    metrics: { type: 'simple-json' },
    reasons: { type: 'simple-json', default: '{}' },
    corrected: { type: 'boolean', default: false },
    careful: { type: 'boolean', default: false },
    createdAt: timestampColumn,
    updatedAt: timestampColumn,
  },
  foreignKeys: [foreignKey('Clip', 'clipId', 'CASCADE')],
  uniques: [{ name: 'UQ_frame_result_clip_model_frame', columns: ['clipId', 'model', 'frameIndex'] }],
  // Covers the per-clip analysis summary (count and latest change per model) without reading the wide
  // keypoint rows; the clip list asks for it on every load.
  indices: [{ name: 'IDX_frame_result_clip_model_updated', columns: ['clipId', 'model', 'updatedAt'] }],
});
