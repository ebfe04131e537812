import type { RunView } from '@shared/schemas/runs';
import { queryOptions } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { runKeys } from '../../../lib/run-keys';

export function getRun(id: number, signal?: AbortSignal): Promise<RunView> {
  return api.get<RunView>(`/api/runs/${id}`, signal);
}

/** The first view of a run; after that the live store keeps it current, so it is never refetched on its own. */
export const runQueryOptions = (id: number) => queryOptions({ queryKey: runKeys.detail(id), queryFn: ({ signal }) => getRun(id, signal), staleTime: Infinity });
