import type { TestLocation } from '@shared/schemas/projects';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { locationKeys } from '../../../lib/location-keys';

export function deleteLocation(id: number): Promise<void> {
  return api.delete(`/api/locations/${id}`);
}

export function useDeleteLocation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (location: Pick<TestLocation, 'id' | 'projectId'>) => deleteLocation(location.id),
    onSuccess: (_, location) => {
      queryClient.removeQueries({ queryKey: locationKeys.detail(location.id) });
      return queryClient.invalidateQueries({ queryKey: locationKeys.byProject(location.projectId) });
    },
  });
}
