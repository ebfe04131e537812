/** Address of the interpretation page of a run (same shape as config/paths: `pattern` for routes, `href` for links). */
export const interpretationPaths = {
  interpretation: { pattern: '/runs/:runId/interpretation', href: (runId: number) => `/runs/${runId}/interpretation` },
} as const;

/** Downloads of a run's data, served by the API as attachments. */
export const runDownloads = (runId: number) => ({
  recordJson: `/api/runs/${runId}/record`,
  readingsCsv: `/api/runs/${runId}/record.csv`,
  stagePointsCsv: `/api/runs/${runId}/stage-points.csv`,
});
