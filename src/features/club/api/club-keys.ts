export const clubKeys = {
  all: ['club'] as const,
  members: () => [...clubKeys.all, 'members'] as const,
};
