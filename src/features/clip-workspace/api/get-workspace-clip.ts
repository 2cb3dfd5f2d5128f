import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ClipResponse } from '@shared/schemas/clip.schema';
import { api } from '@/lib/api-client';
import { clipWorkspaceKeys } from './keys';

export function getWorkspaceClip(clipId: string): Promise<ClipResponse> {
  return api.get<ClipResponse>(`/api/clips/${encodeURIComponent(clipId)}`);
}

const POLL_MS = 2000;

export const workspaceClipQueryOptions = (clipId: string) =>
  queryOptions({
    queryKey: clipWorkspaceKeys.clip(clipId),
    queryFn: () => getWorkspaceClip(clipId),
    // mediaUrl carries a short-lived token; a refetch under a playing video would swap its source.
    staleTime: 60_000,
    // The server is still making the playable copy, poster and thumbnails: look again shortly.
    refetchInterval: (query) => {
      const status = query.state.data?.clip.status;
      return status === 'uploaded' || status === 'processing' ? POLL_MS : false;
    },
  });

export function useWorkspaceClip(clipId: string) {
  return useQuery(workspaceClipQueryOptions(clipId));
}
