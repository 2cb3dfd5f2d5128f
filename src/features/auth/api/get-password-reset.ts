import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PasswordResetInfo } from '@shared/schemas/auth.schema';
import { api } from '@/lib/api-client';
import { authKeys } from './auth-keys';

export function getPasswordReset(token: string): Promise<PasswordResetInfo> {
  return api.get<PasswordResetInfo>(`/api/auth/password-reset/${encodeURIComponent(token)}`);
}

export const passwordResetQueryOptions = (token: string) =>
  queryOptions({
    queryKey: authKeys.passwordReset(token),
    queryFn: () => getPasswordReset(token),
    retry: false,
  });

export function usePasswordReset(token: string) {
  return useQuery(passwordResetQueryOptions(token));
}
