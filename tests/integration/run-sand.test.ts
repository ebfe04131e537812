/**
 * A whole bearing test through the real stack: the simulated rig speaks its protocols on socat
 * pseudo-terminals → serialport → device layer → calibrations → run engine (hold rules, prompts)
 * → journal → MariaDB, watched by a socket.io client.
 */
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { subscribeRunStream } from '../../client/src/lib/run-stream';
import type { RunningServer } from '../../server/main';
import type { SimulatorProcess } from '../../server/ops/simulated-rig';
import type { RunView } from '../../shared/schemas/runs';
import { Client, demoEmail } from '../support/api';
import { connectSocket, httpSignIn, startLiveServer } from '../support/live-server';
import { command, simPlan, simulatedRig, waitFor } from '../support/sim-run';

let server: RunningServer;
let sim: SimulatorProcess;
let rigId: number;
let operator: Client;

beforeAll(async () => {
  server = await startLiveServer();
  ({ sim, rig: { id: rigId } } = await simulatedRig('dense-sand', 200, undefined, server.url));
  operator = await new Client(server.url).signIn(demoEmail('operator'));
}, 120_000);
afterAll(async () => {
  await server?.close();
  await sim?.stop();
});

describe('a bearing test on dense sand, plan to finish through the API', () => {
  it('zeroes, seats, holds each increment until the rate rule is met, prompts the next target, and archives every sample once', async () => {
    const engineer = await new Client(server.url).signIn(demoEmail('engineer'));
    const planId = await simPlan(engineer, 'bearing-granular', {
      loading: { mode: 'list', pressuresKpa: [150, 300, 450] },
      holdRule: { kind: 'rate', maxRateMmPerMin: 0.02, windowMin: 5, minHoldMin: 10 },
    });

    const created = await operator.post('/api/runs', { planId, rigId });
    expect(created.status).toBe(201);
    const runId = (created.body as RunView).id;

    // A second person watches live over socket.io.
    const { cookie } = await httpSignIn(server.url, demoEmail('engineer'));
    const socket = await connectSocket(server.url, cookie);
    const seen: number[] = [];
    let lastView: RunView | null = null;
    const stream = subscribeRunStream(socket, runId, {
      samples: (b) => seen.push(...b.seq),
      view: (v) => {
        lastView = v;
      },
    });

    await waitFor(operator, runId, (v) => v.live.gauges.every((g) => g.readingMm !== null) && v.live.pressureKpa !== null, 'first readings');
    await command(operator, runId, { type: 'zero' });
    let view = await command(operator, runId, { type: 'start' });
    expect(view.phase).toBe('pumping');
    expect(view.prompt).toMatchObject({ targetKpa: 7, branch: 'seating' });

    const stages = view.stages;
    expect(stages.map((s) => s.targetKpa)).toEqual([7, 150, 300, 450]);
    for (let i = 0; i < stages.length; i++) {
      view = await waitFor(operator, runId, (v) => v.phase === 'hold-met' && v.stageIndex === i, `hold met at stage ${i}`, 90_000);
      expect(view.hold?.verdict).toBe('satisfied');
      expect(Math.abs(view.live.pressureKpa! - stages[i].targetKpa)).toBeLessThan(Math.max(0.05 * stages[i].targetKpa, 5));
      if (i < stages.length - 1) {
        // The prompt names the next target, the plate force and the jack gauge pressure to pump to (C10-style conversion).
        // In the unit of the jack's pressure transducer (bar), through the jack calibration in MPa (1 MPa = 10 bar).
        expect(view.prompt).toMatchObject({ stageIndex: i + 1, targetKpa: stages[i + 1].targetKpa, gaugeUnit: 'bar' });
        expect(view.prompt!.gaugePressure).toBeCloseTo(((view.prompt!.plateForceKn - 0.5) / 4.926) * 10, 6);
        if (stages[i].branch !== 'seating') {
          const evidence = view.hold!.evidence;
          expect(evidence.kind).toBe('rate');
          if (evidence.kind === 'rate') {
            expect(evidence.currentRateMmPerMin).toBeLessThan(0.02);
            expect(evidence.heldMin).toBeGreaterThanOrEqual(10);
          }
        }
        await command(operator, runId, { type: 'advance' });
      }
    }
    const settlements = view.live.meanSettlementMm!;
    expect(settlements).toBeGreaterThan(0.2);
    view = await command(operator, runId, { type: 'finish' });
    expect(view.phase).toBe('completed');
    // One end-of-hold point per stage: the load–settlement curve, rising with pressure.
    expect(view.stagePoints.map((p) => p.targetKpa)).toEqual([7, 150, 300, 450]);
    const curve = view.stagePoints.map((p) => p.settlementMm);
    expect(curve).toEqual([...curve].sort((a, b) => a - b));

    // Every sample journaled is in the database exactly once: the finishing command's view already counts
    // (and has queued) every sample, so draining the archive is enough.
    await server.runs.archiver.drain();
    const [row] = (await server.sequelize.query('SELECT COUNT(*) AS n, COUNT(DISTINCT seq) AS d, MAX(seq) AS hi FROM samples WHERE run_id = ?', { replacements: [runId], type: QueryTypes.SELECT })) as { n: number; d: number; hi: number }[];
    expect(row.n).toBe(row.d);
    expect(row.hi).toBe(row.n);
    expect(row.n).toBe(view.lastSeq);

    const events = (await operator.get(`/api/runs/${runId}/events`)).body.items.map((e: { kind: string }) => e.kind);
    expect(events.filter((k: string) => k === 'target-reached')).toHaveLength(stages.length);
    expect(events.filter((k: string) => k === 'hold-met')).toHaveLength(stages.length);
    expect(events).toEqual(expect.arrayContaining(['run-created', 'gauges-zeroed', 'run-started', 'run-completed']));

    // The watcher saw the run live, and every sample once and in order.
    expect(lastView).not.toBeNull();
    await vi.waitFor(() => expect(stream.head).toBe(view.lastSeq), { timeout: 10_000, interval: 50 });
    expect(seen.length).toBeGreaterThan(100);
    expect(seen).toEqual(Array.from({ length: view.lastSeq }, (_, i) => i + 1));
    stream.close();
    socket.close();
  }, 240_000);
});
