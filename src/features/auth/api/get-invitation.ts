import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Role } from '@shared/schemas/auth.schema';
import { api } from '@/lib/api-client';
import { authKeys } from './auth-keys';

export interface InvitationPreview {
  email: string;
  role: Role;
  clubName: string;
}

export function getInvitation(token: string): Promise<InvitationPreview> {
  return api.get<InvitationPreview>(`/api/invitations/${encodeURIComponent(token)}`);
}

export const invitationQueryOptions = (token: string) =>
  queryOptions({
    queryKey: authKeys.invitation(token),
    queryFn: () => getInvitation(token),
    staleTime: Infinity,
  });

export function useInvitation(token: string) {
  return useQuery(invitationQueryOptions(token));
}
