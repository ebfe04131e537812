import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { PageHeader } from '../../components/page-header';
import { QueryResult } from '../../components/query-states';
import { reportsQueryOptions, useReports } from '../../features/reports/api/get-reports';
import { ReportsList } from '../../features/reports/components/reports-list';
import { useUser } from '../../lib/auth';
import { requireUser } from '../route-guards';

export const reportsLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireUser(queryClient, request);
    return queryClient.ensureQueryData(reportsQueryOptions());
  };

/** Signed reports: a client's own organisation's, every client's for staff. */
export function ReportsRoute() {
  const reports = useReports();
  const isClient = useUser()?.role === 'client';
  return (
    <>
      <PageHeader title={isClient ? 'Your reports' : 'Signed reports'} />
      <QueryResult query={reports} loadingLabel="Loading reports…">
        {(items) => <ReportsList reports={items} showClient={!isClient} />}
      </QueryResult>
    </>
  );
}
