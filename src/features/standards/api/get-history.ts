import { useQuery } from '@tanstack/react-query';
import type { ToleranceBandChangeDto } from '@shared/schemas/tolerance.schema';
import { api } from '@/lib/api-client';
import { standardsKeys } from './keys';

export function getHistory(ageGroupId: string | null): Promise<{ changes: ToleranceBandChangeDto[] }> {
  return api.get('/api/tolerance-bands/history', {
    query: ageGroupId ? { ageGroupId, limit: '50' } : { limit: '50' },
  });
}

export function useBandHistory(ageGroupId: string | null) {
  return useQuery({ queryKey: standardsKeys.history(ageGroupId), queryFn: () => getHistory(ageGroupId) });
}
