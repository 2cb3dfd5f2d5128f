import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SessionListResponse } from '@shared/schemas/session.schema';
import { api } from '@/lib/api-client';
import { sessionKeys } from './session-keys';

export function getSessions(): Promise<SessionListResponse> {
  return api.get<SessionListResponse>('/api/sessions');
}

export const sessionsQueryOptions = () =>
  queryOptions({
    queryKey: sessionKeys.list(),
    queryFn: getSessions,
    select: (data) => [...data.sessions].sort((a, b) => b.date.localeCompare(a.date)),
  });

export function useSessions(options: { enabled?: boolean } = {}) {
  return useQuery({ ...sessionsQueryOptions(), enabled: options.enabled ?? true });
}
