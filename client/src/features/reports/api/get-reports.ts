import type { ReportListItem } from '@shared/schemas/signoff';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export type { ReportListItem };

export const reportKeys = { all: ['reports'] as const, list: () => [...reportKeys.all, 'list'] as const };

export const reportsQueryOptions = () =>
  queryOptions({ queryKey: reportKeys.list(), queryFn: async ({ signal }) => (await api.get<{ items: ReportListItem[] }>('/api/reports', signal)).items });

export const useReports = () => useQuery(reportsQueryOptions());

export const reportFiles = (runId: number) => ({
  pdf: `/api/runs/${runId}/report.pdf`,
  csv: `/api/reports/${runId}/readings.csv`,
  // What the signature's hash covers, for anyone to re-compute it (DEVELOPERS.md, "Checking a signature's hash").
  signedData: `/api/reports/${runId}/signed-data.json`,
});
