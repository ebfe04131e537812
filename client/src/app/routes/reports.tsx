import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { CautionNotice } from '../../components/caution-notice';
import { PageHeader } from '../../components/page-header';
import { QueryResult } from '../../components/query-states';
import { reportsQueryOptions, useReports } from '../../features/reports/api/get-reports';
import { type ReportRow, ReportsBoard } from '../../features/reports/components/reports-board';
import { ReportsList } from '../../features/reports/components/reports-list';
import { type RunSummary, runsQueryOptions, useRuns } from '../../features/runs/api/get-runs';
import { useUser } from '../../lib/auth';
import { can } from '../../lib/permissions';
import { requireUser } from '../route-guards';

export const reportsLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    const user = await requireUser(queryClient, request);
    // Staff follow every report from its draft (the list of runs); a client sees its signed reports.
    return can(user.role, 'plans:read') ? queryClient.ensureQueryData(runsQueryOptions()) : queryClient.ensureQueryData(reportsQueryOptions());
  };

/** A finished run as a row of the staff list of reports. */
const toRow = (r: RunSummary): ReportRow => ({
  runId: r.id,
  projectCode: r.projectCode,
  pitId: r.pitId,
  planName: r.planName,
  finishedAt: r.finishedAt,
  state: r.review.state,
  interpreted: r.review.interpreted,
});

function StaffReports() {
  const runs = useRuns();
  return (
    <QueryResult query={runs} loadingLabel="Loading reports…">
      {(items) => <ReportsBoard rows={items.filter((r) => r.phase === 'completed' || r.phase === 'stopped').map(toRow)} />}
    </QueryResult>
  );
}

function ClientReports() {
  const reports = useReports();
  return (
    <>
      <QueryResult query={reports} loadingLabel="Loading reports…">
        {(items) => <ReportsList reports={items} showClient={false} />}
      </QueryResult>
      <CautionNotice className="mt-6" />
    </>
  );
}

/** Staff: every report, draft to signed, with filters. A client: its organisation's signed reports. */
export function ReportsRoute() {
  const user = useUser();
  const staff = can(user?.role, 'plans:read');
  return (
    <>
      <PageHeader title={staff ? 'Reports' : 'Your reports'} />
      {staff ? <StaffReports /> : <ClientReports />}
    </>
  );
}
