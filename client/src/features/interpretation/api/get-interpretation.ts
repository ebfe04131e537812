import type { RecordAnalysis } from '@shared/interpretation/analyze-record';
import type { TestRecord } from '@shared/records/schema';
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { definedSettings, type InterpretationSettings, settingsQuery } from '../utils/interpretation-settings';
import { interpretationKeys } from './interpretation-keys';

export function getRunRecord(runId: number, signal?: AbortSignal): Promise<TestRecord> {
  return api.get<TestRecord>(`/api/runs/${runId}/record`, signal);
}

export const runRecordQueryOptions = (runId: number) =>
  queryOptions({ queryKey: interpretationKeys.record(runId), queryFn: ({ signal }) => getRunRecord(runId, signal), staleTime: 60_000 });

export function useRunRecord(runId: number) {
  return useQuery(runRecordQueryOptions(runId));
}

export function getInterpretation(runId: number, settings: InterpretationSettings, signal?: AbortSignal): Promise<RecordAnalysis> {
  return api.get<RecordAnalysis>(`/api/runs/${runId}/interpretation${settingsQuery(settings)}`, signal);
}

export const interpretationQueryOptions = (runId: number, settings: InterpretationSettings = {}) => {
  const set = definedSettings(settings);
  return queryOptions({ queryKey: interpretationKeys.analysis(runId, set), queryFn: ({ signal }) => getInterpretation(runId, set, signal), staleTime: 60_000 });
};

/** The analysis under the given settings; keeps showing the last one while new settings load. */
export function useInterpretation(runId: number, settings: InterpretationSettings) {
  return useQuery({ ...interpretationQueryOptions(runId, settings), placeholderData: keepPreviousData });
}
