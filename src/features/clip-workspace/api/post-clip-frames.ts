import { useMemo } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import type { FrameBatchInput, FrameBatchResponse } from '@shared/schemas/frames.schema';
import { api } from '@/lib/api-client';
import { clipWorkspaceKeys } from './keys';

export type FrameUpload = FrameBatchInput['frames'][number];
export type PostClipFramesInput = FrameBatchInput;
export type PostClipFramesResponse = FrameBatchResponse;

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
