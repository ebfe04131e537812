import type { QueryClient } from '@tanstack/react-query';
import { Link, type LoaderFunctionArgs, useNavigate, useParams } from 'react-router-dom';
import { PageHeader } from '../../components/page-header';
import { QueryResult } from '../../components/query-states';
import { paths } from '../../config/paths';
import { organizationsQueryOptions, useOrganizations } from '../../features/organizations/api/get-organizations';
import { projectQueryOptions, useProject } from '../../features/projects/api/get-project';
import { ProjectForm } from '../../features/projects/components/project-form';
import { requirePermission, routeId } from '../route-guards';

export const newProjectLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requirePermission(queryClient, request, 'projects:write');
    return queryClient.ensureQueryData(organizationsQueryOptions());
  };

export const editProjectLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requirePermission(queryClient, request, 'projects:write');
    await Promise.all([
      queryClient.ensureQueryData(projectQueryOptions(routeId(params, 'projectId'))),
      queryClient.ensureQueryData(organizationsQueryOptions()),
    ]);
    return null;
  };

export function NewProjectRoute() {
  const navigate = useNavigate();
  const organizations = useOrganizations();
  return (
    <>
      <PageHeader title="New project" context={<Link to={paths.projects.href()}>Projects</Link>} />
      <QueryResult query={organizations} loadingLabel="Loading client organisations…">
        {(items) => <ProjectForm organizations={items} onSaved={(p) => navigate(paths.project.href(p.id))} onCancel={() => navigate(-1)} />}
      </QueryResult>
    </>
  );
}

export function EditProjectRoute() {
  const navigate = useNavigate();
  const projectId = Number(useParams().projectId);
  const project = useProject(projectId);
  const organizations = useOrganizations();
  return (
    <QueryResult query={project} loadingLabel="Loading project…">
      {(p) => (
        <>
          <PageHeader title={`Edit ${p.code}`} context={<Link to={paths.project.href(p.id)}>{p.name}</Link>} />
          <QueryResult query={organizations} loadingLabel="Loading client organisations…">
            {(items) => (
              <ProjectForm
                project={p}
                organizations={items}
                onSaved={() => navigate(paths.project.href(p.id))}
                onCancel={() => navigate(paths.project.href(p.id))}
              />
            )}
          </QueryResult>
        </>
      )}
    </QueryResult>
  );
}
