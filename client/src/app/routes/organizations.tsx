import { type QueryClient, useQueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { PageHeader } from '../../components/page-header';
import { QueryResult } from '../../components/query-states';
import { organizationsQueryOptions, useOrganizations } from '../../features/organizations/api/get-organizations';
import { OrganizationForm } from '../../features/organizations/components/organization-form';
import { OrganizationsList } from '../../features/organizations/components/organizations-list';
import { projectKeys } from '../../features/projects/api/project-keys';
import { useCan } from '../../lib/auth';
import { requirePermission } from '../route-guards';

export const organizationsLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requirePermission(queryClient, request, 'organizations:read');
    return queryClient.ensureQueryData(organizationsQueryOptions());
  };

export function OrganizationsRoute() {
  const queryClient = useQueryClient();
  const organizations = useOrganizations();
  const canEdit = useCan('organizations:write');
  // Projects show their client's name, so a rename must reach them too.
  const refreshProjects = () => void queryClient.invalidateQueries({ queryKey: projectKeys.all });
  return (
    <>
      <PageHeader title="Client organisations" />
      {canEdit && (
        <section aria-labelledby="add-organization" className="mb-8 max-w-3xl">
          <h2 id="add-organization" className="mb-3 text-xl font-bold">
            Add an organisation
          </h2>
          <OrganizationForm onSaved={refreshProjects} />
        </section>
      )}
      <QueryResult query={organizations} loadingLabel="Loading organisations…">
        {(items) => <OrganizationsList organizations={items} canEdit={canEdit} onSaved={refreshProjects} />}
      </QueryResult>
    </>
  );
}
