import { QueryTypes, type Sequelize } from 'sequelize';
import type { SampleBatch } from '../../shared/realtime/events';
import type { SampleRow, SampleSummary } from '../../shared/runs/samples';

export function toBatch(runId: number, rows: readonly Pick<SampleRow, 'seq' | 'tMs' | 'channel' | 'value'>[]): SampleBatch {
  return { runId, seq: rows.map((r) => r.seq), t: rows.map((r) => r.tMs), channel: rows.map((r) => r.channel), value: rows.map((r) => r.value) };
}

/** Archived samples after a sequence number (up to `throughSeq` when given), oldest first (for backfill after a reconnect). */
export async function samplesAfter(sequelize: Sequelize, runId: number, afterSeq: number, limit: number, throughSeq = Number.MAX_SAFE_INTEGER): Promise<SampleRow[]> {
  const rows = (await sequelize.query('SELECT seq, t_ms AS tMs, channel, raw, value, status FROM samples WHERE run_id = ? AND seq > ? AND seq <= ? ORDER BY seq LIMIT ?', {
    replacements: [runId, afterSeq, throughSeq, limit],
    type: QueryTypes.SELECT,
  })) as SampleRow[];
  return rows.map((r) => ({ ...r, seq: Number(r.seq), tMs: Number(r.tMs) }));
}

/** Seq of the earliest archived sample at or after a run time, ms (null when none), through the (run_id, t_ms) index. */
export async function firstSeqFrom(sequelize: Sequelize, runId: number, fromMs: number): Promise<number | null> {
  const [r] = (await sequelize.query('SELECT seq FROM samples WHERE run_id = ? AND t_ms >= ? ORDER BY t_ms, seq LIMIT 1', { replacements: [runId, fromMs], type: QueryTypes.SELECT })) as { seq: number }[];
  return r ? Number(r.seq) : null;
}

/**
 * Server-side min/max-per-bucket reduction (the "M4" idea of Jugel et al., PVLDB 2014, reduced to
 * min and max): a plot of any span gets at most `buckets` points per series from one grouped query
 * on the (run_id, t_ms) index, however many samples lie behind them.
 */
export async function summarizeSamples(sequelize: Sequelize, runId: number, fromMs: number, toMs: number, buckets: number): Promise<SampleSummary> {
  const bucketMs = Math.max(1, Math.ceil((toMs - fromMs) / buckets));
  // Wide buckets read the closed run's per-minute rollups (when built); narrow ones the samples.
  const useRollups = bucketMs >= ROLLUP_USE_FROM_MS && (await hasRollups(sequelize, runId));
  const rows = (await sequelize.query(
    useRollups
      ? `SELECT channel, FLOOR((bucket * ${ROLLUP_MS} - ?) / ?) AS b, MIN(lo) AS lo, MAX(hi) AS hi
           FROM sample_rollups WHERE run_id = ? AND bucket_ms = ${ROLLUP_MS} AND bucket * ${ROLLUP_MS} >= ? AND bucket * ${ROLLUP_MS} < ?
          GROUP BY channel, b ORDER BY channel, b`
      : `SELECT channel, FLOOR((t_ms - ?) / ?) AS b, MIN(value) AS lo, MAX(value) AS hi
           FROM samples WHERE run_id = ? AND t_ms >= ? AND t_ms < ? AND value IS NOT NULL
          GROUP BY channel, b ORDER BY channel, b`,
    { replacements: [fromMs, bucketMs, runId, useRollups ? Math.floor(fromMs / ROLLUP_MS) * ROLLUP_MS : fromMs, toMs], type: QueryTypes.SELECT },
  )) as { channel: number; b: number; lo: number; hi: number }[];
  const byChannel = new Map<number, SampleSummary['channels'][number]>();
  for (const r of rows) {
    let c = byChannel.get(r.channel);
    if (!c) {
      c = { channel: r.channel, t: [], min: [], max: [] };
      byChannel.set(r.channel, c);
    }
    c.t.push(fromMs + (Number(r.b) + 0.5) * bucketMs);
    c.min.push(Number(r.lo));
    c.max.push(Number(r.hi));
  }
  return { runId, fromMs, toMs, bucketMs, channels: [...byChannel.values()] };
}

/** Resolution of the rollups, ms: one minute. */
export const ROLLUP_MS = 60_000;
/** Rollups serve buckets of ten minutes or wider, so a rollup minute straddling a bucket edge moves an extreme by at most a tenth of a bucket. */
const ROLLUP_USE_FROM_MS = 10 * ROLLUP_MS;

async function hasRollups(sequelize: Sequelize, runId: number): Promise<boolean> {
  const rows = (await sequelize.query('SELECT 1 AS x FROM sample_rollups WHERE run_id = ? AND bucket_ms = ? LIMIT 1', { replacements: [runId, ROLLUP_MS], type: QueryTypes.SELECT })) as unknown[];
  return rows.length > 0;
}

/**
 * Builds a closed run's per-minute min/max rollups from its samples (idempotent). Called when a run
 * closes, once its samples are archived; the samples themselves stay as they are.
 */
export async function buildRollups(sequelize: Sequelize, runId: number): Promise<void> {
  await sequelize.query(
    `INSERT INTO sample_rollups (run_id, bucket_ms, channel, bucket, lo, hi)
       SELECT run_id, ?, channel, FLOOR(t_ms / ?), MIN(value), MAX(value)
         FROM samples WHERE run_id = ? AND value IS NOT NULL
        GROUP BY run_id, channel, FLOOR(t_ms / ?)
     ON DUPLICATE KEY UPDATE lo = VALUES(lo), hi = VALUES(hi)`,
    { replacements: [ROLLUP_MS, ROLLUP_MS, runId, ROLLUP_MS], type: QueryTypes.INSERT },
  );
}

/** First and last sample times of a run, ms (null when it has none). */
export async function sampleSpan(sequelize: Sequelize, runId: number): Promise<{ fromMs: number; toMs: number } | null> {
  const [r] = (await sequelize.query('SELECT MIN(t_ms) AS lo, MAX(t_ms) AS hi FROM samples WHERE run_id = ?', { replacements: [runId], type: QueryTypes.SELECT })) as { lo: number | null; hi: number | null }[];
  return r.lo === null || r.hi === null ? null : { fromMs: Number(r.lo), toMs: Number(r.hi) + 1 };
}
