/** Every page address in one place: route definitions use `pattern`, links use `href`. */
export const paths = {
  signIn: { pattern: '/sign-in', href: (next?: string) => (next && next !== '/' ? `/sign-in?next=${encodeURIComponent(next)}` : '/sign-in') },
  signOut: { pattern: '/sign-out', href: () => '/sign-out' },
  home: { pattern: '/', href: () => '/' },
  projects: { pattern: '/projects', href: () => '/projects' },
  newProject: { pattern: '/projects/new', href: () => '/projects/new' },
  project: { pattern: '/projects/:projectId', href: (id: number) => `/projects/${id}` },
  editProject: { pattern: '/projects/:projectId/edit', href: (id: number) => `/projects/${id}/edit` },
  newLocation: { pattern: '/projects/:projectId/locations/new', href: (projectId: number) => `/projects/${projectId}/locations/new` },
  location: { pattern: '/locations/:locationId', href: (id: number) => `/locations/${id}` },
  editLocation: { pattern: '/locations/:locationId/edit', href: (id: number) => `/locations/${id}/edit` },
  newPlan: { pattern: '/locations/:locationId/plans/new', href: (locationId: number) => `/locations/${locationId}/plans/new` },
  plan: { pattern: '/plans/:planId', href: (id: number) => `/plans/${id}` },
  organizations: { pattern: '/organizations', href: () => '/organizations' },
  users: { pattern: '/users', href: () => '/users' },
  account: { pattern: '/account', href: () => '/account' },
  newRun: { pattern: '/runs/new', href: (planId?: number) => (planId ? `/runs/new?planId=${planId}` : '/runs/new') },
  run: { pattern: '/runs/:runId', href: (id: number) => `/runs/${id}` },
  interpretation: { pattern: '/runs/:runId/interpretation', href: (runId: number) => `/runs/${runId}/interpretation` },
  replay: { pattern: '/runs/:runId/replay', href: (runId: number) => `/runs/${runId}/replay` },
  signoff: { pattern: '/runs/:runId/signoff', href: (runId: number) => `/runs/${runId}/signoff` },
  reports: { pattern: '/reports', href: () => '/reports' },
  mailbox: { pattern: '/mailbox', href: () => '/mailbox' },
  imports: { pattern: '/imports', href: () => '/imports' },
  instruments: { pattern: '/instruments', href: () => '/instruments' },
  newInstrument: { pattern: '/instruments/new', href: () => '/instruments/new' },
  instrument: { pattern: '/instruments/:instrumentId', href: (id: number) => `/instruments/${id}` },
  editInstrument: { pattern: '/instruments/:instrumentId/edit', href: (id: number) => `/instruments/${id}/edit` },
  rigs: { pattern: '/rigs', href: () => '/rigs' },
  newRig: { pattern: '/rigs/new', href: () => '/rigs/new' },
  editRig: { pattern: '/rigs/:rigId/edit', href: (id: number) => `/rigs/${id}/edit` },
  rigCheck: { pattern: '/rigs/:rigId/check', href: (id: number) => `/rigs/${id}/check` },
  deviceProfiles: { pattern: '/device-profiles', href: () => '/device-profiles' },
  newDeviceProfile: { pattern: '/device-profiles/new', href: () => '/device-profiles/new' },
  editDeviceProfile: { pattern: '/device-profiles/:profileId/edit', href: (id: string) => `/device-profiles/${encodeURIComponent(id)}/edit` },
} as const;

/** Where to go after sign-in: only a path on this site, never another origin. */
export function safeNextPath(next: string | null): string {
  return next?.startsWith('/') && !next.startsWith('//') ? next : paths.home.href();
}
