import type { ListResponse } from '@shared/schemas/common';
import type { User } from '@shared/schemas/users';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { userKeys } from './user-keys';

export async function getUsers(signal?: AbortSignal): Promise<User[]> {
  return (await api.get<ListResponse<User>>('/api/users', signal)).items;
}

export const usersQueryOptions = () => queryOptions({ queryKey: userKeys.list(), queryFn: ({ signal }) => getUsers(signal) });

export function useUsers() {
  return useQuery(usersQueryOptions());
}
