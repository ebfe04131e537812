/** Query keys of site and pit photos; a change to any photo refreshes everything under `all`. */
export const photoKeys = {
  all: ['photos'] as const,
  byLocation: (locationId: number) => [...photoKeys.all, 'by-location', locationId] as const,
  byRun: (runId: number) => [...photoKeys.all, 'by-run', runId] as const,
};
