import type { Role } from '@shared/schemas/users';

/**
 * What each role may do, used only to hide controls a user cannot use; the server enforces the
 * same rules on every request.
 */
const GRANTS = {
  'projects:write': ['admin', 'engineer'],
  'projects:delete': ['admin'],
  'locations:write': ['admin', 'engineer'],
  'plans:read': ['admin', 'engineer', 'operator'],
  'plans:write': ['admin', 'engineer'],
  'organizations:read': ['admin', 'engineer', 'operator'],
  'organizations:write': ['admin', 'engineer'],
  'users:manage': ['admin'],
  /** The lab's device profiles: engineers read them (to choose one for a rig), admins define them. */
  'device-profiles:read': ['admin', 'engineer'],
  'device-profiles:write': ['admin'],
  /** Staff see and add photos (clients meet them in the signed report); operators change only their own. */
  'photos:read': ['admin', 'engineer', 'operator'],
  'photos:change-any': ['admin', 'engineer'],
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof GRANTS;

export function can(role: Role | null | undefined, permission: Permission): boolean {
  return role != null && (GRANTS[permission] as readonly Role[]).includes(role);
}
