import { useQuery } from '@tanstack/react-query';
import type { JobDto } from '@shared/schemas/tolerance.schema';
import { api } from '@/lib/api-client';
import { standardsKeys } from './keys';

export function getJob(id: string): Promise<JobDto> {
  return api.get<JobDto>(`/api/jobs/${encodeURIComponent(id)}`);
}

const running = (job: JobDto | undefined) => job?.status === 'queued' || job?.status === 'running';

/** A job, asked again every second while it runs. */
export function useJob(initial: JobDto | null) {
  return useQuery({
    queryKey: standardsKeys.job(initial?.id ?? 'none'),
    queryFn: () => getJob(initial!.id),
    enabled: initial !== null,
    initialData: initial ?? undefined,
    refetchInterval: (query) => (running(query.state.data) ? 1000 : false),
  });
}
