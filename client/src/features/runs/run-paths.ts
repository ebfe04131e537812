/** Addresses of the run pages (same shape as config/paths: `pattern` for routes, `href` for links). */
export const runPaths = {
  newRun: { pattern: '/runs/new', href: (planId?: number) => (planId ? `/runs/new?planId=${planId}` : '/runs/new') },
  run: { pattern: '/runs/:runId', href: (id: number) => `/runs/${id}` },
} as const;
