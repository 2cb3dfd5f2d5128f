import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ToleranceBandListResponse } from '@shared/schemas/tolerance.schema';
import { api } from '@/lib/api-client';
import { standardsKeys } from './keys';

export function getBands(): Promise<ToleranceBandListResponse> {
  return api.get<ToleranceBandListResponse>('/api/tolerance-bands');
}

export const bandsQueryOptions = () => queryOptions({ queryKey: standardsKeys.bands(), queryFn: getBands });

export function useBands() {
  return useQuery(bandsQueryOptions());
}
