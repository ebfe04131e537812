import type { UltimateChoice } from '@shared/interpretation/ultimate-standing';
import type { ListResponse } from '@shared/schemas/common';
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { InterpretationSettings } from '../utils/interpretation-settings';
import { interpretationKeys } from './interpretation-keys';

/** A saved interpretation as listed: its settings, the engineer's choice and why, and the headline figures. */
export interface InterpretationVersion {
  id: number;
  runId: number;
  version: number;
  options: InterpretationSettings;
  chosenMethod: UltimateChoice | null;
  reason: string;
  createdBy: number | null;
  createdByName: string | null;
  createdAt: string;
  qUltKpa: number | null;
  allowableKpa: number | null;
}

export interface SaveInterpretationInput {
  options: InterpretationSettings;
  chosenMethod: UltimateChoice;
  reason: string;
}

export async function getInterpretationVersions(runId: number, signal?: AbortSignal): Promise<InterpretationVersion[]> {
  return (await api.get<ListResponse<InterpretationVersion>>(`/api/runs/${runId}/interpretations`, signal)).items;
}

export const interpretationVersionsQueryOptions = (runId: number) =>
  queryOptions({ queryKey: interpretationKeys.versions(runId), queryFn: ({ signal }) => getInterpretationVersions(runId, signal) });

export function useInterpretationVersions(runId: number) {
  return useQuery(interpretationVersionsQueryOptions(runId));
}

export function saveInterpretation(runId: number, input: SaveInterpretationInput): Promise<{ id: number; version: number }> {
  return api.post(`/api/runs/${runId}/interpretations`, input);
}

/** Saves the next version; the list of versions is fetched again afterwards. */
export function useSaveInterpretation(runId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: SaveInterpretationInput) => saveInterpretation(runId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: interpretationKeys.versions(runId) }),
  });
}
