import { QueryTypes, type Sequelize } from 'sequelize';
import type { SampleBatch } from '../../shared/realtime/events';
import type { SampleRow, SampleSummary } from '../../shared/runs/samples';

export function toBatch(runId: number, rows: readonly Pick<SampleRow, 'seq' | 'tMs' | 'channel' | 'value'>[]): SampleBatch {
  return { runId, seq: rows.map((r) => r.seq), t: rows.map((r) => r.tMs), channel: rows.map((r) => r.channel), value: rows.map((r) => r.value) };
}

/** Archived samples after a sequence number, oldest first (for backfill after a reconnect). */
export async function samplesAfter(sequelize: Sequelize, runId: number, afterSeq: number, limit: number): Promise<SampleRow[]> {
  const rows = (await sequelize.query('SELECT seq, t_ms AS tMs, channel, raw, value, status FROM samples WHERE run_id = ? AND seq > ? ORDER BY seq LIMIT ?', {
    replacements: [runId, afterSeq, limit],
    type: QueryTypes.SELECT,
  })) as SampleRow[];
  return rows.map((r) => ({ ...r, seq: Number(r.seq), tMs: Number(r.tMs) }));
}

/**
 * Server-side min/max-per-bucket reduction (the "M4" idea of Jugel et al., PVLDB 2014, reduced to
 * min and max): a plot of any span gets at most `buckets` points per series from one grouped query
 * on the (run_id, t_ms) index, however many samples lie behind them.
 */
export async function summarizeSamples(sequelize: Sequelize, runId: number, fromMs: number, toMs: number, buckets: number): Promise<SampleSummary> {
  const bucketMs = Math.max(1, Math.ceil((toMs - fromMs) / buckets));
  const rows = (await sequelize.query(
    `SELECT channel, FLOOR((t_ms - ?) / ?) AS b, MIN(value) AS lo, MAX(value) AS hi
       FROM samples WHERE run_id = ? AND t_ms >= ? AND t_ms < ? AND value IS NOT NULL
      GROUP BY channel, b ORDER BY channel, b`,
    { replacements: [fromMs, bucketMs, runId, fromMs, toMs], type: QueryTypes.SELECT },
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

/** First and last sample times of a run, ms (null when it has none). */
export async function sampleSpan(sequelize: Sequelize, runId: number): Promise<{ fromMs: number; toMs: number } | null> {
  const [r] = (await sequelize.query('SELECT MIN(t_ms) AS lo, MAX(t_ms) AS hi FROM samples WHERE run_id = ?', { replacements: [runId], type: QueryTypes.SELECT })) as { lo: number | null; hi: number | null }[];
  return r.lo === null || r.hi === null ? null : { fromMs: Number(r.lo), toMs: Number(r.hi) + 1 };
}
