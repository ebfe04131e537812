import type { User } from '@shared/schemas/users';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, isApiError } from './api-client';
import { can, type Permission } from './permissions';

/** The signed-in session; every user-specific query hangs off these keys. */
export const authKeys = {
  all: ['auth'] as const,
  me: () => [...authKeys.all, 'me'] as const,
};

/** What sign-in and the session check return: the user and a fresh CSRF token. */
export interface Session {
  user: User;
  csrfToken: string;
}

/** The signed-in user, or null when there is no session. */
export async function getMe(): Promise<User | null> {
  try {
    const session = await api.get<Session>('/api/auth/me');
    api.rememberCsrfToken(session.csrfToken);
    return session.user;
  } catch (error) {
    if (isApiError(error) && error.status === 401) return null;
    throw error;
  }
}

export const meQueryOptions = () => queryOptions({ queryKey: authKeys.me(), queryFn: getMe, staleTime: 5 * 60_000 });

export function useUser(): User | null {
  return useQuery(meQueryOptions()).data ?? null;
}

export function useCan(permission: Permission): boolean {
  return can(useUser()?.role, permission);
}
