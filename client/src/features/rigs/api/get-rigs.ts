import type { DeviceProfile } from '@shared/devices/schema';
import type { ListResponse } from '@shared/schemas/common';
import type { Rig } from '@shared/schemas/instruments';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { rigKeys } from './rig-keys';

export async function getRigs(signal?: AbortSignal): Promise<Rig[]> {
  return (await api.get<ListResponse<Rig>>('/api/rigs', signal)).items;
}

export function getRig(id: number, signal?: AbortSignal): Promise<Rig> {
  return api.get<Rig>(`/api/rigs/${id}`, signal);
}

export async function getDeviceProfiles(signal?: AbortSignal): Promise<DeviceProfile[]> {
  return (await api.get<ListResponse<DeviceProfile>>('/api/device-profiles', signal)).items;
}

export const rigsQueryOptions = () => queryOptions({ queryKey: rigKeys.list(), queryFn: ({ signal }) => getRigs(signal) });
export const rigQueryOptions = (id: number) => queryOptions({ queryKey: rigKeys.detail(id), queryFn: ({ signal }) => getRig(id, signal) });
/** Built into the server; they change only with a new release. */
export const deviceProfilesQueryOptions = () =>
  queryOptions({ queryKey: rigKeys.profiles(), queryFn: ({ signal }) => getDeviceProfiles(signal), staleTime: Number.POSITIVE_INFINITY });

export function useRigs() {
  return useQuery(rigsQueryOptions());
}

export function useRig(id: number) {
  return useQuery(rigQueryOptions(id));
}

export function useDeviceProfiles() {
  return useQuery(deviceProfilesQueryOptions());
}
