import type { QueryClient } from '@tanstack/react-query';
import { Link, type LoaderFunctionArgs, useNavigate, useParams } from 'react-router-dom';
import { PageHeader } from '../../components/page-header';
import { QueryResult } from '../../components/query-states';
import { paths } from '../../config/paths';
import { locationQueryOptions, useLocation } from '../../features/locations/api/get-location';
import { LocationForm } from '../../features/locations/components/location-form';
import { projectQueryOptions, useProject } from '../../features/projects/api/get-project';
import { requirePermission, routeId } from '../route-guards';

export const newLocationLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requirePermission(queryClient, request, 'locations:write');
    return queryClient.ensureQueryData(projectQueryOptions(routeId(params, 'projectId')));
  };

export const editLocationLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requirePermission(queryClient, request, 'locations:write');
    return queryClient.ensureQueryData(locationQueryOptions(routeId(params, 'locationId')));
  };

export function NewLocationRoute() {
  const navigate = useNavigate();
  const projectId = Number(useParams().projectId);
  const project = useProject(projectId);
  return (
    <>
      <PageHeader title="New test location" context={<Link to={paths.project.href(projectId)}>{project.data?.name ?? 'Project'}</Link>} />
      <LocationForm projectId={projectId} onSaved={(l) => navigate(paths.location.href(l.id))} onCancel={() => navigate(paths.project.href(projectId))} />
    </>
  );
}

export function EditLocationRoute() {
  const navigate = useNavigate();
  const location = useLocation(Number(useParams().locationId));
  return (
    <QueryResult query={location} loadingLabel="Loading test location…">
      {(l) => (
        <>
          <PageHeader title={`Edit pit ${l.pitId}`} context={<Link to={paths.location.href(l.id)}>Back to the location</Link>} />
          <LocationForm
            projectId={l.projectId}
            location={l}
            onSaved={() => navigate(paths.location.href(l.id))}
            onCancel={() => navigate(paths.location.href(l.id))}
          />
        </>
      )}
    </QueryResult>
  );
}
