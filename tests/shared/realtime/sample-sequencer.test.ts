import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { SampleBatch, SeqSpan } from '@shared/realtime/events';
import { createSampleSequencer } from '@shared/realtime/sample-sequencer';

const RUN = 7;

/** A batch of the given seqs; each row's value encodes its seq so a test can tell rows apart. */
function batch(seqs: number[], span?: SeqSpan): SampleBatch {
  return { runId: RUN, seq: seqs, t: seqs.map((s) => s * 100), channel: seqs.map((s) => s % 6), value: seqs.map((s) => s * 10), ...(span ? { span } : {}) };
}

/** What the server would answer for a range: every existing seq inside it, with the span. */
const answer = (existing: number[], span: SeqSpan) => batch(existing.filter((s) => s > span.after && s <= span.through), span);

/** Collects what a sequencer hands on and checks each row kept its own columns. */
function collector() {
  const out: number[] = [];
  return {
    out,
    take(b: SampleBatch | null) {
      if (!b) return;
      b.seq.forEach((s, i) => {
        expect([b.t[i], b.channel[i], b.value[i]]).toEqual([s * 100, s % 6, s * 10]);
        out.push(s);
      });
    },
  };
}

const range = (from: number, to: number) => Array.from({ length: Math.max(0, to - from + 1) }, (_, i) => from + i);

