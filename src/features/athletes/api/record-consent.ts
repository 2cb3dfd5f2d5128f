import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AthleteResponse, RecordConsentInput } from '@shared/schemas/athlete.schema';
import { api } from '@/lib/api-client';
import { athleteKeys } from './athlete-keys';

export function recordConsent(athleteId: string, input: RecordConsentInput): Promise<AthleteResponse> {
  return api.post<AthleteResponse>(`/api/athletes/${encodeURIComponent(athleteId)}/consent`, input);
}

export function useRecordConsent(athleteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: RecordConsentInput) => recordConsent(athleteId, input),
    onSuccess: async (data) => {
      queryClient.setQueryData(athleteKeys.detail(athleteId), data);
      await queryClient.invalidateQueries({ queryKey: athleteKeys.lists() });
    },
  });
}
