import type { Photo, photoUploadFields } from '@shared/schemas/photos';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { api } from '../../../lib/api-client';
import { photoKeys } from './photo-keys';

/** The fields as checked on this side with the shared schema (caption trimmed, run id a number). */
export type UploadFields = z.output<typeof photoUploadFields>;

/** The multipart body of one upload: the image and the text fields the server parses with `photoUploadFields`. */
export function photoFormData(file: File, fields: UploadFields): FormData {
  const body = new FormData();
  body.append('file', file);
  body.append('kind', fields.kind);
  if (fields.caption) body.append('caption', fields.caption);
  if (fields.runId !== undefined) body.append('runId', String(fields.runId));
  return body;
}

export function uploadPhoto(locationId: number, file: File, fields: UploadFields): Promise<Photo> {
  return api.post<Photo>(`/api/locations/${locationId}/photos`, photoFormData(file, fields));
}

/** One file per request; the caller sends a batch one after the other. */
export function useUploadPhoto(locationId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ file, fields }: { file: File; fields: UploadFields }) => uploadPhoto(locationId, file, fields),
    // A location's photo shows in its own list and in every run report of that location.
    onSuccess: () => queryClient.invalidateQueries({ queryKey: photoKeys.all }),
  });
}
