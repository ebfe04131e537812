/** Query keys of rigs and device profiles. */
export const rigKeys = {
  all: ['rigs'] as const,
  list: () => [...rigKeys.all, 'list'] as const,
  detail: (id: number) => [...rigKeys.all, 'detail', id] as const,
  profiles: () => ['device-profiles'] as const,
  profile: (id: string) => ['device-profiles', 'detail', id] as const,
};
