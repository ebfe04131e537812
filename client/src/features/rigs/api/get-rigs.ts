import type { ListedDeviceProfile } from '@shared/devices/schema';
import type { ListResponse } from '@shared/schemas/common';
import type { Rig } from '@shared/schemas/instruments';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { rigKeys } from '../../../lib/rig-keys';

export async function getRigs(signal?: AbortSignal): Promise<Rig[]> {
  return (await api.get<ListResponse<Rig>>('/api/rigs', signal)).items;
}

export function getRig(id: number, signal?: AbortSignal): Promise<Rig> {
  return api.get<Rig>(`/api/rigs/${id}`, signal);
}

export async function getDeviceProfiles(signal?: AbortSignal): Promise<ListedDeviceProfile[]> {
  return (await api.get<ListResponse<ListedDeviceProfile>>('/api/device-profiles', signal)).items;
}

export function getDeviceProfile(id: string, signal?: AbortSignal): Promise<ListedDeviceProfile> {
  return api.get<ListedDeviceProfile>(`/api/device-profiles/${encodeURIComponent(id)}`, signal);
}

export const rigsQueryOptions = () => queryOptions({ queryKey: rigKeys.list(), queryFn: ({ signal }) => getRigs(signal) });
export const rigQueryOptions = (id: number) => queryOptions({ queryKey: rigKeys.detail(id), queryFn: ({ signal }) => getRig(id, signal) });
/** The built-in profiles and the lab's own (saving one refreshes the list). */
export const deviceProfilesQueryOptions = () => queryOptions({ queryKey: rigKeys.profiles(), queryFn: ({ signal }) => getDeviceProfiles(signal) });
export const deviceProfileQueryOptions = (id: string) => queryOptions({ queryKey: rigKeys.profile(id), queryFn: ({ signal }) => getDeviceProfile(id, signal) });

export function useRigs() {
  return useQuery(rigsQueryOptions());
}

export function useRig(id: number) {
  return useQuery(rigQueryOptions(id));
}

export function useDeviceProfiles() {
  return useQuery(deviceProfilesQueryOptions());
}

export function useDeviceProfile(id: string) {
  return useQuery(deviceProfileQueryOptions(id));
}
