import type { InterpretationSettings } from '../utils/interpretation-settings';

/** Query keys of run records and their interpretations. */
export const interpretationKeys = {
  all: ['interpretation'] as const,
  record: (runId: number) => [...interpretationKeys.all, 'record', runId] as const,
  analysis: (runId: number, settings: InterpretationSettings) => [...interpretationKeys.all, 'analysis', runId, settings] as const,
  versions: (runId: number) => [...interpretationKeys.all, 'versions', runId] as const,
};
