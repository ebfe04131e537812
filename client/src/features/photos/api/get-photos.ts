import type { ListResponse } from '@shared/schemas/common';
import type { Photo } from '@shared/schemas/photos';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { photoKeys } from './photo-keys';

export async function getLocationPhotos(locationId: number, signal?: AbortSignal): Promise<Photo[]> {
  return (await api.get<ListResponse<Photo>>(`/api/locations/${locationId}/photos`, signal)).items;
}

/** The photos a run's report shows: the run's own and its location's. */
export async function getRunPhotos(runId: number, signal?: AbortSignal): Promise<Photo[]> {
  return (await api.get<ListResponse<Photo>>(`/api/runs/${runId}/photos`, signal)).items;
}

export const locationPhotosQueryOptions = (locationId: number) =>
  queryOptions({ queryKey: photoKeys.byLocation(locationId), queryFn: ({ signal }) => getLocationPhotos(locationId, signal) });

export const runPhotosQueryOptions = (runId: number) =>
  queryOptions({ queryKey: photoKeys.byRun(runId), queryFn: ({ signal }) => getRunPhotos(runId, signal) });

/** Every photo of a test location: its own and its runs'. */
export function useLocationPhotos(locationId: number) {
  return useQuery(locationPhotosQueryOptions(locationId));
}

export function useRunPhotos(runId: number) {
  return useQuery(runPhotosQueryOptions(runId));
}
