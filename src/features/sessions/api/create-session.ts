import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateSessionInput, SessionResponse } from '@shared/schemas/session.schema';
import { api } from '@/lib/api-client';
import { sessionKeys } from './session-keys';

export function createSession(input: CreateSessionInput): Promise<SessionResponse> {
  return api.post<SessionResponse>('/api/sessions', input);
}

export function useCreateSession() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createSession,
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: sessionKeys.all });
    },
  });
}
