import type { Photo, PhotoPatch } from '@shared/schemas/photos';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { photoKeys } from './photo-keys';

export function patchPhoto(id: number, patch: PhotoPatch): Promise<Photo> {
  return api.patch<Photo>(`/api/photos/${id}`, patch);
}

export function deletePhoto(id: number): Promise<void> {
  return api.delete(`/api/photos/${id}`);
}

/** Changes a photo's caption or kind; the location's and the runs' lists are fetched again. */
export function usePatchPhoto(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (patch: PhotoPatch) => patchPhoto(id, patch),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: photoKeys.all }),
  });
}

export function useDeletePhoto(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => deletePhoto(id),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: photoKeys.all }),
  });
}
