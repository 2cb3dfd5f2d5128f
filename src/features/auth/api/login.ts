import { useMutation } from '@tanstack/react-query';
import type { LoginInput, LoginResponse } from '@shared/schemas/auth.schema';
import { api, authSession } from '@/lib/api-client';

export function login(input: LoginInput): Promise<LoginResponse> {
  return api.post<LoginResponse>('/api/auth/login', input);
}

export function useLogin() {
  return useMutation({
    mutationFn: login,
    onSuccess: (session) => authSession.start(session),
  });
}
