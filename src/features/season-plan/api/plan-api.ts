import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  FocusPointDto,
  FocusPointInput,
  SeasonDto,
  SeasonInput,
  SeasonPlanResponse,
} from '@shared/schemas/plan.schema';
import { api } from '@/lib/api-client';

export const planKeys = {
  all: ['season-plan'] as const,
  plan: (athleteId: string, seasonId?: string) =>
    [...planKeys.all, athleteId, seasonId ?? 'current'] as const,
  seasons: ['seasons'] as const,
};

export function usePlan(athleteId: string, seasonId?: string) {
  return useQuery({
    queryKey: planKeys.plan(athleteId, seasonId),
    queryFn: () =>
      api.get<SeasonPlanResponse>(`/api/athletes/${encodeURIComponent(athleteId)}/plan`, {
        query: { seasonId },
      }),
    enabled: athleteId !== '',
  });
}

/** Every write to a plan changes its progress and order: read the plan again afterwards. */
function usePlanMutation<TInput, TResult>(run: (input: TInput) => Promise<TResult>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: run,
    onSettled: () => queryClient.invalidateQueries({ queryKey: planKeys.all }),
  });
}

export function useAddFocusPoint(athleteId: string) {
  return usePlanMutation((input: FocusPointInput) =>
    api.post<{ focusPoint: FocusPointDto }>(
      `/api/athletes/${encodeURIComponent(athleteId)}/focus-points`,
      input,
    ),
  );
}

export function useUpdateFocusPoint() {
  return usePlanMutation(({ id, input }: { id: string; input: FocusPointInput }) =>
    api.put<{ focusPoint: FocusPointDto }>(`/api/focus-points/${encodeURIComponent(id)}`, input),
  );
}

export function useDeleteFocusPoint() {
  return usePlanMutation((id: string) => api.delete<void>(`/api/focus-points/${encodeURIComponent(id)}`));
}

export function useReorderFocusPoints(athleteId: string) {
  return usePlanMutation(({ seasonId, ids }: { seasonId: string; ids: string[] }) =>
    api.put<{ focusPoints: FocusPointDto[] }>(
      `/api/athletes/${encodeURIComponent(athleteId)}/focus-points/order`,
      { seasonId, ids },
    ),
  );
}

export function useSetBaseline(athleteId: string) {
  return usePlanMutation(({ seasonId, clipId }: { seasonId: string; clipId: string | null }) =>
    api.put<{ baselineClipId: string | null }>(`/api/athletes/${encodeURIComponent(athleteId)}/baseline`, {
      seasonId,
      clipId,
    }),
  );
}

export function useCreateSeason() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: SeasonInput) => api.post<{ season: SeasonDto }>('/api/seasons', input),
    onSettled: () => {
      void queryClient.invalidateQueries({ queryKey: planKeys.all });
      void queryClient.invalidateQueries({ queryKey: planKeys.seasons });
    },
  });
}