describe('sample sequencer', () => {
  it('buffers live batches that overtake the backfill and hands everything on once, in order', () => {
    const seq = createSampleSequencer(RUN);
    const c = collector();
    expect(seq.beginBackfill()).toBeUndefined(); // a first join: the server picks the start
    c.take(seq.accept(batch([201, 202, 203]), 0)); // live, before the start is known
    c.take(seq.accept(batch(range(101, 150), { after: 100, through: 150 }), 1));
    c.take(seq.accept(batch([204, 205]), 2)); // live again, mid-backfill
    c.take(seq.accept(batch(range(151, 203), { after: 150, through: 203 }), 3)); // overlaps the live rows
    seq.endBackfill(4);
    expect(c.out).toEqual(range(101, 205));
    expect(seq.head).toBe(205);
    expect(seq.waiting).toBe(0);
    expect(seq.gap(10_000)).toBeNull();
  });

  it('drops rows from before the start the first join chose', () => {
    const seq = createSampleSequencer(RUN);
    const c = collector();
    seq.beginBackfill();
    c.take(seq.accept(batch([40, 41]), 0));
    c.take(seq.accept(batch([]), 0));
    c.take(seq.accept(batch([42, 43], { after: 41, through: 43 }), 0));
    expect(c.out).toEqual([42, 43]);
  });

  it('steps over seqs a complete span says never existed, even with nothing in it', () => {
    const seq = createSampleSequencer(RUN);
    const c = collector();
    seq.beginBackfill();
    c.take(seq.accept(batch([1, 2, 3], { after: 0, through: 3 }), 0));
    c.take(seq.accept(batch([9, 10]), 0)); // live: 4–8 were lost in a crash
    c.take(seq.accept(batch([], { after: 3, through: 8 }), 0));
    expect(c.out).toEqual([1, 2, 3, 9, 10]);
    expect(seq.head).toBe(10);
  });

  it('asks for a hole once it has stood gapWaitMs, not during a backfill, and again only after retryMs', () => {
    const seq = createSampleSequencer(RUN, { gapWaitMs: 1000, retryMs: 5000 });
    const c = collector();
    seq.beginBackfill();
    c.take(seq.accept(batch(range(1, 10), { after: 0, through: 10 }), 0));
    c.take(seq.accept(batch([15, 16]), 100)); // 11–14 lost
    expect(seq.gap(5000)).toBeNull(); // the join is still being answered
    seq.endBackfill(200);
    // Once the join is answered a hole is real: asked for at once.
    expect(seq.gap(200)).toEqual({ after: 10, through: 14 });
    expect(seq.gap(1500)).toBeNull(); // asked; waiting for the answer
    expect(seq.gap(5200)).toEqual({ after: 10, through: 14 }); // unanswered: asked again
    c.take(seq.accept(answer(range(1, 20), { after: 10, through: 14 }), 5300));
    expect(c.out).toEqual(range(1, 16));
    expect(seq.gap(99_999)).toBeNull();

    // A hole opened while live waits gapWaitMs for a late batch before asking.
    c.take(seq.accept(batch([18]), 6000));
    expect(seq.gap(6999)).toBeNull();
    expect(seq.gap(7000)).toEqual({ after: 16, through: 17 });
    c.take(seq.accept(batch([17]), 7001));
    expect(c.out).toEqual(range(1, 18));
  });

  it('restarts the wait when the head moves but a later hole still stands', () => {
    const seq = createSampleSequencer(RUN, { gapWaitMs: 1000 });
    const c = collector();
    seq.beginBackfill();
    c.take(seq.accept(batch([1], { after: 0, through: 1 }), 0));
    seq.endBackfill(0);
    c.take(seq.accept(batch([3, 5]), 0));
    c.take(seq.accept(batch([2]), 900)); // head → 3; 4 still missing
    expect(seq.gap(1500)).toBeNull();
    expect(seq.gap(1900)).toEqual({ after: 3, through: 4 });
  });

  it('continues after its head when joining again', () => {
    const seq = createSampleSequencer(RUN);
    seq.beginBackfill();
    seq.accept(batch(range(1, 5), { after: 0, through: 5 }), 0);
    seq.endBackfill(0);
    seq.accept(batch([7]), 0);
    expect(seq.beginBackfill()).toBe(5);
  });

  it('hands every existing seq on exactly once and in order, whatever the interleaving, loss and repetition (property)', () => {
    const scenario = fc.record({
      n: fc.integer({ min: 1, max: 400 }),
      neverExisted: fc.uniqueArray(fc.integer({ min: 1, max: 400 }), { maxLength: 20 }),
      liveCuts: fc.uniqueArray(fc.integer({ min: 1, max: 399 }), { maxLength: 40 }),
      backfillCuts: fc.uniqueArray(fc.integer({ min: 1, max: 399 }), { maxLength: 10 }),
      joinAt: fc.nat(),
      startAt: fc.nat(),
      fate: fc.array(fc.constantFrom('ok', 'ok', 'ok', 'lost', 'twice'), { minLength: 50, maxLength: 50 }),
      order: fc.array(fc.boolean(), { minLength: 100, maxLength: 100 }),
      seed: fc.nat(),
    });
    fc.assert(
      fc.property(scenario, (s) => {
        const existing = range(1, s.n).filter((x) => !s.neverExisted.includes(x));
        const cut = (rows: number[], at: number[]) => {
          const parts: number[][] = [];
          let part: number[] = [];
          for (const x of rows) {
            part.push(x);
            if (at.includes(x)) {
              parts.push(part);
              part = [];
            }
          }
          if (part.length) parts.push(part);
          return parts;
        };
        // The stream as the engine pushes it; the viewer joins the room before live batch `join`.
        const live = cut(existing, s.liveCuts);
        const join = s.joinAt % (live.length + 1);
        const headAtJoin = join === 0 ? 0 : live[join - 1].at(-1)!;
        // A first join starts somewhere at or before what was there at the join (the stage start).
        const start = s.startAt % (headAtJoin + 1);
        const spans: SampleBatch[] = [];
        let after = start;
        for (const part of cut(
          existing.filter((x) => x > start && x <= headAtJoin),
          s.backfillCuts,
        )) {
          spans.push(answer(existing, { after, through: part.at(-1)! }));
          after = part.at(-1)!;
        }
        spans.push(answer(existing, { after, through: headAtJoin })); // the join always ends with a span
        const livePart = live.slice(join).flatMap((b, i) => {
          const fate = i === live.length - join - 1 ? 'ok' : s.fate[i % s.fate.length]; // the newest batch reveals any hole
          return fate === 'lost' ? [] : fate === 'twice' ? [batch(b), batch(b)] : [batch(b)];
        });

        const seq = createSampleSequencer(RUN, { gapWaitMs: 100 });
        const c = collector();
        let now = 0;
        seq.beginBackfill();
        let k = 0;
        while (spans.length || livePart.length) {
          const fromLive = livePart.length > 0 && (spans.length === 0 || s.order[k++ % s.order.length]);
          now += 25;
          c.take(seq.accept((fromLive ? livePart : spans).shift()!, now));
        }
        seq.endBackfill(now);
        for (let rounds = 0; rounds < 100; rounds++) {
          now += 100;
          const gap = seq.gap(now);
          if (!gap) break;
          now += 25;
          c.take(seq.accept(answer(existing, gap), now));
        }
        // Contiguity and order: exactly the existing seqs after the start, each once, rising.
        expect(c.out).toEqual(existing.filter((x) => x > start));
        expect(seq.waiting).toBe(0);
      }),
      { numRuns: 300 },
    );
  });
});
