import type { QueryClient } from '@tanstack/react-query';
import { lazy, Suspense } from 'react';
import { type LoaderFunctionArgs, useParams } from 'react-router-dom';
import { LinkButton } from '../../components/button';
import { PageHeader } from '../../components/page-header';
import { LoadingState } from '../../components/query-states';
import { paths } from '../../config/paths';
import { requirePermission, routeId } from '../route-guards';

// The plot (uPlot) loads with this page only, not with the app.
const ReplayPage = lazy(() => import('../../features/replay/components/replay-page').then((m) => ({ default: m.ReplayPage })));

/** Staff only; the page loads its own data (a long run's plot is fetched at the page's width). */
export const replayLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requirePermission(queryClient, request, 'plans:read');
    routeId(params, 'runId');
    return null;
  };

export function ReplayRoute() {
  const runId = Number(useParams().runId);
  return (
    <>
      <PageHeader
        title={`Replay of run ${runId}`}
        actions={
          <>
            <LinkButton to={paths.run.href(runId)}>Console</LinkButton>
            <LinkButton to={paths.interpretation.href(runId)} variant="primary">
              Interpretation
            </LinkButton>
          </>
        }
      />
      <Suspense fallback={<LoadingState label="Loading the replay…" />}>
        <ReplayPage runId={runId} />
      </Suspense>
    </>
  );
}
