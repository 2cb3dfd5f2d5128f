import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { PrivacySettingsDto, PrivacySettingsInput } from '@shared/schemas/consent.schema';
import { api } from '@/lib/api-client';
import { clubKeys } from './club-keys';

const privacyKey = [...clubKeys.all, 'privacy'] as const;

export function usePrivacySettings() {
  return useQuery({ queryKey: privacyKey, queryFn: () => api.get<PrivacySettingsDto>('/api/club/privacy') });
}

export function useUpdatePrivacySettings() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: PrivacySettingsInput) => api.put<PrivacySettingsDto>('/api/club/privacy', input),
    onSuccess: (data) => queryClient.setQueryData(privacyKey, data),
  });
}
