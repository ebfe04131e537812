import type { QueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { FormNotice } from '../../components/form-alert';
import { PageHeader } from '../../components/page-header';
import { QueryResult } from '../../components/query-states';
import { organizationsQueryOptions, useOrganizations } from '../../features/organizations/api/get-organizations';
import { usersQueryOptions, useUsers } from '../../features/users/api/get-users';
import { CreateUserForm } from '../../features/users/components/create-user-form';
import { UsersTable } from '../../features/users/components/users-table';
import { requirePermission } from '../route-guards';

export const usersLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requirePermission(queryClient, request, 'users:manage');
    await Promise.all([queryClient.ensureQueryData(usersQueryOptions()), queryClient.ensureQueryData(organizationsQueryOptions())]);
    return null;
  };

export function UsersRoute() {
  const users = useUsers();
  const organizations = useOrganizations();
  const [added, setAdded] = useState<string | null>(null);
  return (
    <>
      <PageHeader title="Users" />
      <QueryResult query={organizations} loadingLabel="Loading organisations…">
        {(orgs) => (
          <>
            <section aria-labelledby="add-user" className="mb-8 max-w-3xl">
              <h2 id="add-user" className="mb-3 text-xl font-bold">
                Add a user
              </h2>
              {added && <FormNotice>Added {added}.</FormNotice>}
              <CreateUserForm organizations={orgs} onCreated={(u) => setAdded(`${u.name} (${u.email})`)} />
            </section>
            <section aria-labelledby="all-users">
              <h2 id="all-users" className="mb-3 text-xl font-bold">
                All users
              </h2>
              <QueryResult query={users} loadingLabel="Loading users…">
                {(items) => <UsersTable users={items} organizations={orgs} />}
              </QueryResult>
            </section>
          </>
        )}
      </QueryResult>
    </>
  );
}
