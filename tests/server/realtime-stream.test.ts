/**
 * Gap-free resume: viewers of a run fed at 6 channels × 10 Hz through the engine's own reading path
 * (journal → archive → room), followed with the console's own stream code over real sockets. Each
 * must get every seq exactly once and in order, however its link drops: the checks compare the whole
 * received sequence with the contiguous range, never a set.
 */
import { QueryTypes } from 'sequelize';
import { io } from 'socket.io-client';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { subscribeRunStream } from '../../client/src/lib/run-stream';
import type { RunningServer } from '../../server/main';
import type { SampleSummary } from '../../shared/runs/samples';
import type { RunView } from '../../shared/schemas/runs';
import { createLiveRuns } from '../bench/live-runs';
import { demoEmail } from '../support/api';
import { httpSignIn, startLiveServer, type TestSocket } from '../support/live-server';
import { command } from '../support/sim-run';

let server: RunningServer;
beforeAll(async () => {
  server = await startLiveServer();
});
afterAll(() => server?.close());

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const range = (from: number, to: number) => Array.from({ length: Math.max(0, to - from + 1) }, (_, i) => from + i);

/** A viewer with a reconnecting socket (as a browser's) following a run through `subscribeRunStream`. */
function viewer(cookie: string, runId: number) {
  const socket: TestSocket = io(server.url, { transports: ['websocket'], extraHeaders: { cookie }, forceNew: true, reconnectionDelay: 10, reconnectionDelayMax: 50 });
  const got: number[] = [];
  const summaries: SampleSummary[] = [];
  const resends: unknown[] = [];
  let connects = 0;
  socket.on('connect', () => connects++);
  const emit = socket.emit.bind(socket);
  // Counts the stream's own requests for missing ranges (none should be needed).
  socket.emit = ((event: string, ...args: unknown[]) => {
    if (event === 'run:resend') resends.push(args[0]);
    return (emit as (e: string, ...a: unknown[]) => TestSocket)(event, ...args);
  }) as typeof socket.emit;
  const stream = subscribeRunStream(socket, runId, { samples: (b) => got.push(...b.seq), summary: (s) => summaries.push(s) });
  return {
    socket,
    got,
    summaries,
    resends,
    stream,
    get connects() {
      return connects;
    },
    close() {
      stream.close();
      socket.close();
    },
  };
}

describe('a run stream without gaps (every consumer, every reconnection)', () => {
  it('gives a viewer joining mid-run, and one dropped at random points many times, every seq once and in order', async () => {
    const live = await createLiveRuns(server, 1);
    const [runId] = live.runIds;
    const stopFeed = live.feed(10); // 6 channels × 10 Hz
    await sleep(1500);
    await command(live.operator, runId, { type: 'zero' });
    const started = await command(live.operator, runId, { type: 'start' });
    const stageStartedAtMs = started.stageStartedAtMs!;
    await sleep(1500);

    const { cookie } = await httpSignIn(server.url, demoEmail('engineer'));
    const steady = viewer(cookie, runId);
    const dropped = viewer(cookie, runId);
    // Dropped at random moments, some within a few ms of (re)joining, i.e. during the backfill.
    let drops = 0;
    for (; drops < 25; drops++) {
      await vi.waitFor(() => expect(dropped.socket.connected).toBe(true), { timeout: 5000, interval: 2 });
      await sleep(drops % 3 === 0 ? Math.random() * 20 : 50 + Math.random() * 400);
      if (drops === 10) {
        // Once offline for longer, so the backfill is large and live batches overtake it.
        dropped.socket.disconnect();
        await sleep(3000);
        dropped.socket.connect();
      } else dropped.socket.io.engine.close();
    }
    stopFeed();
    await live.stop(); // everything journaled, archived and pushed
    const last = ((await live.operator.get(`/api/runs/${runId}`)).body as RunView).lastSeq;
    // The last drop's rejoin too (it may come after the feed stopped), so its backfill is checked with the rest.
    await vi.waitFor(() => expect(dropped.socket.connected).toBe(true), { timeout: 5000, interval: 2 });
    await vi.waitFor(() => expect([steady.stream.head, dropped.stream.head]).toEqual([last, last]), { timeout: 10_000, interval: 50 });

    // A first join starts at the current stage's first sample; everything before it comes summarised.
    const [first] = (await server.sequelize.query('SELECT seq FROM samples WHERE run_id = ? AND t_ms >= ? ORDER BY t_ms, seq LIMIT 1', {
      replacements: [runId, stageStartedAtMs],
      type: QueryTypes.SELECT,
    })) as { seq: number }[];
    const expected = range(Number(first.seq), last);
    expect(expected.length).toBeGreaterThan(6 * 10 * 8); // at least 8 s at 60 samples/s
    expect(steady.got).toEqual(expected);
    expect(dropped.got).toEqual(expected);
    expect(dropped.connects).toBeGreaterThan(25);
    // The server's backfill and live pushes left no hole by themselves: no range had to be asked for again.
    expect([steady.resends, dropped.resends]).toEqual([[], []]);

    for (const s of [...steady.summaries, ...dropped.summaries.slice(0, 1)]) {
      expect(s).toMatchObject({ runId, toMs: stageStartedAtMs, bucketMs: 60_000 });
      expect(s.channels.map((c) => c.channel)).toEqual([0, 1, 2, 3, 4, 5]);
      for (const c of s.channels) expect(c.min.every((m, i) => m <= c.max[i])).toBe(true);
    }
    expect(steady.summaries).toHaveLength(1);
    steady.close();
    dropped.close();
  }, 90_000);

  it('answers a request for a missing range with exactly that range, holes that never existed included', async () => {
    const live = await createLiveRuns(server, 1);
    const [runId] = live.runIds;
    const stopFeed = live.feed(10);
    await sleep(1000);
    stopFeed();
    await live.stop();
    const { cookie } = await httpSignIn(server.url, demoEmail('engineer'));
    const socket: TestSocket = io(server.url, { transports: ['websocket'], extraHeaders: { cookie }, forceNew: true });
    const batches: { seq: number[]; span?: { after: number; through: number } }[] = [];
    socket.on('run:samples', (b) => batches.push(b));
    try {
      // Not joined: the run is not this socket's to ask about.
      expect(await socket.timeout(5000).emitWithAck('run:resend', { runId, after: 10, through: 20 })).toEqual({ ok: false, error: expect.stringMatching(/not found/i) });
      expect(await socket.timeout(5000).emitWithAck('run:join', { runId, afterSeq: 0 })).toEqual({ ok: true });
      const last = batches.at(-1)!.span!.through;
      expect(batches.flatMap((b) => b.seq)).toEqual(range(1, last));
      batches.length = 0;
      expect(await socket.timeout(5000).emitWithAck('run:resend', { runId, after: 10, through: 20 })).toEqual({ ok: true });
      expect(batches).toEqual([expect.objectContaining({ seq: range(11, 20), span: { after: 10, through: 20 } })]);
      // Past the newest sample the span stops at what exists, so no future sample is taken for missing.
      batches.length = 0;
      expect(await socket.timeout(5000).emitWithAck('run:resend', { runId, after: last - 2, through: last + 50 })).toEqual({ ok: true });
      expect(batches).toEqual([expect.objectContaining({ seq: [last - 1, last], span: { after: last - 2, through: last } })]);
      expect(await socket.timeout(5000).emitWithAck('run:resend', { runId, after: 20, through: 10 })).toEqual({ ok: false, error: expect.stringMatching(/^invalid_input: through/) });
    } finally {
      socket.close();
    }
  }, 60_000);
});
