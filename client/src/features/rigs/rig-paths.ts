/** Addresses of the rig pages; route definitions use `pattern`, links use `href`. */
export const rigPaths = {
  rigs: { pattern: '/rigs', href: () => '/rigs' },
  newRig: { pattern: '/rigs/new', href: () => '/rigs/new' },
  editRig: { pattern: '/rigs/:rigId/edit', href: (id: number) => `/rigs/${id}/edit` },
  rigCheck: { pattern: '/rigs/:rigId/check', href: (id: number) => `/rigs/${id}/check` },
} as const;
