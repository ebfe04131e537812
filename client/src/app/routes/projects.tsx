import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { LinkButton } from '../../components/button';
import { PageHeader } from '../../components/page-header';
import { EmptyState, QueryResult } from '../../components/query-states';
import { paths } from '../../config/paths';
import { projectsQueryOptions, useProjects } from '../../features/projects/api/get-projects';
import { ProjectsTable } from '../../features/projects/components/projects-table';
import { useCan } from '../../lib/auth';
import { requireUser } from '../route-guards';

export const projectsLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireUser(queryClient, request);
    return queryClient.ensureQueryData(projectsQueryOptions());
  };

export function ProjectsRoute() {
  const projects = useProjects();
  const canCreate = useCan('projects:write');
  return (
    <>
      <PageHeader
        title="Projects"
        actions={
          canCreate && (
            <LinkButton to={paths.newProject.href()} variant="primary">
              New project
            </LinkButton>
          )
        }
      />
      <QueryResult query={projects} loadingLabel="Loading projects…">
        {(items) => (items.length === 0 ? <EmptyState title="No projects yet" /> : <ProjectsTable projects={items} />)}
      </QueryResult>
    </>
  );
}
