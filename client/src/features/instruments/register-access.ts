import type { Role } from '@shared/schemas/users';
import type { QueryClient } from '@tanstack/react-query';
import { data } from 'react-router-dom';
import { requireUser } from '../../app/route-guards';
import { useUser } from '../../lib/auth';

/*
 * Who may open and change the instrument register and the rigs; mirrors the server's STAFF and
 * EDITORS. Kept here until lib/permissions.ts gains register grants.
 */
const OPEN: readonly Role[] = ['admin', 'engineer', 'operator'];
const EDIT: readonly Role[] = ['admin', 'engineer'];

export const canOpenRegister = (role: Role | null | undefined) => role != null && OPEN.includes(role);
export const canEditRegister = (role: Role | null | undefined) => role != null && EDIT.includes(role);

export function useCanEditRegister(): boolean {
  return canEditRegister(useUser()?.role);
}

/** Stops a register or rig page the user's role may not open (or, with `edit`, change). */
export async function requireRegisterAccess(queryClient: QueryClient, request: Request, edit = false) {
  const user = await requireUser(queryClient, request);
  if (!(edit ? canEditRegister : canOpenRegister)(user.role)) throw data('Your role cannot open this page', { status: 403 });
  return user;
}
