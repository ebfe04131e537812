/** Downloads of a run's data, served by the API as attachments. */
export const runDownloads = (runId: number) => ({
  recordJson: `/api/runs/${runId}/record`,
  readingsCsv: `/api/runs/${runId}/record.csv`,
  stagePointsCsv: `/api/runs/${runId}/stage-points.csv`,
});
