import { QueryTypes, type Sequelize } from 'sequelize';
import type { SampleBatch } from '../../shared/realtime/events';
import type { SampleRow } from '../../shared/runs/samples';

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
