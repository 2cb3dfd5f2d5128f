import type { MetricKey } from '@shared/metrics';
import type { ClipFlagDto } from '@shared/schemas/flag.schema';
import type { FrameResultDto } from '@shared/schemas/frames.schema';
import type { Flag } from '../entities/flag.entity';
import type { FrameResult } from '../entities/frame-result.entity';

export function toFrameDto(row: FrameResult): FrameResultDto {
  return {
    frameIndex: row.frameIndex,
    timeMs: row.timeMs,
    keypoints: row.keypoints,
    metrics: row.metrics as Record<MetricKey, number | null>,
    reasons: row.reasons as Partial<Record<MetricKey, string>>,
    corrected: row.corrected,
    careful: row.careful,
  };
}

export function toClipFlagDto(row: Flag): ClipFlagDto {
  return {
    id: row.id,
    model: row.model,
    metric: row.metric as ClipFlagDto['metric'],
    value: row.value,
    min: row.bandMin,
    max: row.bandMax,
    distance: row.distance,
    side: row.severity === 'low' ? 'below' : 'above',
    frameIndex: row.frameIndex,
    turnIndex: row.turnIndex,
    firstFrame: row.firstFrame,
    lastFrame: row.lastFrame,
    frameCount: row.frameCount,
    bandVersion: row.bandVersion,
    status: row.status,
  };
}
