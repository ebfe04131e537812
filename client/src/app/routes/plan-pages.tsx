import type { QueryClient } from '@tanstack/react-query';
import { Link, type LoaderFunctionArgs, useNavigate, useParams } from 'react-router-dom';
import { LinkButton } from '../../components/button';
import { ConfirmButton } from '../../components/confirm-button';
import { FormError } from '../../components/form-alert';
import { PageHeader } from '../../components/page-header';
import { QueryResult } from '../../components/query-states';
import { paths } from '../../config/paths';
import { locationQueryOptions, useLocation } from '../../features/locations/api/get-location';
import { useDeletePlan } from '../../features/plans/api/delete-plan';
import { planQueryOptions, usePlan } from '../../features/plans/api/get-plan';
import { PlanForm } from '../../features/plans/components/plan-form';
import { useCan } from '../../lib/auth';
import { requirePermission, routeId } from '../route-guards';

export const newPlanLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requirePermission(queryClient, request, 'plans:write');
    return queryClient.ensureQueryData(locationQueryOptions(routeId(params, 'locationId')));
  };

/** A plan is checked against its location, so both are loaded before the page shows. */
export const planLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requirePermission(queryClient, request, 'plans:read');
    const { plan } = await queryClient.ensureQueryData(planQueryOptions(routeId(params, 'planId')));
    return queryClient.ensureQueryData(locationQueryOptions(plan.locationId));
  };

export function NewPlanRoute() {
  const navigate = useNavigate();
  const location = useLocation(Number(useParams().locationId));
  return (
    <QueryResult query={location} loadingLabel="Loading test location…">
      {(l) => (
        <>
          <PageHeader title="New test plan" context={<Link to={paths.location.href(l.id)}>Pit {l.pitId}</Link>} />
          <PlanForm
            location={l}
            onSaved={({ plan }) => navigate(paths.plan.href(plan.id), { replace: true })}
            onCancel={() => navigate(paths.location.href(l.id))}
          />
        </>
      )}
    </QueryResult>
  );
}

export function PlanDetailRoute() {
  const navigate = useNavigate();
  const plan = usePlan(Number(useParams().planId));
  const locationId = plan.data?.plan.locationId;
  const location = useLocation(locationId ?? 0, { enabled: locationId !== undefined });
  const canWrite = useCan('plans:write');
  const remove = useDeletePlan();
  return (
    <QueryResult query={plan} loadingLabel="Loading test plan…">
      {({ plan: p }) => (
        <QueryResult query={location} loadingLabel="Loading test location…">
          {(l) => (
            <>
              <PageHeader
                title={p.name}
                context={<Link to={paths.location.href(l.id)}>Pit {l.pitId}</Link>}
                actions={
                  <>
                    <LinkButton to={paths.newRun.href(p.id)} variant="primary">
                      Run this plan
                    </LinkButton>
                    {canWrite && (
                      <>
                        <ConfirmButton
                          label="Delete plan"
                          question={`Delete the plan “${p.name}”?`}
                          busy={remove.isPending}
                          onConfirm={() => remove.mutate(p, { onSuccess: () => navigate(paths.location.href(l.id)) })}
                        />
                        <FormError message={remove.error?.message} />
                      </>
                    )}
                  </>
                }
              />
              {!canWrite && <p className="mb-4 text-neutral-800">Read only: your role can view this plan but not change it.</p>}
              <PlanForm location={l} plan={p} readOnly={!canWrite} />
            </>
          )}
        </QueryResult>
      )}
    </QueryResult>
  );
}
