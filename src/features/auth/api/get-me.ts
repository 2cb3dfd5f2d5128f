import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MeResponse } from '@shared/schemas/auth.schema';
import { api } from '@/lib/api-client';
import { authKeys } from './auth-keys';

export function getMe(): Promise<MeResponse> {
  return api.get<MeResponse>('/api/me');
}

export const meQueryOptions = () =>
  queryOptions({ queryKey: authKeys.me(), queryFn: getMe, staleTime: 5 * 60_000 });

export function useMe() {
  return useQuery(meQueryOptions());
}
