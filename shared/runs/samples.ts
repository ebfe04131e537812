/**
 * One archived sample row. Values are integers in micro-units (µm for gauges, Pa for pressure,
 * N for force) so every row has the same column types: exact, compact, and one bulk per batch.
 */
export interface SampleRow {
  /** Run-wide sequence number: rises by one per sample across all channels, never reused. */
  seq: number;
  /** Run clock time, ms since the epoch. */
  tMs: number;
  /** Index of the rig channel. */
  channel: number;
  /** The device's own reading (×1000 of its unit), before calibration; null when none was trusted. */
  raw: number | null;
  /** Calibrated instrument value in micro-units; null when none was trusted. */
  value: number | null;
  status: SampleStatusCode;
}

export const SAMPLE_STATUS = { ok: 0, timeout: 1, rejected: 2, disconnected: 3, gap: 4 } as const;
export type SampleStatusCode = (typeof SAMPLE_STATUS)[keyof typeof SAMPLE_STATUS];

export const toMicro = (x: number) => Math.round(x * 1000);
export const fromMicro = (x: number) => x / 1000;

/** Per channel and time bucket: the smallest and largest value (micro-units), so a plot keeps every extreme. */
export interface SampleSummary {
  runId: number;
  fromMs: number;
  toMs: number;
  bucketMs: number;
  channels: { channel: number; t: number[]; min: number[]; max: number[] }[];
}
