import { type QueryClient, useQuery } from '@tanstack/react-query';
import { lazy, Suspense, useEffect, useState } from 'react';
import { Link, type LoaderFunctionArgs, useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { SelectField } from '../../components/form-field';
import { PageHeader } from '../../components/page-header';
import { LoadingState, QueryResult } from '../../components/query-states';
import { paths } from '../../config/paths';
import { LinkBadge } from '../../features/live/components/link-badge';
import { createLiveStore, type LiveStore } from '../../features/live/live-store';
import { useLiveRun } from '../../features/live/use-live-run';
import { useLiveSnapshot } from '../../features/live/use-live-snapshot';
import { locationsQueryOptions } from '../../features/locations/api/get-locations';
import { PitPhotosPanel } from '../../features/photos/components/photo-sections';
import { useCanSeePhotos } from '../../features/photos/photo-access';
import { usePlan } from '../../features/plans/api/get-plan';
import { usePlans } from '../../features/plans/api/get-plans';
import { useProjects } from '../../features/projects/api/get-projects';
import { useRigs } from '../../features/runs/api/get-rigs';
import { runQueryOptions } from '../../features/runs/api/get-run';
import { RunConsole } from '../../features/runs/components/run-console';
import { RunSetupForm } from '../../features/runs/components/run-setup-form';
import { useNow } from '../../features/runs/utils/use-now';
import { useSignoff } from '../../features/signoff/api/signoff';
import { requirePermission, routeId } from '../route-guards';

/** Runs are set up and watched by the staff roles, the same ones that read plans. */
export const runSetupLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) =>
    requirePermission(queryClient, request, 'plans:read');

export const runLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requirePermission(queryClient, request, 'plans:read');
    return queryClient.ensureQueryData(runQueryOptions(routeId(params, 'runId')));
  };

// uPlot touches the browser's display settings when loaded: fetch it only with the console.
const RunCharts = lazy(() => import('../../features/live/components/run-charts').then((m) => ({ default: m.RunCharts })));

const toOptions = <T extends { id: number }>(items: T[] | undefined, label: (item: T) => string) =>
  (items ?? []).map((item) => ({ value: String(item.id), label: label(item) }));

/** Project → test location → plan, for a run started from the run pages rather than a plan's page. */
function PlanPicker({ onPick }: { onPick: (planId: number | null) => void }) {
  const [projectId, setProjectId] = useState(0);
  const [locationId, setLocationId] = useState(0);
  const projects = useProjects();
  const locations = useQuery({ ...locationsQueryOptions(projectId), enabled: projectId > 0 });
  const plans = usePlans(locationId, { enabled: locationId > 0 });
  return (
    <fieldset className="flex max-w-xl flex-col gap-3">
      <legend className="mb-2 text-lg font-bold">Test plan</legend>
      <SelectField
        label="Project"
        placeholder={projects.isPending ? 'Loading…' : 'Choose a project'}
        value={projectId || ''}
        options={toOptions(projects.data, (p) => `${p.code} · ${p.name}`)}
        onChange={(e) => {
          setProjectId(Number(e.target.value));
          setLocationId(0);
          onPick(null);
        }}
      />
      {projectId > 0 && (
        <SelectField
          label="Test location"
          placeholder={locations.isPending ? 'Loading…' : 'Choose a pit'}
          value={locationId || ''}
          options={toOptions(locations.data, (l) => `Pit ${l.pitId}`)}
          onChange={(e) => {
            setLocationId(Number(e.target.value));
            onPick(null);
          }}
        />
      )}
      {locationId > 0 && (
        <SelectField
          label="Plan"
          placeholder={plans.isPending ? 'Loading…' : 'Choose a plan'}
          options={toOptions(plans.data, (p) => p.name)}
          onChange={(e) => onPick(e.target.value ? Number(e.target.value) : null)}
        />
      )}
    </fieldset>
  );
}

function ChosenPlan({ planId }: { planId: number }) {
  const plan = usePlan(planId);
  return (
    <QueryResult query={plan} loadingLabel="Loading the plan…">
      {({ plan: p }) => (
        <p className="mb-4 text-lg">
          Plan: <Link to={paths.plan.href(p.id)}>{p.name}</Link>
        </p>
      )}
    </QueryResult>
  );
}

/** Set up a run: the plan (given, or picked), the rig, then on to the console's preparing phase. */
export function RunSetupRoute() {
  const navigate = useNavigate();
  const [search] = useSearchParams();
  const given = Number(search.get('planId')) || null;
  const [picked, setPicked] = useState<number | null>(null);
  const rigs = useRigs();
  const planId = given ?? picked;
  return (
    <>
      <PageHeader title="Set up a run" context={<Link to={paths.home.href()}>Runs</Link>} />
      {given ? <ChosenPlan planId={given} /> : <PlanPicker onPick={setPicked} />}
      <div className="mt-4">
        <QueryResult query={rigs} loadingLabel="Loading rigs…">
          {(items) => <RunSetupForm planId={planId} rigs={items} onCreated={(view) => navigate(paths.run.href(view.id))} />}
        </QueryResult>
      </div>
    </>
  );
}

/** The console over a live store, without opening the link itself (the route does that). */
export function LiveRunConsole({ store }: { store: LiveStore }) {
  const snapshot = useLiveSnapshot(store);
  const now = useNow();
  const view = snapshot.view;
  if (!view) return <LoadingState label="Waiting for the run…" />;
  return (
    <RunConsole
      view={view}
      receivedAtMs={snapshot.viewReceivedAtMs}
      onView={store.setView}
      connection={<LinkBadge snapshot={snapshot} nowMs={now} />}
      charts={
        <Suspense fallback={<LoadingState label="Loading the plots…" />}>
          <RunCharts store={store} view={view} />
        </Suspense>
      }
    />
  );
}

/** Pit photos under the console, folded, so they never push the live figures down. */
function RunPhotos({ runId, planId }: { runId: number; planId: number }) {
  const plan = usePlan(planId);
  const signoff = useSignoff(runId);
  return <PitPhotosPanel runId={runId} locationId={plan.data?.plan.locationId ?? null} locked={signoff.data?.state === 'signed'} />;
}

function RunConsolePage({ runId }: { runId: number }) {
  const first = useQuery(runQueryOptions(runId));
  // One store per run page: its samples and curve live as long as the page does.
  const [store] = useState(createLiveStore);
  useEffect(() => {
    if (first.data) store.setView(first.data);
  }, [first.data, store]);
  useLiveRun(runId, store);
  const canSeePhotos = useCanSeePhotos();
  if (first.isError) return <QueryResult query={first}>{() => null}</QueryResult>;
  return (
    <>
      <LiveRunConsole store={store} />
      {canSeePhotos && first.data && <RunPhotos runId={runId} planId={first.data.planId} />}
    </>
  );
}

export function RunConsoleRoute() {
  const runId = Number(useParams().runId);
  return <RunConsolePage key={runId} runId={runId} />;
}
