import type { ListResponse } from '@shared/schemas/common';
import type { TestLocation } from '@shared/schemas/projects';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { locationKeys } from '../../../lib/location-keys';

export async function getLocations(projectId: number, signal?: AbortSignal): Promise<TestLocation[]> {
  return (await api.get<ListResponse<TestLocation>>(`/api/projects/${projectId}/locations`, signal)).items;
}

export const locationsQueryOptions = (projectId: number) =>
  queryOptions({ queryKey: locationKeys.byProject(projectId), queryFn: ({ signal }) => getLocations(projectId, signal) });

export function useLocations(projectId: number) {
  return useQuery(locationsQueryOptions(projectId));
}
