import { useMutation } from '@tanstack/react-query';
import type { LoginResponse, PasswordResetCompleteInput } from '@shared/schemas/auth.schema';
import { api, authSession } from '@/lib/api-client';

export function completePasswordReset(
  token: string,
  input: PasswordResetCompleteInput,
): Promise<LoginResponse> {
  return api.post<LoginResponse>(`/api/auth/password-reset/${encodeURIComponent(token)}`, input);
}

export function useCompletePasswordReset(token: string) {
  return useMutation({
    mutationFn: (input: PasswordResetCompleteInput) => completePasswordReset(token, input),
    onSuccess: (session) => authSession.start(session),
  });
}
