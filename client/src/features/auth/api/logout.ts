import type { QueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export async function logout(): Promise<void> {
  await api.post('/api/auth/logout');
  api.forgetCsrfToken();
}

/**
 * Signs out and empties the cache, so nothing of this session stays in the page. Runs as a route
 * action: the page leaves for sign-in before anything re-renders without a user.
 */
export async function logoutAndForget(queryClient: QueryClient): Promise<void> {
  await logout();
  queryClient.clear();
}
