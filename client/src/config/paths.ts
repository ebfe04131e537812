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
} as const;

/** Where to go after sign-in: only a path on this site, never another origin. */
export function safeNextPath(next: string | null): string {
  return next?.startsWith('/') && !next.startsWith('//') ? next : paths.home.href();
}
