export interface AthleteFilters {
  search?: string;
  ageGroupId?: string;
}

export const athleteKeys = {
  all: ['athletes'] as const,
  lists: () => [...athleteKeys.all, 'list'] as const,
  list: (filters: AthleteFilters) => [...athleteKeys.lists(), filters] as const,
  details: () => [...athleteKeys.all, 'detail'] as const,
  detail: (id: string) => [...athleteKeys.details(), id] as const,
  ageGroups: () => ['age-groups'] as const,
};
