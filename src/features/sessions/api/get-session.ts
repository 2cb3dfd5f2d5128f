import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SessionResponse } from '@shared/schemas/session.schema';
import { api } from '@/lib/api-client';
import { sessionKeys } from './session-keys';

export function getSession(id: string): Promise<SessionResponse> {
  return api.get<SessionResponse>(`/api/sessions/${encodeURIComponent(id)}`);
}

export const sessionQueryOptions = (id: string) =>
  queryOptions({
    queryKey: sessionKeys.detail(id),
    queryFn: () => getSession(id),
    select: (data) => data.session,
  });

export function useSession(id: string) {
  return useQuery(sessionQueryOptions(id));
}
