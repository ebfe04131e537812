/**
 * Puts one run's sample stream back in order for one consumer (a browser console today, an office
 * hub tomorrow). Live batches, backfill batches and answers to re-requests may overlap and arrive
 * interleaved; the sequencer hands on every sample exactly once, in sequence order, and names the
 * range to ask for again when a hole stays open. Pure: no timers, no sockets; time comes in as `nowMs`.
 *
 * Seqs rise by one per sample but a crash can leave numbers that never existed, so a hole is only
 * closed by a row or by a batch whose `span` says the range is complete (what the server's backfill
 * and resend answers carry).
 */
import { RESEND_MAX, type SampleBatch, type SeqSpan } from './events';

/** Options of {@link createSampleSequencer}. */
export interface SampleSequencerOptions {
  /** How long a hole may stay open before its range is asked for, ms. Default 1000 (live batches go out every 25 ms). */
  gapWaitMs?: number;
  /** How long an asked-for range may stay unanswered before it is asked for again, ms. Default 5000. */
  retryMs?: number;
}

interface Row {
  t: number;
  channel: number;
  value: number | null;
}

export function createSampleSequencer(runId: number, { gapWaitMs = 1000, retryMs = 5000 }: SampleSequencerOptions = {}) {
  /** Every seq ≤ head has been handed on or is known never to have existed; null until the stream's start is known. */
  let head: number | null = null;
  /** Rows beyond a hole, by seq. */
  const early = new Map<number, Row>();
  /** Complete ranges that start beyond the head (their rows wait in `early`). */
  let spans: SeqSpan[] = [];
  let backfilling = false;
  /** When the current hole was first seen (or the head last moved while one stood), ms. */
  let stalledSince: number | null = null;
  let asked: (SeqSpan & { atMs: number }) | null = null;

  const emptyBatch = (): SampleBatch => ({ runId, seq: [], t: [], channel: [], value: [] });
  const put = (out: SampleBatch, seq: number, row: Row) => {
    out.seq.push(seq);
    out.t.push(row.t);
    out.channel.push(row.channel);
    out.value.push(row.value);
  };

  /** Moves the head over waiting rows and over seqs a complete span says never existed. */
  function settle(out: SampleBatch): void {
    if (head === null) return;
    for (;;) {
      const next = early.get(head + 1);
      if (next) {
        early.delete(head + 1);
        head += 1;
        put(out, head, next);
        continue;
      }
      const span = spans.find((s) => s.after <= head! && head! < s.through);
      if (!span) break;
      if (early.size === 0) head = span.through;
      else head += 1; // head + 1 is inside a complete span yet absent: it never existed
    }
    spans = spans.filter((s) => s.through > head!);
  }

  const holeOpen = () => head !== null && (early.size > 0 || spans.length > 0);

  return {
    /** Every seq at or below this was handed on or never existed; null before the stream's start is known. */
    get head(): number | null {
      return head;
    },
    /** Rows waiting beyond a hole. */
    get waiting(): number {
      return early.size;
    },

    /**
     * A (re)join is about to be sent: returns the seq to continue after (undefined on the first join,
     * so the server picks the start). Holes are not asked for while the backfill is under way.
     */
    beginBackfill(): number | undefined {
      backfilling = true;
      asked = null;
      return head ?? undefined;
    },
    /** The join was answered: everything the backfill sends has arrived, so a hole still open is real. */
    endBackfill(nowMs: number): void {
      backfilling = false;
      stalledSince = holeOpen() ? nowMs - gapWaitMs : null;
    },

    /** Takes any batch of the run; returns the rows that are now in order (none twice), or null. */
    accept(batch: SampleBatch, nowMs: number): SampleBatch | null {
      const out = emptyBatch();
      const before = head;
      if (batch.span && head === null) {
        head = batch.span.after;
        for (const seq of early.keys()) if (seq <= head) early.delete(seq);
      }
      for (let i = 0; i < batch.seq.length; i++) {
        const seq = batch.seq[i];
        const row = { t: batch.t[i], channel: batch.channel[i], value: batch.value[i] };
        if (head !== null && seq <= head) continue; // already handed on
        if (head !== null && seq === head + 1 && early.size === 0) {
          head = seq;
          put(out, seq, row);
        } else if (!early.has(seq)) early.set(seq, row);
      }
      if (batch.span && head !== null && batch.span.through > head) spans.push(batch.span);
      settle(out);
      if (!holeOpen()) stalledSince = null;
      else if (stalledSince === null || head !== before) stalledSince = nowMs;
      return out.seq.length > 0 ? out : null;
    },

    /** The range to ask the server for now, or null: a hole that stayed open `gapWaitMs`, asked again after `retryMs`. */
    gap(nowMs: number): SeqSpan | null {
      if (backfilling || head === null || !holeOpen() || stalledSince === null) return null;
      if (nowMs - stalledSince < gapWaitMs) return null;
      if (asked && asked.after === head && nowMs - asked.atMs < retryMs) return null;
      let lowest = Number.POSITIVE_INFINITY;
      for (const seq of early.keys()) lowest = Math.min(lowest, seq);
      for (const s of spans) lowest = Math.min(lowest, s.after + 1);
      const through = Math.min(lowest - 1, head + RESEND_MAX);
      asked = { after: head, through, atMs: nowMs };
      return { after: head, through };
    },
  };
}

export type SampleSequencer = ReturnType<typeof createSampleSequencer>;
