import type { ListResponse } from '@shared/schemas/common';
import type { Rig } from '@shared/schemas/instruments';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { rigKeys } from '../../../lib/rig-keys';

export async function getRigs(signal?: AbortSignal): Promise<Rig[]> {
  return (await api.get<ListResponse<Rig>>('/api/rigs', signal)).items;
}

/** The rigs to run on, under the rigs' own list key so that saving a rig refreshes this picker too. */
export function useRigs() {
  return useQuery(queryOptions({ queryKey: rigKeys.list(), queryFn: ({ signal }) => getRigs(signal) }));
}
