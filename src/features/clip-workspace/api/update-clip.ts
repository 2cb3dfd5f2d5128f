import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AthletePick, PoseModelName, ReferenceLine, SkierFacing, View } from '@shared/keypoints';
import type { ClipResponse } from '@shared/schemas/clip.schema';
import { api } from '@/lib/api-client';
import { clipWorkspaceKeys } from './keys';

export interface UpdateClipInput {
  view?: View;
  facing?: SkierFacing;
  athletePick?: AthletePick | null;
  defaultModel?: PoseModelName;
  referenceLine?: ReferenceLine | null;
  frameReferenceLines?: { frameIndex: number; referenceLine: ReferenceLine | null }[];
}

export function updateClip(clipId: string, input: UpdateClipInput): Promise<ClipResponse> {
  return api.patch<ClipResponse>(`/api/clips/${encodeURIComponent(clipId)}`, input);
}

export function useUpdateClip(clipId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: UpdateClipInput) => updateClip(clipId, input),
    onSuccess: async (data, input) => {
      queryClient.setQueryData(clipWorkspaceKeys.clip(clipId), data);
      // The server recomputes stored metrics and flags when the view, facing or snow line changes.
      if (
        input.view !== undefined ||
        input.facing !== undefined ||
        input.referenceLine !== undefined ||
        input.frameReferenceLines
      ) {
        await queryClient.invalidateQueries({ queryKey: clipWorkspaceKeys.framesAll(clipId) });
      }
    },
  });
}
