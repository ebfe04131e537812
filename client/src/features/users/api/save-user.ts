import type { CreateUserInput, UpdateUserInput, User } from '@shared/schemas/users';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { userKeys } from './user-keys';

export function createUser(input: CreateUserInput): Promise<User> {
  return api.post<User>('/api/users', input);
}

export function updateUser(id: number, input: UpdateUserInput): Promise<User> {
  return api.patch<User>(`/api/users/${id}`, input);
}

function useRefreshUsersAfter<TInput>(mutationFn: (input: TInput) => Promise<User>) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn, onSuccess: () => queryClient.invalidateQueries({ queryKey: userKeys.all }) });
}

export function useCreateUser() {
  return useRefreshUsersAfter(createUser);
}

/** Changes one user: role, organisation, name, active flag or a new password. */
export function useUpdateUser(id: number) {
  return useRefreshUsersAfter((input: UpdateUserInput) => updateUser(id, input));
}
