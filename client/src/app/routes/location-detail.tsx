import type { TestLocation } from '@shared/schemas/projects';
import type { QueryClient } from '@tanstack/react-query';
import { Link, type LoaderFunctionArgs, useNavigate, useParams } from 'react-router-dom';
import { LinkButton } from '../../components/button';
import { ConfirmButton } from '../../components/confirm-button';
import { FormError } from '../../components/form-alert';
import { PageHeader } from '../../components/page-header';
import { EmptyState, QueryResult } from '../../components/query-states';
import { paths } from '../../config/paths';
import { Ags4Download } from '../../features/ags4/components/ags4-download';
import { useDeleteLocation } from '../../features/locations/api/delete-location';
import { locationQueryOptions, useLocation } from '../../features/locations/api/get-location';
import { LocationSummary } from '../../features/locations/components/location-summary';
import { SitePlanUpload } from '../../features/locations/components/site-plan-upload';
import { LocationPhotos } from '../../features/photos/components/photo-sections';
import { useCanSeePhotos } from '../../features/photos/photo-access';
import { usePlans } from '../../features/plans/api/get-plans';
import { PlansTable } from '../../features/plans/components/plans-table';
import { useProject } from '../../features/projects/api/get-project';
import { useCan } from '../../lib/auth';
import { requireUser, routeId } from '../route-guards';

export const locationLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    const id = routeId(params, 'locationId');
    await requireUser(queryClient, request);
    return queryClient.ensureQueryData(locationQueryOptions(id));
  };

function LocationActions({ location }: { location: TestLocation }) {
  const navigate = useNavigate();
  const canEdit = useCan('locations:write');
  const remove = useDeleteLocation();
  if (!canEdit) return null;
  return (
    <>
      <LinkButton to={paths.editLocation.href(location.id)}>Edit location</LinkButton>
      <ConfirmButton
        label="Delete location"
        question={`Delete pit ${location.pitId} and its plans?`}
        busy={remove.isPending}
        onConfirm={() => remove.mutate(location, { onSuccess: () => navigate(paths.project.href(location.projectId)) })}
      />
      <FormError message={remove.error?.message} />
    </>
  );
}

function LocationPlans({ locationId }: { locationId: number }) {
  const canRead = useCan('plans:read');
  const canWrite = useCan('plans:write');
  const plans = usePlans(locationId, { enabled: canRead });
  if (!canRead) return null;
  return (
    <section aria-labelledby="plans-title" className="mt-8">
      <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
        <h2 id="plans-title" className="text-xl font-bold">
          Test plans
        </h2>
        {canWrite && (
          <LinkButton to={paths.newPlan.href(locationId)} variant="primary">
            New plan
          </LinkButton>
        )}
      </div>
      <QueryResult query={plans} loadingLabel="Loading test plans…">
        {(items) => (items.length === 0 ? <EmptyState title="No test plans yet" /> : <PlansTable plans={items} />)}
      </QueryResult>
    </section>
  );
}

export function LocationDetailRoute() {
  const location = useLocation(Number(useParams().locationId));
  const projectId = location.data?.projectId;
  const project = useProject(projectId ?? 0, { enabled: projectId !== undefined });
  const canEdit = useCan('locations:write');
  const canSeePhotos = useCanSeePhotos();
  return (
    <QueryResult query={location} loadingLabel="Loading test location…">
      {(l) => (
        <>
          <PageHeader
            title={`Pit ${l.pitId}`}
            context={
              <>
                <Link to={paths.project.href(l.projectId)}>{project.data ? `${project.data.code} ${project.data.name}` : 'Project'}</Link> › test location
              </>
            }
            actions={
              <>
                <Ags4Download of="location" id={l.id} />
                <LocationActions location={l} />
              </>
            }
          />
          <LocationSummary location={l} />
          {canEdit && (
            <div className="mt-6">
              <SitePlanUpload locationId={l.id} hasPlan={l.sitePlanFile != null} />
            </div>
          )}
          <LocationPlans locationId={l.id} />
          {canSeePhotos && <LocationPhotos locationId={l.id} pitId={l.pitId} />}
        </>
      )}
    </QueryResult>
  );
}
