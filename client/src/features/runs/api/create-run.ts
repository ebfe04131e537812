import type { RunCreateInput, RunView } from '@shared/schemas/runs';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { runKeys } from '../../../lib/run-keys';

export function createRun(input: RunCreateInput): Promise<RunView> {
  return api.post<RunView>('/api/runs', input);
}

/** Sets up a run of a plan on a rig; the answer is the run's first view. */
export function useCreateRun() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createRun,
    onSuccess: (view) => {
      queryClient.setQueryData(runKeys.detail(view.id), view);
      return queryClient.invalidateQueries({ queryKey: runKeys.list() });
    },
  });
}
