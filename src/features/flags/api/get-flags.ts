import { keepPreviousData, useQuery } from '@tanstack/react-query';
import type { FlagListResponse, FlagStatus } from '@shared/schemas/flag.schema';
import { api } from '@/lib/api-client';

export interface FlagFilters {
  status?: FlagStatus;
  athleteId?: string;
  clipId?: string;
  ageGroupId?: string;
  metric?: string;
  page?: number;
  pageSize?: number;
}

export const flagKeys = {
  all: ['flags'] as const,
  list: (filters: FlagFilters) => [...flagKeys.all, 'list', filters] as const,
};

export function getFlags(filters: FlagFilters): Promise<FlagListResponse> {
  return api.get<FlagListResponse>('/api/flags', { query: { ...filters } });
}

export function useFlags(filters: FlagFilters) {
  return useQuery({
    queryKey: flagKeys.list(filters),
    queryFn: () => getFlags(filters),
    placeholderData: keepPreviousData,
  });
}
