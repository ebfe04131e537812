import type { LocationInput, TestLocation } from '@shared/schemas/projects';
import { type QueryClient, useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { locationKeys } from '../../../lib/location-keys';

export function createLocation(projectId: number, input: LocationInput): Promise<TestLocation> {
  return api.post<TestLocation>(`/api/projects/${projectId}/locations`, input);
}

export function updateLocation(id: number, input: Partial<LocationInput>): Promise<TestLocation> {
  return api.patch<TestLocation>(`/api/locations/${id}`, input);
}

/** Puts a saved location into the cache and refreshes its project's list. */
export function cacheSavedLocation(queryClient: QueryClient, location: TestLocation) {
  queryClient.setQueryData(locationKeys.detail(location.id), location);
  return queryClient.invalidateQueries({ queryKey: locationKeys.byProject(location.projectId) });
}

/** Creates a location in a project, or updates an existing one. */
export function useSaveLocation(target: { projectId: number } | { locationId: number }) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: LocationInput) => ('locationId' in target ? updateLocation(target.locationId, input) : createLocation(target.projectId, input)),
    onSuccess: (location) => cacheSavedLocation(queryClient, location),
  });
}
