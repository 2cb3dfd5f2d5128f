export interface ClipFilters {
  athleteId?: string;
  sessionId?: string;
}

export const clipKeys = {
  all: ['clips'] as const,
  lists: () => [...clipKeys.all, 'list'] as const,
  list: (filters: ClipFilters) => [...clipKeys.lists(), filters] as const,
  detail: (id: string) => [...clipKeys.all, 'detail', id] as const,
};
