import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ClipListResponse } from '@shared/schemas/clip.schema';
import type { CompareStillDto, CompareStillInput, SeasonPlanResponse } from '@shared/schemas/plan.schema';
import { api } from '@/lib/api-client';
import { clipWorkspaceKeys } from './keys';

const compareKeys = {
  athleteClips: (athleteId: string) => [...clipWorkspaceKeys.all, 'athlete-clips', athleteId] as const,
  plan: (athleteId: string) => [...clipWorkspaceKeys.all, 'plan', athleteId] as const,
  stills: (a: string, b: string) => [...clipWorkspaceKeys.all, 'compare-stills', ...[a, b].sort()] as const,
};

/** The clips of an athlete the caller may see: the choices of the two sides. */
export function useAthleteClips(athleteId: string | null) {
  return useQuery({
    queryKey: compareKeys.athleteClips(athleteId ?? ''),
    queryFn: () => api.get<ClipListResponse>('/api/clips', { query: { athleteId: athleteId ?? undefined } }),
    enabled: !!athleteId,
  });
}

/** The athlete's season plan (focus points, baseline) for the table of the focus-point metrics. */
export function useComparePlan(athleteId: string | null) {
  return useQuery({
    queryKey: compareKeys.plan(athleteId ?? ''),
    queryFn: () => api.get<SeasonPlanResponse>(`/api/athletes/${encodeURIComponent(athleteId ?? '')}/plan`),
    enabled: !!athleteId,
  });
}

export function useCompareStills(a: string, b: string) {
  return useQuery({
    queryKey: compareKeys.stills(a, b),
    queryFn: () => api.get<{ stills: CompareStillDto[] }>('/api/compare-stills', { query: { a, b } }),
  });
}

export function useKeepCompareStill() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CompareStillInput) =>
      api.post<{ still: CompareStillDto }>('/api/compare-stills', input),
    onSuccess: (_data, input) =>
      queryClient.invalidateQueries({ queryKey: compareKeys.stills(input.clipAId, input.clipBId) }),
  });
}

export const compareStillImage = (id: string) =>
  api.getBlob(`/api/compare-stills/${encodeURIComponent(id)}/image`);
