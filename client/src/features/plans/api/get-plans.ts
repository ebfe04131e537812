import type { ListResponse } from '@shared/schemas/common';
import type { TestPlan } from '@shared/schemas/plans';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { planKeys } from './plan-keys';

export async function getPlans(locationId: number, signal?: AbortSignal): Promise<TestPlan[]> {
  return (await api.get<ListResponse<TestPlan>>(`/api/locations/${locationId}/plans`, signal)).items;
}

export const plansQueryOptions = (locationId: number) =>
  queryOptions({ queryKey: planKeys.byLocation(locationId), queryFn: ({ signal }) => getPlans(locationId, signal) });

export function usePlans(locationId: number, options: { enabled?: boolean } = {}) {
  return useQuery({ ...plansQueryOptions(locationId), ...options });
}
