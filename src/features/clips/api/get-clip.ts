import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ClipResponse } from '@shared/schemas/clip.schema';
import { api } from '@/lib/api-client';
import { clipKeys } from './clip-keys';

export function getClip(id: string): Promise<ClipResponse> {
  return api.get<ClipResponse>(`/api/clips/${encodeURIComponent(id)}`);
}

export const clipQueryOptions = (id: string) =>
  queryOptions({
    queryKey: clipKeys.detail(id),
    queryFn: () => getClip(id),
    // mediaUrl carries a short-lived token; keep the cached one from going stale under the player.
    staleTime: 60_000,
  });

export function useClip(id: string) {
  return useQuery(clipQueryOptions(id));
}
