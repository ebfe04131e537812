/** Query keys of the instrument register; invalidating `all` refreshes every list and detail. */
export const instrumentKeys = {
  all: ['instruments'] as const,
  list: () => [...instrumentKeys.all, 'list'] as const,
  detail: (id: number) => [...instrumentKeys.all, 'detail', id] as const,
};
