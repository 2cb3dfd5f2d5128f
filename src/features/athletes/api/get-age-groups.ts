import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AgeGroupListResponse } from '@shared/schemas/athlete.schema';
import { api } from '@/lib/api-client';
import { athleteKeys } from './athlete-keys';

export function getAgeGroups(): Promise<AgeGroupListResponse> {
  return api.get<AgeGroupListResponse>('/api/age-groups');
}

export const ageGroupsQueryOptions = () =>
  queryOptions({
    queryKey: athleteKeys.ageGroups(),
    queryFn: getAgeGroups,
    staleTime: 10 * 60_000,
    select: (data) => [...data.ageGroups].sort((a, b) => a.minAge - b.minAge),
  });

export function useAgeGroups(options: { enabled?: boolean } = {}) {
  return useQuery({ ...ageGroupsQueryOptions(), enabled: options.enabled ?? true });
}
