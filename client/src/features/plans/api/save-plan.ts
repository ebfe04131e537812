import type { PlanInput } from '@shared/schemas/plans';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { CheckedPlan } from './get-plan';
import { planKeys } from './plan-keys';

export function createPlan(locationId: number, input: PlanInput): Promise<CheckedPlan> {
  return api.post<CheckedPlan>(`/api/locations/${locationId}/plans`, input);
}

export function updatePlan(id: number, input: PlanInput): Promise<CheckedPlan> {
  return api.patch<CheckedPlan>(`/api/plans/${id}`, input);
}

/** Creates a plan at a location, or updates an existing one. */
export function useSavePlan(target: { locationId: number } | { planId: number }) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: PlanInput) => ('planId' in target ? updatePlan(target.planId, input) : createPlan(target.locationId, input)),
    onSuccess: (saved) => {
      queryClient.setQueryData(planKeys.detail(saved.plan.id), saved);
      return queryClient.invalidateQueries({ queryKey: planKeys.byLocation(saved.plan.locationId) });
    },
  });
}
