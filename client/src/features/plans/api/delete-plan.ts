import type { TestPlan } from '@shared/schemas/plans';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { planKeys } from './plan-keys';

export function deletePlan(id: number): Promise<void> {
  return api.delete(`/api/plans/${id}`);
}

export function useDeletePlan() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (plan: Pick<TestPlan, 'id' | 'locationId'>) => deletePlan(plan.id),
    onSuccess: (_, plan) => {
      queryClient.removeQueries({ queryKey: planKeys.detail(plan.id) });
      return queryClient.invalidateQueries({ queryKey: planKeys.byLocation(plan.locationId) });
    },
  });
}
