import type { ListResponse } from '@shared/schemas/common';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

/** A plan no run has used yet: a run to come. */
export interface ReadyPlan {
  id: number;
  name: string;
  pitId: string;
  projectCode: string;
  createdAt: string;
}

export const readyPlansQueryOptions = () =>
  queryOptions({
    queryKey: ['plans', 'ready'] as const,
    queryFn: async ({ signal }) => (await api.get<ListResponse<ReadyPlan>>('/api/plans/ready', signal)).items,
  });

export const useReadyPlans = () => useQuery(readyPlansQueryOptions());
