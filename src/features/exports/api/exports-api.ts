import { keepPreviousData, useMutation, useQuery } from '@tanstack/react-query';
import type { ExportKind } from '@shared/exports/codebook';
import type { AgeGroupListResponse, AthleteListResponse } from '@shared/schemas/athlete.schema';
import type { CodebookResponse, ExportCountResponse } from '@shared/schemas/export.schema';
import type { SessionListResponse } from '@shared/schemas/session.schema';
import { api } from '@/lib/api-client';
import { saveBlob } from '@/lib/save-file';

/** The filters of the Exports page, as query parameters (empty ones left out). */
export interface ExportFilters {
  ageGroupId?: string;
  athleteId?: string;
  sessionId?: string;
  from?: string;
  to?: string;
  view?: 'front' | 'side';
  values: 'raw' | 'smoothed';
  /** Metric keys; all of them when undefined. */
  metrics?: string[];
}

export function exportQuery(filters: ExportFilters, kind: ExportKind): Record<string, string | undefined> {
  return {
    ageGroupId: filters.ageGroupId || undefined,
    athleteId: filters.athleteId || undefined,
    sessionId: filters.sessionId || undefined,
    from: filters.from || undefined,
    to: filters.to || undefined,
    view: filters.view || undefined,
    // Only the frames export has metric columns and smoothed values.
    values: kind === 'frames' && filters.values === 'smoothed' ? 'smoothed' : undefined,
    metrics: kind === 'frames' && filters.metrics ? filters.metrics.join(',') : undefined,
  };
}

const keys = {
  all: ['exports'] as const,
  count: (kind: ExportKind, filters: ExportFilters) => [...keys.all, 'count', kind, filters] as const,
  codebook: () => [...keys.all, 'codebook'] as const,
  choices: () => [...keys.all, 'choices'] as const,
};

export function useExportCount(kind: ExportKind, filters: ExportFilters, enabled: boolean) {
  return useQuery({
    queryKey: keys.count(kind, filters),
    queryFn: () =>
      api.get<ExportCountResponse>('/api/exports/count', { query: { kind, ...exportQuery(filters, kind) } }),
    enabled,
    placeholderData: keepPreviousData,
  });
}

export function useCodebook() {
  return useQuery({
    queryKey: keys.codebook(),
    queryFn: () => api.get<CodebookResponse>('/api/exports/codebook'),
    staleTime: Infinity,
  });
}

/** Age groups, athletes and sessions to choose from (what the caller may see). */
export function useExportChoices() {
  return useQuery({
    queryKey: keys.choices(),
    queryFn: async () => {
      const [groups, athletes, sessions] = await Promise.all([
        api.get<AgeGroupListResponse>('/api/age-groups'),
        api.get<AthleteListResponse>('/api/athletes'),
        api.get<SessionListResponse>('/api/sessions'),
      ]);
      return {
        ageGroups: [...groups.ageGroups].sort((a, b) => a.minAge - b.minAge),
        athletes: athletes.athletes,
        sessions: sessions.sessions,
      };
    },
  });
}

export function useDownloadExport() {
  return useMutation({
    mutationFn: async ({ kind, filters }: { kind: ExportKind; filters: ExportFilters }) => {
      const blob = await api.getBlob(`/api/exports/${kind}.csv`, { query: exportQuery(filters, kind) });
      saveBlob(blob, `stanceline-${kind}-${new Date().toISOString().slice(0, 10)}.csv`);
      return blob.size;
    },
  });
}
