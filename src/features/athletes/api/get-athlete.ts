import { queryOptions, useQueries, useQuery } from '@tanstack/react-query';
import type { AthleteResponse } from '@shared/schemas/athlete.schema';
import { api } from '@/lib/api-client';
import { athleteKeys } from './athlete-keys';

export function getAthlete(id: string): Promise<AthleteResponse> {
  return api.get<AthleteResponse>(`/api/athletes/${encodeURIComponent(id)}`);
}

export const athleteQueryOptions = (id: string) =>
  queryOptions({ queryKey: athleteKeys.detail(id), queryFn: () => getAthlete(id) });

export function useAthlete(id: string) {
  return useQuery(athleteQueryOptions(id));
}

/** Several athlete records at once (a guardian's children). */
export function useAthletesById(ids: string[]) {
  return useQueries({ queries: ids.map((id) => athleteQueryOptions(id)) });
}
