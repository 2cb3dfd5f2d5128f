import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Keypoint, PoseModelName } from '@shared/keypoints';
import { api } from '@/lib/api-client';
import type { StoredFrameDto } from './get-clip-frames';
import { clipWorkspaceKeys } from './keys';

export interface PutClipFrameInput {
  frameIndex: number;
  model: PoseModelName;
  keypoints: Keypoint[];
}

export interface PutClipFrameResponse {
  frame: StoredFrameDto;
}

/** Stores the coach's corrected keypoints for one frame; the server recomputes its metrics and flags. */
export function putClipFrame(clipId: string, input: PutClipFrameInput): Promise<PutClipFrameResponse> {
  const { frameIndex, ...body } = input;
  return api.put<PutClipFrameResponse>(`/api/clips/${encodeURIComponent(clipId)}/frames/${frameIndex}`, body);
}

export function usePutClipFrame(clipId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: PutClipFrameInput) => putClipFrame(clipId, input),
    onSuccess: async (_data, input) => {
      await queryClient.invalidateQueries({ queryKey: clipWorkspaceKeys.frames(clipId, input.model) });
    },
  });
}
