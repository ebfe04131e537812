import type { QueryClient } from '@tanstack/react-query';
import { type LoaderFunctionArgs, useParams } from 'react-router-dom';
import { LinkButton } from '../../components/button';
import { CautionNotice } from '../../components/caution-notice';
import { PageHeader } from '../../components/page-header';
import { QueryResult } from '../../components/query-states';
import { paths } from '../../config/paths';
import { ReportPhotos } from '../../features/photos/components/photo-sections';
import { signoffQueryOptions, useSignoff } from '../../features/signoff/api/signoff';
import { SignoffPanel } from '../../features/signoff/components/signoff-panel';
import { useCan } from '../../lib/auth';
import { requirePermission, routeId } from '../route-guards';

export const signoffLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requirePermission(queryClient, request, 'plans:read');
    return queryClient.ensureQueryData(signoffQueryOptions(routeId(params, 'runId')));
  };

export function SignoffRoute() {
  const runId = Number(useParams().runId);
  const signoff = useSignoff(runId);
  // Engineers and admins review and sign: the same roles that save interpretations.
  const canSign = useCan('plans:write');
  return (
    <>
      <PageHeader
        title={`Review and sign-off of run ${runId}`}
        actions={
          <>
            <LinkButton to={paths.interpretation.href(runId)}>Interpretation</LinkButton>
            <LinkButton to={paths.replay.href(runId)}>Replay</LinkButton>
            <LinkButton to={paths.reports.href()}>All reports</LinkButton>
          </>
        }
      />
      <QueryResult query={signoff} loadingLabel="Loading the review state…">
        {(view) => <SignoffPanel view={view} canSign={canSign} />}
      </QueryResult>
      <ReportPhotos runId={runId} />
      <CautionNotice className="mt-6" />
    </>
  );
}
