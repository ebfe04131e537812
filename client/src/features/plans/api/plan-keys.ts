/** Query keys of test plans. */
export const planKeys = {
  all: ['plans'] as const,
  byLocation: (locationId: number) => [...planKeys.all, 'by-location', locationId] as const,
  detail: (id: number) => [...planKeys.all, 'detail', id] as const,
};
