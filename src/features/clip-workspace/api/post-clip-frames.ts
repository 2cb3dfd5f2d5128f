import { useMemo } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import type { Keypoint, PoseModelName } from '@shared/keypoints';
import { api } from '@/lib/api-client';
import type { ClipFlagDto } from './get-clip-frames';
import { clipWorkspaceKeys } from './keys';

export interface FrameUpload {
  frameIndex: number;
  timeMs: number;
  keypoints: Keypoint[];
  corrected?: boolean;
}

export interface PostClipFramesInput {
  model: PoseModelName;
  /** At most 500 frames a request (API contract). */
  frames: FrameUpload[];
}

export interface PostClipFramesResponse {
  stored: number;
  flags: ClipFlagDto[];
}

export function postClipFrames(
  clipId: string,
  input: PostClipFramesInput,
  signal?: AbortSignal,
): Promise<PostClipFramesResponse> {
  return api.post<PostClipFramesResponse>(`/api/clips/${encodeURIComponent(clipId)}/frames`, input, {
    signal,
  });
}

/**
 * A whole-clip run posts many batches; the stored analysis (frames, series, flags) is refetched once,
 * when the run ends or is cancelled, not after every batch.
 */
export function useAnalysisUpload(clipId: string) {
  const queryClient = useQueryClient();
  return useMemo(
    () => ({
      postBatch: (input: PostClipFramesInput, signal?: AbortSignal) => postClipFrames(clipId, input, signal),
      finish: async () => {
        await queryClient.invalidateQueries({ queryKey: clipWorkspaceKeys.framesAll(clipId) });
      },
    }),
    [clipId, queryClient],
  );
}
