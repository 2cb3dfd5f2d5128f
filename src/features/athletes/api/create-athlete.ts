import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AthleteResponse, CreateAthleteInput } from '@shared/schemas/athlete.schema';
import { api } from '@/lib/api-client';
import { athleteKeys } from './athlete-keys';

export function createAthlete(input: CreateAthleteInput): Promise<AthleteResponse> {
  return api.post<AthleteResponse>('/api/athletes', input);
}

export function useCreateAthlete() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createAthlete,
    onSuccess: async (data) => {
      queryClient.setQueryData(athleteKeys.detail(data.athlete.id), data);
      await queryClient.invalidateQueries({ queryKey: athleteKeys.lists() });
    },
  });
}
