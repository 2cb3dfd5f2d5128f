import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { AthleteResponse } from '@shared/schemas/athlete.schema';
import type {
  AthleteExportLinkResponse,
  ConsentDecisionInput,
  ConsentRecordResponse,
} from '@shared/schemas/consent.schema';
import { api } from '@/lib/api-client';
import { athleteKeys } from './athlete-keys';

const base = (athleteId: string) => `/api/athletes/${encodeURIComponent(athleteId)}`;

export const consentKeys = {
  record: (athleteId: string) => [...athleteKeys.detail(athleteId), 'consent'] as const,
};

export function useConsentRecord(athleteId: string) {
  return useQuery({
    queryKey: consentKeys.record(athleteId),
    queryFn: () => api.get<ConsentRecordResponse>(`${base(athleteId)}/consent`),
  });
}

/** Withdraw or restore: the athlete changes at once, and so does every list of clips and reviews. */
export function useConsentDecision(athleteId: string, action: 'withdraw' | 'restore') {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ConsentDecisionInput) =>
      api.post<AthleteResponse>(`${base(athleteId)}/consent/${action}`, input),
    onSuccess: async (data) => {
      queryClient.setQueryData(athleteKeys.detail(athleteId), data);
      await queryClient.invalidateQueries();
    },
  });
}

export function useGuardianAccess(athleteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ guardianId, keep }: { guardianId: string; keep: boolean }) =>
      api.put<ConsentRecordResponse>(
        `${base(athleteId)}/guardians/${encodeURIComponent(guardianId)}/access`,
        { keep },
      ),
    onSuccess: (data) => queryClient.setQueryData(consentKeys.record(athleteId), data),
  });
}

/**
 * Asks for a signed download address, then lets the browser fetch it: the zip streams to disk with the
 * browser's own progress, instead of being held in the page.
 */
export function useAthleteExport(athleteId: string) {
  return useMutation({
    mutationFn: () => api.post<AthleteExportLinkResponse>(`${base(athleteId)}/export-link`, {}),
    onSuccess: (link) => {
      const anchor = document.createElement('a');
      anchor.href = link.url;
      anchor.download = link.fileName;
      anchor.rel = 'noopener';
      document.body.append(anchor);
      anchor.click();
      anchor.remove();
    },
  });
}
