import type { ListResponse } from '@shared/schemas/common';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { runKeys } from '../../../lib/run-keys';

/** One entry of a run's log: commands, notes, alarms, phase changes. */
export interface RunEvent {
  id: number;
  runId: number;
  /** Wall-clock time, ms since the epoch. */
  atMs: number;
  kind: string;
  userId: number | null;
  payload: Record<string, unknown> | null;
}

export async function getRunEvents(runId: number, signal?: AbortSignal): Promise<RunEvent[]> {
  return (await api.get<ListResponse<RunEvent>>(`/api/runs/${runId}/events`, signal)).items;
}

/** The log, fetched again whenever the run's version moves (every command and phase change bumps it). */
export function useRunEvents(runId: number, version: number) {
  return useQuery(
    queryOptions({
      queryKey: [...runKeys.events(runId), version],
      queryFn: ({ signal }) => getRunEvents(runId, signal),
      placeholderData: (previous) => previous,
    }),
  );
}
