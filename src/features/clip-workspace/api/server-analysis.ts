import { useEffect, useRef } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { PoseModelName } from '@shared/keypoints';
import type { ClipResponse, ServerAnalysisDto, ServerAnalysisResponse } from '@shared/schemas/clip.schema';
import { api } from '@/lib/api-client';
import { clipWorkspaceKeys } from './keys';

const POLL_MS = 2000;

const serverAnalysisKey = (clipId: string) => [...clipWorkspaceKeys.clip(clipId), 'server-analysis'] as const;

export const isServerAnalysisActive = (a: ServerAnalysisDto | null | undefined) =>
  a?.status === 'queued' || a?.status === 'running';

/**
 * The clip's analysis on the server, polled on its own route while queued or running (the clip itself
 * is not refetched: its media address would change under a playing video). When it finishes, the
 * stored frames are read again so the curves and turns appear.
 */
export function useServerAnalysis(clipId: string, initial: ServerAnalysisDto | null) {
  const queryClient = useQueryClient();
  const query = useQuery({
    queryKey: serverAnalysisKey(clipId),
    queryFn: () =>
      api.get<ServerAnalysisResponse>(`/api/clips/${encodeURIComponent(clipId)}/server-analysis`),
    initialData: { serverAnalysis: initial, clipStatus: 'ready', storedFrames: 0, frameCount: null },
    initialDataUpdatedAt: 0,
    staleTime: POLL_MS,
    refetchInterval: (q) => (isServerAnalysisActive(q.state.data?.serverAnalysis) ? POLL_MS : false),
  });
  const current = query.data.serverAnalysis;
  const previous = useRef(current);
  useEffect(() => {
    const before = previous.current;
    previous.current = current;
    // New frames landed (a batch or the end): the stored results and curves are read again.
    if (before && current && before.jobId === current.jobId && before.done !== current.done)
      void queryClient.invalidateQueries({ queryKey: clipWorkspaceKeys.framesAll(clipId) });
  }, [current, clipId, queryClient]);
  return query;
}

export function useQueueServerAnalysis(clipId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { model?: PoseModelName; fromStart?: boolean; careful?: boolean }) =>
      api.post<ClipResponse>(`/api/clips/${encodeURIComponent(clipId)}/server-analysis`, input),
    onSuccess: (data) => {
      queryClient.setQueryData<ServerAnalysisResponse>(serverAnalysisKey(clipId), (old) => ({
        clipStatus: data.clip.status,
        storedFrames: old?.storedFrames ?? 0,
        frameCount: data.clip.frameCount,
        serverAnalysis: data.clip.serverAnalysis,
      }));
    },
  });
}
