import type { TestLocation } from '@shared/schemas/projects';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { locationKeys } from '../../../lib/location-keys';

export function getLocation(id: number, signal?: AbortSignal): Promise<TestLocation> {
  return api.get<TestLocation>(`/api/locations/${id}`, signal);
}

export const locationQueryOptions = (id: number) => queryOptions({ queryKey: locationKeys.detail(id), queryFn: ({ signal }) => getLocation(id, signal) });

export function useLocation(id: number, options: { enabled?: boolean } = {}) {
  return useQuery({ ...locationQueryOptions(id), ...options });
}

/** Address of the location's site-plan image; the version busts the browser cache after an upload. */
export function sitePlanUrl(location: Pick<TestLocation, 'id' | 'updatedAt'>): string {
  return `/api/locations/${location.id}/site-plan?v=${encodeURIComponent(location.updatedAt)}`;
}
