import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ClipListResponse } from '@shared/schemas/clip.schema';
import { api } from '@/lib/api-client';
import { clipKeys, type ClipFilters } from './clip-keys';

export function getClips(filters: ClipFilters = {}): Promise<ClipListResponse> {
  return api.get<ClipListResponse>('/api/clips', { query: { ...filters } });
}

export const clipsQueryOptions = (filters: ClipFilters = {}) =>
  queryOptions({
    queryKey: clipKeys.list(filters),
    queryFn: () => getClips(filters),
    select: (data) => [...data.clips].sort((a, b) => b.createdAt.localeCompare(a.createdAt)),
  });

export function useClips(filters: ClipFilters = {}, options: { enabled?: boolean } = {}) {
  return useQuery({ ...clipsQueryOptions(filters), enabled: options.enabled ?? true });
}
