import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { AthleteListResponse } from '@shared/schemas/athlete.schema';
import { api } from '@/lib/api-client';
import { athleteKeys, type AthleteFilters } from './athlete-keys';

export function getAthletes(filters: AthleteFilters = {}): Promise<AthleteListResponse> {
  return api.get<AthleteListResponse>('/api/athletes', {
    query: { search: filters.search?.trim(), ageGroupId: filters.ageGroupId },
  });
}

export const athletesQueryOptions = (filters: AthleteFilters = {}) =>
  queryOptions({
    queryKey: athleteKeys.list(filters),
    queryFn: () => getAthletes(filters),
    // Keep the table on screen while a new search runs instead of flashing a spinner.
    placeholderData: keepPreviousData,
  });

export function useAthletes(filters: AthleteFilters = {}, options: { enabled?: boolean } = {}) {
  return useQuery({ ...athletesQueryOptions(filters), enabled: options.enabled ?? true });
}
