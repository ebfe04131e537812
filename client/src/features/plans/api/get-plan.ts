import type { PlanCheck, TestPlan } from '@shared/schemas/plans';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { planKeys } from './plan-keys';

/** A plan as the server returns it: the plan and the server's run of the same self-check. */
export interface CheckedPlan {
  plan: TestPlan;
  checks: PlanCheck[];
}

export function getPlan(id: number, signal?: AbortSignal): Promise<CheckedPlan> {
  return api.get<CheckedPlan>(`/api/plans/${id}`, signal);
}

export const planQueryOptions = (id: number) => queryOptions({ queryKey: planKeys.detail(id), queryFn: ({ signal }) => getPlan(id, signal) });

export function usePlan(id: number) {
  return useQuery(planQueryOptions(id));
}
