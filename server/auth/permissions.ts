import type { Role } from '../../shared/schemas/users';

/**
 * Who may call a route: 'public' (anyone), 'signed-in' (any role), or a list of roles.
 * Every route declares one; the permission-matrix test walks the route table with it.
 */
export type Access = 'public' | 'signed-in' | readonly Role[];

export const STAFF = ['admin', 'engineer', 'operator'] as const satisfies readonly Role[];
export const EDITORS = ['admin', 'engineer'] as const satisfies readonly Role[];
export const ADMINS = ['admin'] as const satisfies readonly Role[];
export const EVERYONE = ['admin', 'engineer', 'operator', 'client'] as const satisfies readonly Role[];

export function allows(access: Access, role: Role | null): boolean {
  if (access === 'public') return true;
  if (role === null) return false;
  return access === 'signed-in' || access.includes(role);
}
