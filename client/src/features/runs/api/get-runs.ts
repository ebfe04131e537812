import type { HoldVerdict } from '@shared/hold/verdict';
import type { ListResponse } from '@shared/schemas/common';
import type { RunPhase } from '@shared/schemas/runs';
import type { SignoffState } from '@shared/schemas/signoff';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { runKeys } from '../../../lib/run-keys';

/** A run as the list of runs shows it. `stageCount` and `verdict` are known only while the run is live on the server. */
export interface RunSummary {
  id: number;
  phase: RunPhase;
  planId: number;
  planName: string;
  pitId: string;
  projectCode: string;
  rigName: string;
  stageIndex: number;
  stageCount: number | null;
  verdict: HoldVerdict | null;
  /** Alarms nobody has acknowledged yet. */
  activeAlarms: number;
  startedAt: string | null;
  finishedAt: string | null;
  /** Where the run's report stands: saved interpretation or not, and its sign-off state. */
  review: { state: SignoffState; interpreted: boolean };
}

export async function getRuns(signal?: AbortSignal): Promise<RunSummary[]> {
  return (await api.get<ListResponse<RunSummary>>('/api/runs', signal)).items;
}

/** The board refreshes on its own while runs are in progress. */
export const RUNS_REFRESH_MS = 5_000;

export const runsQueryOptions = () =>
  queryOptions({ queryKey: runKeys.list(), queryFn: ({ signal }) => getRuns(signal), refetchInterval: RUNS_REFRESH_MS, staleTime: 0 });

export function useRuns() {
  return useQuery(runsQueryOptions());
}
