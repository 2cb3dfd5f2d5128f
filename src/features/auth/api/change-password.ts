import { useMutation } from '@tanstack/react-query';
import type { ChangePasswordInput, LoginResponse } from '@shared/schemas/auth.schema';
import { api, authSession } from '@/lib/api-client';

export function changePassword(input: ChangePasswordInput): Promise<LoginResponse> {
  return api.post<LoginResponse>('/api/auth/password', input);
}

/** Other sessions end on the server; this one continues with the fresh tokens it answers with. */
export function useChangePassword() {
  return useMutation({ mutationFn: changePassword, onSuccess: (session) => authSession.start(session) });
}
