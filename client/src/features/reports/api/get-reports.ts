import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

/** One signed report (GET /api/reports). */
export interface ReportListItem {
  runId: number;
  projectId: number;
  projectCode: string;
  projectName: string;
  organizationName: string;
  pitId: string;
  planName: string;
  testDate: string | null;
  revision: number;
  signedAt: string | null;
}

export const reportKeys = { all: ['reports'] as const, list: () => [...reportKeys.all, 'list'] as const };

export const reportsQueryOptions = () =>
  queryOptions({ queryKey: reportKeys.list(), queryFn: async ({ signal }) => (await api.get<{ items: ReportListItem[] }>('/api/reports', signal)).items });

export const useReports = () => useQuery(reportsQueryOptions());

export const reportFiles = (runId: number) => ({ pdf: `/api/runs/${runId}/report.pdf`, csv: `/api/reports/${runId}/readings.csv` });
