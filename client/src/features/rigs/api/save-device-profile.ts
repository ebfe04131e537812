import type { LabProfileInput, ListedDeviceProfile } from '@shared/devices/schema';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { rigKeys } from '../../../lib/rig-keys';

export function createDeviceProfile(input: LabProfileInput): Promise<ListedDeviceProfile> {
  return api.post<ListedDeviceProfile>('/api/device-profiles', input);
}

/** Replaces the whole profile; its id, which rigs refer to, stays. */
export function replaceDeviceProfile(id: string, { id: _id, ...input }: LabProfileInput): Promise<ListedDeviceProfile> {
  return api.put<ListedDeviceProfile>(`/api/device-profiles/${encodeURIComponent(id)}`, input);
}

/** Defines a lab profile, or replaces one when an id is given; the list is fetched again. */
export function useSaveDeviceProfile(id?: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: LabProfileInput) => (id === undefined ? createDeviceProfile(input) : replaceDeviceProfile(id, input)),
    onSuccess: (profile) => {
      queryClient.setQueryData(rigKeys.profile(profile.id), profile);
      return queryClient.invalidateQueries({ queryKey: rigKeys.profiles(), exact: true });
    },
  });
}
