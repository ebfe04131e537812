/**
 * A run's sample stream for one socket, outside the live pushes: ranges read from the database and
 * the archiver's queue without a gap between the two, each sent as a batch whose `span` says the
 * range is complete, and the start and summary of a first join.
 */
import type { SampleRow, SampleSummary } from '../../shared/runs/samples';
import type { RunManager } from '../runs/run-manager';
import { firstSeqFrom, sampleSpan, samplesAfter, summarizeSamples, toBatch } from '../runs/samples-query';
import type { AppSocket } from './socket-server';

/** Rows per backfill batch read from the database. */
const CHUNK = 20_000;
const MINUTE_MS = 60_000;

/** Rows in seq order without repeats (a journal replayed after a crash may hold a row twice). */
function once(rows: SampleRow[]): SampleRow[] {
  const out: SampleRow[] = [];
  for (const r of rows) if (out.length === 0 || r.seq > out[out.length - 1].seq) out.push(r);
  return out;
}

/**
 * Sends every sample of the run with after < seq ≤ through (to the newest secured one when `through`
 * is infinite), always ending with one batch whose span reaches the end, so the consumer learns
 * where the range stopped even when it was empty.
 */
export async function sendRange(socket: AppSocket, runs: RunManager, runId: number, after: number, through: number): Promise<void> {
  let from = after;
  let sent = false;
  const emitSpan = (rows: SampleRow[], end: number) => {
    // An empty span says something only when it is all the consumer gets (where a first join starts).
    if (end === from && sent) return;
    socket.emit('run:samples', { ...toBatch(runId, rows), span: { after: from, through: end } });
    sent = true;
  };
  while (from < through) {
    // Read in one synchronous step: at or below `archived` lies in the database, above it in `queued`.
    const tail = runs.streamTail(runId, from);
    if (from >= tail.archived) {
      const rows = once(tail.queued.filter((r) => r.seq <= through));
      emitSpan(rows, Math.min(through, Math.max(from, rows.at(-1)?.seq ?? from)));
      return;
    }
    const bound = Math.min(tail.archived, through);
    const rows = await samplesAfter(runs.archiver.sequelize, runId, from, CHUNK, Number.isFinite(bound) ? bound : undefined);
    const full = rows.length === CHUNK;
    // Nothing queued and no journal: the database holds the whole run and nothing more will come.
    const end = full ? rows[rows.length - 1].seq : Number.isFinite(bound) ? bound : (rows.at(-1)?.seq ?? from);
    emitSpan(rows, end);
    if (!full && !Number.isFinite(bound)) return;
    from = end;
  }
}

/**
 * The seq a first join starts after: just before the current stage's first sample, or the newest
 * secured one when the stage has none yet (0, the whole run, before any stage).
 */
export async function stageStartSeq(runs: RunManager, runId: number, stageStartedAtMs: number | null, lastSeq: number): Promise<number> {
  if (stageStartedAtMs === null) return 0;
  // The queue is read before the database: a row that moves between them is still found in the database.
  const { archived, queued } = runs.streamTail(runId, 0);
  const inQueue = queued.find((r) => r.tMs >= stageStartedAtMs)?.seq ?? null;
  const secured = Math.max(queued.at(-1)?.seq ?? 0, Number.isFinite(archived) ? archived : lastSeq);
  const inDb = await firstSeqFrom(runs.archiver.sequelize, runId, stageStartedAtMs);
  const first = inDb !== null && inQueue !== null ? Math.min(inDb, inQueue) : (inDb ?? inQueue);
  return first === null ? secured : first - 1;
}

/** Per-minute min/max of every archived sample before the current stage (null when there is none). */
export async function summaryBefore(runs: RunManager, runId: number, stageStartedAtMs: number | null): Promise<SampleSummary | null> {
  if (stageStartedAtMs === null) return null;
  const span = await sampleSpan(runs.archiver.sequelize, runId);
  if (!span || span.fromMs >= stageStartedAtMs) return null;
  // Whole minutes ending at the stage start, so each bucket is exactly one minute.
  const minutes = Math.ceil((stageStartedAtMs - span.fromMs) / MINUTE_MS);
  return summarizeSamples(runs.archiver.sequelize, runId, stageStartedAtMs - minutes * MINUTE_MS, stageStartedAtMs, minutes);
}
