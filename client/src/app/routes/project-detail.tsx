import type { Project } from '@shared/schemas/projects';
import type { QueryClient } from '@tanstack/react-query';
import { Link, type LoaderFunctionArgs, useNavigate, useParams } from 'react-router-dom';
import { LinkButton } from '../../components/button';
import { ConfirmButton } from '../../components/confirm-button';
import { FormError } from '../../components/form-alert';
import { PageHeader } from '../../components/page-header';
import { EmptyState, QueryResult } from '../../components/query-states';
import { paths } from '../../config/paths';
import { Ags4Download } from '../../features/ags4/components/ags4-download';
import { locationsQueryOptions, useLocations } from '../../features/locations/api/get-locations';
import { LocationsTable } from '../../features/locations/components/locations-table';
import { useDeleteProject } from '../../features/projects/api/delete-project';
import { projectQueryOptions, useProject } from '../../features/projects/api/get-project';
import { useCan } from '../../lib/auth';
import { requireUser, routeId } from '../route-guards';

export const projectLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    const id = routeId(params, 'projectId');
    await requireUser(queryClient, request);
    void queryClient.prefetchQuery(locationsQueryOptions(id));
    return queryClient.ensureQueryData(projectQueryOptions(id));
  };

function ProjectFacts({ project }: { project: Project }) {
  return (
    <dl className="mb-8 grid max-w-3xl gap-x-6 gap-y-2 sm:grid-cols-[max-content_1fr]">
      <dt className="font-semibold">Client</dt>
      <dd>{project.organizationName}</dd>
      <dt className="font-semibold">Site</dt>
      <dd>{project.site}</dd>
      <dt className="font-semibold">Address</dt>
      <dd className="whitespace-pre-line">{project.address || '—'}</dd>
      {project.notes && (
        <>
          <dt className="font-semibold">Notes</dt>
          <dd className="whitespace-pre-line">{project.notes}</dd>
        </>
      )}
    </dl>
  );
}

function ProjectActions({ project }: { project: Project }) {
  const navigate = useNavigate();
  const canEdit = useCan('projects:write');
  const canDelete = useCan('projects:delete');
  const remove = useDeleteProject();
  return (
    <>
      {canEdit && <LinkButton to={paths.editProject.href(project.id)}>Edit project</LinkButton>}
      {canDelete && (
        <ConfirmButton
          label="Delete project"
          question={`Delete ${project.code} with all its locations and plans?`}
          busy={remove.isPending}
          onConfirm={() => remove.mutate(project.id, { onSuccess: () => navigate(paths.projects.href()) })}
        />
      )}
      <FormError message={remove.error?.message} />
    </>
  );
}

export function ProjectDetailRoute() {
  const projectId = Number(useParams().projectId);
  const project = useProject(projectId);
  const locations = useLocations(projectId);
  const canAddLocation = useCan('locations:write');
  return (
    <QueryResult query={project} loadingLabel="Loading project…">
      {(p) => (
        <>
          <PageHeader
            title={p.name}
            context={
              <>
                <Link to={paths.projects.href()}>Projects</Link> › <span className="font-mono">{p.code}</span>
              </>
            }
            actions={
              <>
                <Ags4Download of="project" id={p.id} />
                <ProjectActions project={p} />
              </>
            }
          />
          <ProjectFacts project={p} />
          <section aria-labelledby="locations-title">
            <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
              <h2 id="locations-title" className="text-xl font-bold">
                Test locations
              </h2>
              {canAddLocation && (
                <LinkButton to={paths.newLocation.href(p.id)} variant="primary">
                  New location
                </LinkButton>
              )}
            </div>
            <QueryResult query={locations} loadingLabel="Loading test locations…">
              {(items) => (items.length === 0 ? <EmptyState title="No test locations yet" /> : <LocationsTable locations={items} />)}
            </QueryResult>
          </section>
        </>
      )}
    </QueryResult>
  );
}
