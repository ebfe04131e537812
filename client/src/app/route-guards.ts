import { idSchema } from '@shared/schemas/common';
import type { User } from '@shared/schemas/users';
import type { QueryClient } from '@tanstack/react-query';
import { data, type Params, redirect } from 'react-router-dom';
import { paths } from '../config/paths';
import { meQueryOptions } from '../lib/auth';
import { can, type Permission } from '../lib/permissions';

/** A numeric id from the address; anything else is a page that does not exist. */
export function routeId(params: Params, name: string): number {
  const parsed = idSchema.safeParse(params[name]);
  if (!parsed.success) throw data('No such page', { status: 404 });
  return parsed.data;
}

/**
 * The signed-in user, or a redirect to sign-in that comes back here afterwards. React Router runs a
 * page's loader beside the layout's, so every loader that fetches calls this first.
 */
export async function requireUser(queryClient: QueryClient, request: Request): Promise<User> {
  const user = await queryClient.ensureQueryData(meQueryOptions());
  if (!user) {
    const url = new URL(request.url);
    throw redirect(paths.signIn.href(url.pathname + url.search));
  }
  return user;
}

/** Stops a page the user's role may not open, before it fetches anything else. */
export async function requirePermission(queryClient: QueryClient, request: Request, permission: Permission): Promise<User> {
  const user = await requireUser(queryClient, request);
  if (!can(user.role, permission)) throw data('Your role cannot open this page', { status: 403 });
  return user;
}
