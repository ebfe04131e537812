/** Query keys of runs. */
export const runKeys = {
  all: ['runs'] as const,
  list: () => [...runKeys.all, 'list'] as const,
  detail: (id: number) => [...runKeys.all, id] as const,
  events: (id: number) => [...runKeys.all, id, 'events'] as const,
};
