import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { FlagDto, FlagUpdateInput } from '@shared/schemas/flag.schema';
import { api } from '@/lib/api-client';
import { flagKeys } from './get-flags';

export function updateFlag(flagId: string, input: FlagUpdateInput): Promise<FlagDto> {
  return api.patch<FlagDto>(`/api/flags/${encodeURIComponent(flagId)}`, input);
}

export function useUpdateFlag() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ flagId, input }: { flagId: string; input: FlagUpdateInput }) => updateFlag(flagId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: flagKeys.all }),
  });
}
