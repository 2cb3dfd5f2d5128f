import { queryOptions, useQuery } from '@tanstack/react-query';
import type { InvitationPreviewResponse } from '@shared/schemas/auth.schema';
import { api } from '@/lib/api-client';
import { authKeys } from './auth-keys';

export function getInvitation(token: string): Promise<InvitationPreviewResponse> {
  return api.get<InvitationPreviewResponse>(`/api/invitations/${encodeURIComponent(token)}`);
}

export const invitationQueryOptions = (token: string) =>
  queryOptions({
    queryKey: authKeys.invitation(token),
    queryFn: () => getInvitation(token),
    staleTime: Infinity,
    select: (data) => data.invitation,
  });

export function useInvitation(token: string) {
  return useQuery(invitationQueryOptions(token));
}
