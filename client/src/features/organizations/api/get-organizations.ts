import type { ListResponse } from '@shared/schemas/common';
import type { Organization } from '@shared/schemas/users';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { organizationKeys } from './organization-keys';

export async function getOrganizations(signal?: AbortSignal): Promise<Organization[]> {
  return (await api.get<ListResponse<Organization>>('/api/organizations', signal)).items;
}

export const organizationsQueryOptions = () => queryOptions({ queryKey: organizationKeys.list(), queryFn: ({ signal }) => getOrganizations(signal) });

export function useOrganizations(options: { enabled?: boolean } = {}) {
  return useQuery({ ...organizationsQueryOptions(), ...options });
}
