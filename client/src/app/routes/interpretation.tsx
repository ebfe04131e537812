import type { QueryClient } from '@tanstack/react-query';
import { lazy, Suspense } from 'react';
import { type LoaderFunctionArgs, useParams } from 'react-router-dom';
import { LinkButton } from '../../components/button';
import { CautionNotice } from '../../components/caution-notice';
import { PageHeader } from '../../components/page-header';
import { LoadingState, QueryResult } from '../../components/query-states';
import { paths } from '../../config/paths';
import { interpretationQueryOptions, runRecordQueryOptions, useRunRecord } from '../../features/interpretation/api/get-interpretation';
import { requirePermission, routeId } from '../route-guards';

// The plots (uPlot) load with this page only, not with the app.
const InterpretationPage = lazy(() => import('../../features/interpretation/components/interpretation-page').then((m) => ({ default: m.InterpretationPage })));

/** The record and the default analysis load before the page shows. */
export const interpretationLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requirePermission(queryClient, request, 'plans:read');
    const runId = routeId(params, 'runId');
    await Promise.all([queryClient.ensureQueryData(runRecordQueryOptions(runId)), queryClient.ensureQueryData(interpretationQueryOptions(runId))]);
    return null;
  };

export function InterpretationRoute() {
  const runId = Number(useParams().runId);
  const record = useRunRecord(runId);
  const m = record.data?.metadata;
  const context = [m?.project, m?.pit && `pit ${m.pit}`, m?.testDate].filter(Boolean).join(' · ');
  return (
    <>
      <PageHeader
        title={`Interpretation of run ${runId}`}
        context={context || undefined}
        actions={
          <>
            <LinkButton to={paths.replay.href(runId)}>Replay the run</LinkButton>
            <LinkButton to={paths.signoff.href(runId)} variant="primary">
              On to review and sign-off
            </LinkButton>
          </>
        }
      />
      <QueryResult query={record} loadingLabel="Loading the run’s record…">
        {(r) => (
          <Suspense fallback={<LoadingState label="Loading the interpretation…" />}>
            <InterpretationPage runId={runId} record={r} />
          </Suspense>
        )}
      </QueryResult>
      <CautionNotice className="mt-6" />
    </>
  );
}
