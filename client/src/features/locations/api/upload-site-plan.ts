import type { TestLocation } from '@shared/schemas/projects';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { cacheSavedLocation } from './save-location';

/** What the server accepts for a site plan. */
export const SITE_PLAN_TYPES = ['image/png', 'image/jpeg'] as const;
export const SITE_PLAN_MAX_BYTES = 10 * 1024 * 1024;

/** Why a file cannot be a site plan, or null when it can; checked before uploading. */
export function sitePlanProblem(file: Pick<File, 'type' | 'size'>): string | null {
  if (!(SITE_PLAN_TYPES as readonly string[]).includes(file.type)) return 'Choose a PNG or JPEG image.';
  if (file.size > SITE_PLAN_MAX_BYTES) return 'The image is larger than 10 MB.';
  return null;
}

export function uploadSitePlan(locationId: number, file: File): Promise<TestLocation> {
  const body = new FormData();
  body.append('file', file);
  return api.post<TestLocation>(`/api/locations/${locationId}/site-plan`, body);
}

export function useUploadSitePlan(locationId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (file: File) => uploadSitePlan(locationId, file),
    onSuccess: (location) => cacheSavedLocation(queryClient, location),
  });
}
