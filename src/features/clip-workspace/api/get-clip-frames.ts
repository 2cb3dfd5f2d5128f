import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PoseModelName } from '@shared/keypoints';
import type { ClipFramesResponse } from '@shared/schemas/frames.schema';
import { api } from '@/lib/api-client';
import { clipWorkspaceKeys } from './keys';

export type {
  ClipFramesResponse,
  ClipSeriesDto,
  FrameResultDto as StoredFrameDto,
} from '@shared/schemas/frames.schema';
export type { ClipFlagDto } from '@shared/schemas/flag.schema';

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
