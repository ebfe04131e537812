import type { ListResponse } from '@shared/schemas/common';
import type { Rig } from '@shared/schemas/instruments';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { runKeys } from '../../../lib/run-keys';

export async function getRigs(signal?: AbortSignal): Promise<Rig[]> {
  return (await api.get<ListResponse<Rig>>('/api/rigs', signal)).items;
}

export function useRigs() {
  return useQuery(queryOptions({ queryKey: runKeys.rigs(), queryFn: ({ signal }) => getRigs(signal) }));
}
