import type { TestLocation } from '@shared/schemas/projects';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { cacheSavedLocation } from './save-location';

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
