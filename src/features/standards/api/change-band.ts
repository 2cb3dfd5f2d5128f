import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ToleranceBandChangeResponse, ToleranceBandInput } from '@shared/schemas/tolerance.schema';
import type { BandMetricKey } from '@shared/tolerance';
import { api } from '@/lib/api-client';
import { standardsKeys } from './keys';

const bandPath = (ageGroupId: string, metric: BandMetricKey) =>
  `/api/tolerance-bands/${encodeURIComponent(ageGroupId)}/${encodeURIComponent(metric)}`;

export function updateBand(
  ageGroupId: string,
  metric: BandMetricKey,
  input: ToleranceBandInput,
): Promise<ToleranceBandChangeResponse> {
  return api.put<ToleranceBandChangeResponse>(bandPath(ageGroupId, metric), input);
}

export function resetBand(ageGroupId: string, metric: BandMetricKey): Promise<ToleranceBandChangeResponse> {
  return api.post<ToleranceBandChangeResponse>(`${bandPath(ageGroupId, metric)}/reset`);
}

/** Edit or reset a band; the page then shows the new band, the history and the re-evaluation job. */
export function useChangeBand() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (change: {
      ageGroupId: string;
      metric: BandMetricKey;
      input: ToleranceBandInput | 'reset';
    }) =>
      change.input === 'reset'
        ? resetBand(change.ageGroupId, change.metric)
        : updateBand(change.ageGroupId, change.metric, change.input),
    onSuccess: async (data) => {
      queryClient.setQueryData(standardsKeys.job(data.job.id), data.job);
      await queryClient.invalidateQueries({ queryKey: standardsKeys.all });
    },
  });
}
