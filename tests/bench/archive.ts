/**
 * P2: samples/s through the real archive path (Archiver.enqueue + drain: the driver's batch() on a
 * connection from Sequelize's pool) against the raw connector's batch() of the same rows on a
 * direct connection. Each side writes under its own run id; rounds alternate and the best counts.
 */
import type { Connection } from 'mariadb';
import type { Sequelize } from 'sequelize';
import { Archiver } from '../../server/runs/archiver';
import type { SampleRow } from '../../shared/runs/samples';
import { timed } from './stats';

const INSERT = 'INSERT IGNORE INTO samples (run_id, seq, t_ms, channel, raw, value, status) VALUES (?, ?, ?, ?, ?, ?, ?)';
const CHUNK = 5000;

/** 6-channel samples at 1 Hz per channel, values in micro-units. */
export const RUN_START_MS = Date.UTC(2026, 0, 5);

/** 6-channel samples at 1 Hz per channel (5 gauges in µm, a pressure in mbar), seq from `firstSeq`. */
export function syntheticRows(count: number, firstSeq = 1): SampleRow[] {
  return Array.from({ length: count }, (_, i) => {
    const seq = firstSeq + i;
    const channel = (seq - 1) % 6;
    const value = channel === 5 ? 2_000_000 + (seq % 977) : 12_000 + Math.round(40 * Math.sqrt(seq)) + (seq % 7);
    return { seq, tMs: RUN_START_MS + Math.floor((seq - 1) / 6) * 1000, channel, raw: value, value, status: 0 };
  });
}

/** Writes rows of one run with the raw connector's batch(), `chunk` rows per call. */
export async function rawBatch(conn: Connection, runId: number, rows: readonly SampleRow[], chunk = CHUNK): Promise<void> {
  for (let i = 0; i < rows.length; i += chunk) {
    await conn.batch(
      INSERT,
      rows.slice(i, i + chunk).map((r) => [runId, r.seq, r.tMs, r.channel, r.raw, r.value, r.status]),
    );
  }
}

export interface ArchiveResult {
  rows: number;
  archiverRowsPerS: number;
  rawRowsPerS: number;
}

export async function benchArchive(sequelize: Sequelize, conn: Connection, rowCount: number, rounds = 3): Promise<ArchiveResult> {
  const rows = syntheticRows(rowCount);
  const raw = async (runId: number) => (await timed(() => rawBatch(conn, runId, rows))).ms;
  const archived = async (runId: number) => {
    const archiver = new Archiver(sequelize);
    const { ms } = await timed(async () => {
      archiver.enqueue(runId, rows);
      await archiver.drain();
    });
    archiver.stop();
    if (archiver.written !== rows.length) throw new Error(`archiver wrote ${archiver.written} of ${rows.length} rows`);
    return ms;
  };
  // A warm-up of each path, then rounds in alternating order so neither side always goes first.
  const best = { archiver: Infinity, raw: Infinity };
  for (let round = -1; round < rounds; round++) {
    const [rawRun, archRun] = [900_000 + 2 * (round + 1), 900_001 + 2 * (round + 1)];
    const order = round % 2 === 0 ? [raw, archived] : [archived, raw];
    const times = [];
    for (const side of order) times.push(await side(side === raw ? rawRun : archRun));
    const [rawMs, archMs] = order[0] === raw ? times : [times[1], times[0]];
    if (round >= 0) best.raw = Math.min(best.raw, rawMs);
    if (round >= 0) best.archiver = Math.min(best.archiver, archMs);
    await conn.query('DELETE FROM samples WHERE run_id IN (?, ?)', [rawRun, archRun]);
  }
  return { rows: rowCount, archiverRowsPerS: rowCount / (best.archiver / 1000), rawRowsPerS: rowCount / (best.raw / 1000) };
}
