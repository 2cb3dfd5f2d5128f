export const standardsKeys = {
  all: ['standards'] as const,
  bands: () => [...standardsKeys.all, 'bands'] as const,
  history: (ageGroupId: string | null) => [...standardsKeys.all, 'history', ageGroupId] as const,
  job: (id: string) => [...standardsKeys.all, 'job', id] as const,
};
