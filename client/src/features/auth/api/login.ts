import type { LoginInput, User } from '@shared/schemas/users';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { authKeys, type Session } from '../../../lib/auth';

/** Signs in; the session's fresh CSRF token replaces the signed-out one. */
export async function login(input: LoginInput): Promise<User> {
  const session = await api.post<Session>('/api/auth/login', input);
  api.rememberCsrfToken(session.csrfToken);
  return session.user;
}

export function useLogin() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: login,
    onSuccess: (user) => {
      // Anything cached under a previous session must not leak into this one.
      queryClient.clear();
      queryClient.setQueryData(authKeys.me(), user);
    },
  });
}
