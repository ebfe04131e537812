import type { SampleSummary } from '@shared/runs/samples';
import type { ListResponse } from '@shared/schemas/common';
import type { RunView } from '@shared/schemas/runs';
import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api, isApiError } from '../../../lib/api-client';
import { runKeys } from '../../../lib/run-keys';

/** One entry of a run's log (run clock ms). */
export interface ReplayEvent {
  id: number;
  atMs: number;
  kind: string;
  userId: number | null;
  payload: Record<string, unknown> | null;
}

export type { SampleSummary };

/** Per channel, the last archived reading at or before a time, with its correction when it has one. */
export interface ReadingAt {
  seq: number;
  tMs: number;
  channel: number;
  /** As recorded, micro-units. */
  value: number | null;
  status: number;
  /** Present when corrected: the value now in force (null when marked faulty). */
  correctedValue?: number | null;
  faulty?: boolean;
}

/** One audited correction of an archived reading; the original sample is kept unchanged. */
export interface Correction {
  id: number;
  seq: number;
  channel: number;
  tMs: number;
  action: 'mark-faulty' | 'correct-value';
  originalValue: number | null;
  newValue: number | null;
  reason: string;
  userName: string;
  /** UTC ISO time of the correction. */
  at: string;
}

export interface CorrectionInput {
  seq: number;
  action: Correction['action'];
  /** The reading it should have been, mm (only to correct a value). */
  valueMm?: number;
  reason: string;
}

const replayKeys = {
  view: (runId: number) => [...runKeys.detail(runId), 'replay'] as const,
  events: (runId: number) => [...runKeys.detail(runId), 'replay', 'events'] as const,
  summary: (runId: number, span: Span | null, buckets: number) => [...runKeys.detail(runId), 'replay', 'summary', span?.fromMs ?? null, span?.toMs ?? null, buckets] as const,
  readings: (runId: number, tMs: number) => [...runKeys.detail(runId), 'replay', 'readings', tMs] as const,
  corrections: (runId: number) => [...runKeys.detail(runId), 'replay', 'corrections'] as const,
};

export interface Span {
  fromMs: number;
  toMs: number;
}

/** The run as the console shows it, or null when the server holds no live view of it (an imported run). */
export const replayViewQueryOptions = (runId: number) =>
  queryOptions({
    queryKey: replayKeys.view(runId),
    queryFn: async ({ signal }) => {
      try {
        return await api.get<RunView>(`/api/runs/${runId}`, signal);
      } catch (error) {
        // An imported run has no rig and no engine: the samples route still knows the run.
        if (isApiError(error) && error.status === 404) {
          await api.get<SampleSummary>(`/api/runs/${runId}/samples/summary?buckets=1`, signal);
          return null;
        }
        throw error;
      }
    },
  });

/** Refetch period while a run is still going, ms. */
const LIVE_REFRESH_MS = 5000;

export const useReplayView = (runId: number, live: boolean) => useQuery({ ...replayViewQueryOptions(runId), refetchInterval: live ? LIVE_REFRESH_MS : false });

export function useReplayEvents(runId: number, live: boolean) {
  return useQuery({
    queryKey: replayKeys.events(runId),
    queryFn: async ({ signal }) => (await api.get<ListResponse<ReplayEvent>>(`/api/runs/${runId}/events`, signal)).items,
    refetchInterval: live ? LIVE_REFRESH_MS : false,
  });
}

/** The reduced samples of a span (the whole run when `span` is null), `buckets` per channel at most. */
export function useSampleSummary(runId: number, span: Span | null, buckets: number, live: boolean) {
  const range = span ? `&fromMs=${Math.floor(span.fromMs)}&toMs=${Math.ceil(span.toMs)}` : '';
  return useQuery({
    queryKey: replayKeys.summary(runId, span, buckets),
    queryFn: ({ signal }) => api.get<SampleSummary>(`/api/runs/${runId}/samples/summary?buckets=${buckets}${range}`, signal),
    placeholderData: keepPreviousData,
    refetchInterval: live && !span ? LIVE_REFRESH_MS : false,
  });
}

export function useReadingsAt(runId: number, tMs: number | null) {
  return useQuery({
    queryKey: replayKeys.readings(runId, tMs ?? 0),
    queryFn: async ({ signal }) => (await api.get<ListResponse<ReadingAt>>(`/api/runs/${runId}/readings-at?tMs=${tMs}`, signal)).items,
    enabled: tMs !== null,
    placeholderData: keepPreviousData,
  });
}

export function useCorrections(runId: number) {
  return useQuery({
    queryKey: replayKeys.corrections(runId),
    queryFn: async ({ signal }) => (await api.get<ListResponse<Correction>>(`/api/runs/${runId}/corrections`, signal)).items,
  });
}

/** Records a correction; the list and the readings shown are fetched again. */
export function useCreateCorrection(runId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CorrectionInput) => api.post<Correction>(`/api/runs/${runId}/corrections`, input),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: replayKeys.corrections(runId) }),
        queryClient.invalidateQueries({ queryKey: [...replayKeys.view(runId), 'readings'] }),
      ]),
  });
}
