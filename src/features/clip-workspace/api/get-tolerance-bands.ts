import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ToleranceBandDto, ToleranceBandListResponse } from '@shared/schemas/tolerance.schema';
import { api } from '@/lib/api-client';
import { clipWorkspaceKeys } from './keys';

export type { ToleranceBandDto };
export type ToleranceBandsResponse = ToleranceBandListResponse;

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
