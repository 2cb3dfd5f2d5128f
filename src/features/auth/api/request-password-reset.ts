import { useMutation } from '@tanstack/react-query';
import type { PasswordResetRequestInput } from '@shared/schemas/auth.schema';
import { api } from '@/lib/api-client';

export function requestPasswordReset(input: PasswordResetRequestInput): Promise<{ message: string }> {
  return api.post<{ message: string }>('/api/auth/password-reset', input);
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
