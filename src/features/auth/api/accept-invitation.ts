import { useMutation } from '@tanstack/react-query';
import type { AcceptInvitationInput, LoginResponse } from '@shared/schemas/auth.schema';
import { api, authSession } from '@/lib/api-client';

export function acceptInvitation(input: AcceptInvitationInput): Promise<LoginResponse> {
  return api.post<LoginResponse>('/api/invitations/accept', input);
}

export function useAcceptInvitation() {
  return useMutation({
    mutationFn: acceptInvitation,
    onSuccess: (session) => authSession.start(session),
  });
}
