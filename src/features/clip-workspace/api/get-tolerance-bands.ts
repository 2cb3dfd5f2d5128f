import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ToleranceBand } from '@shared/tolerance';
import { api } from '@/lib/api-client';
import { clipWorkspaceKeys } from './keys';

/** A band as GET /api/tolerance-bands returns it (metric, age group, min, max, target, source). */
export type ToleranceBandDto = ToleranceBand;

export interface ToleranceBandsResponse {
  bands: ToleranceBandDto[];
}

export function getToleranceBands(ageGroupId: string): Promise<ToleranceBandsResponse> {
  return api.get<ToleranceBandsResponse>('/api/tolerance-bands', { query: { ageGroupId } });
}

export const toleranceBandsQueryOptions = (ageGroupId: string | null) =>
  queryOptions({
    queryKey: clipWorkspaceKeys.bands(ageGroupId),
    queryFn: () => getToleranceBands(ageGroupId ?? ''),
    enabled: ageGroupId !== null,
    staleTime: 5 * 60_000,
  });

export function useToleranceBands(ageGroupId: string | null) {
  return useQuery(toleranceBandsQueryOptions(ageGroupId));
}
