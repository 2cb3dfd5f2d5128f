import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateInvitationInput, InvitationResponse } from '@shared/schemas/auth.schema';
import { api } from '@/lib/api-client';
import { clubKeys } from './club-keys';

export function createInvitation(input: CreateInvitationInput): Promise<InvitationResponse> {
  return api.post<InvitationResponse>('/api/invitations', input);
}

export function useCreateInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createInvitation,
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: clubKeys.all });
    },
  });
}
