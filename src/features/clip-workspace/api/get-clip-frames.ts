import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Keypoint, PoseModelName } from '@shared/keypoints';
import type { MetricKey } from '@shared/metrics';
import type { FilterRecord, SeriesSummary, Turn } from '@shared/series';
import type { BandMetricKey } from '@shared/tolerance';
import { api } from '@/lib/api-client';
import { clipWorkspaceKeys } from './keys';

/** One stored frame as GET /api/clips/:id/frames returns it; metrics are the server's own recompute. */
export interface StoredFrameDto {
  frameIndex: number;
  timeMs: number;
  keypoints: Keypoint[];
  metrics: Record<MetricKey, number | null>;
  reasons: Partial<Record<MetricKey, string>>;
  corrected: boolean;
}

export interface ClipSeriesDto {
  turns: Turn[];
  transitions: { frameIndex: number; timeMs: number }[];
  summary: SeriesSummary;
  filter: FilterRecord;
}

export interface ClipFlagDto {
  metric: BandMetricKey;
  value: number;
  min: number | null;
  max: number | null;
  distance: number;
  side: 'below' | 'above';
  frameIndex: number | null;
  turnIndex: number | null;
}

export interface ClipFramesResponse {
  model: PoseModelName;
  frames: StoredFrameDto[];
  series: ClipSeriesDto | null;
  flags: ClipFlagDto[];
}

export function getClipFrames(clipId: string, model: PoseModelName): Promise<ClipFramesResponse> {
  return api.get<ClipFramesResponse>(`/api/clips/${encodeURIComponent(clipId)}/frames`, {
    query: { model },
  });
}

export const clipFramesQueryOptions = (clipId: string, model: PoseModelName) =>
  queryOptions({
    queryKey: clipWorkspaceKeys.frames(clipId, model),
    queryFn: () => getClipFrames(clipId, model),
    // Stored results change only through this page's own mutations, which invalidate the key.
    staleTime: 5 * 60_000,
  });

export function useClipFrames(clipId: string, model: PoseModelName) {
  return useQuery(clipFramesQueryOptions(clipId, model));
}
