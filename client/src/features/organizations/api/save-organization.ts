import type { Organization, OrganizationInput } from '@shared/schemas/users';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { organizationKeys } from './organization-keys';

export function createOrganization(input: OrganizationInput): Promise<Organization> {
  return api.post<Organization>('/api/organizations', input);
}

export function updateOrganization(id: number, input: Partial<OrganizationInput>): Promise<Organization> {
  return api.patch<Organization>(`/api/organizations/${id}`, input);
}

/** Creates an organisation, or updates it when an id is given. */
export function useSaveOrganization(id?: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: OrganizationInput) => (id === undefined ? createOrganization(input) : updateOrganization(id, input)),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: organizationKeys.all }),
  });
}
