import type { Rig, RigInput } from '@shared/schemas/instruments';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { rigKeys } from '../../../lib/rig-keys';

export function createRig(input: RigInput): Promise<Rig> {
  return api.post<Rig>('/api/rigs', input);
}

export function updateRig(id: number, input: RigInput): Promise<Rig> {
  return api.patch<Rig>(`/api/rigs/${id}`, input);
}

/** Defines a rig, or changes it when an id is given; the saved rig goes into the cache. */
export function useSaveRig(id?: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: RigInput) => (id === undefined ? createRig(input) : updateRig(id, input)),
    onSuccess: (rig) => {
      queryClient.setQueryData(rigKeys.detail(rig.id), rig);
      return queryClient.invalidateQueries({ queryKey: rigKeys.list() });
    },
  });
}
