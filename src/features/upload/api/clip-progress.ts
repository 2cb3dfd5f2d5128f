import { useQuery } from '@tanstack/react-query';
import type { ServerAnalysisResponse } from '@shared/schemas/clip.schema';
import { api } from '@/lib/api-client';

const POLL_MS = 2000;

const stillMoving = (data: ServerAnalysisResponse | undefined) =>
  !data ||
  data.clipStatus === 'uploaded' ||
  data.clipStatus === 'processing' ||
  data.serverAnalysis?.status === 'queued' ||
  data.serverAnalysis?.status === 'running';

/**
 * An uploaded clip's way from "being prepared" to "analysed", polled while it moves: the playable copy
 * is made, then the server analyses it in the background (the coach can go on meanwhile).
 */
export function useUploadedClipProgress(clipId: string) {
  return useQuery({
    queryKey: ['upload', 'clip-progress', clipId],
    queryFn: () =>
      api.get<ServerAnalysisResponse>(`/api/clips/${encodeURIComponent(clipId)}/server-analysis`),
    refetchInterval: (q) => (stillMoving(q.state.data) ? POLL_MS : false),
  });
}
