import type { ProfilePreview, ProfilePreviewInput } from '@shared/devices/schema';
import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

/** Reads a port with a profile for a moment on the server; nothing is stored. */
export function usePreviewProfile() {
  return useMutation({ mutationFn: (input: ProfilePreviewInput) => api.post<ProfilePreview>('/api/device-profiles/preview', input) });
}
