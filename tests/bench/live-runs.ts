/**
 * Live runs for P1 and P4: manual-mode 6-channel rigs (five gauges and a pressure transducer) whose
 * run engines are fed synthetic readings through the engine's own reading path, so every sample is
 * journaled, archived and pushed to the run's room exactly as one read from a port.
 */
import type { ChannelReading } from '../../server/acquisition/rig-connection';
import type { RunningServer } from '../../server/main';
import type { RunEngine } from '../../server/runs/run-engine';
import type { RunView } from '../../shared/schemas/runs';
import { Client, demoEmail } from '../support/api';
import { simPlan } from '../support/sim-run';

export const CHANNELS = 6;
let rigsMade = 0;

export interface LiveRuns {
  runIds: number[];
  /** The operator's API client (signed in) that created the runs. */
  operator: Client;
  /** Feeds every run's channels at `hz` readings/s (wall time) per channel; returns a stop function that tells how many readings each run got. */
  feed(hz: number): () => number;
  /** Stops the runs' engines (journal, archive and state flushed), leaving the server up. */
  stop(): Promise<void>;
}

const gauge = (i: number) => ({ key: `g${i}`, role: 'gauge', label: `Gauge ${i}`, profileId: 'manual', gauge: { xMm: 100 * Math.cos(i), yMm: 100 * Math.sin(i), direction: 1, travelMm: 50 } });

/**
 * Creates `count` rigs and a run on each (as the engineer and the operator would, over HTTP). With
 * `speed` > 1 the rigs declare a (silent) simulator of that time acceleration, so run time runs faster.
 */
export async function createLiveRuns(server: RunningServer, count: number, speed = 1): Promise<LiveRuns> {
  const engineer = await new Client(server.url).signIn(demoEmail('engineer'));
  const operator = await new Client(server.url).signIn(demoEmail('operator'));
  const instruments = (await engineer.get('/api/instruments')).body.items as { id: number; serialNumber: string }[];
  const idOf = (serial: string) => instruments.find((i) => i.serialNumber === serial)?.id ?? null;
  const planId = await simPlan(engineer, 'custom', { name: 'Bench plan', loading: { mode: 'list', pressuresKpa: [100] }, holdRule: { kind: 'fixed', durationMin: 600 } });
  const runIds: number[] = [];
  for (let n = 0; n < count; n++) {
    const rig = await engineer.post('/api/rigs', {
      name: `Bench rig ${++rigsMade}`,
      mode: 'manual',
      channels: [...[1, 2, 3, 4, 5].map(gauge), { key: 'p1', role: 'pressure', label: 'Pressure', instrumentId: idOf('PT-5520'), profileId: 'manual', gauge: null }],
      jackInstrumentId: idOf('JK-50-031'),
      simulator: speed > 1 ? { controlUrl: 'http://127.0.0.1:65535', speed } : null,
    });
    if (rig.status !== 201) throw new Error(`rig refused: ${JSON.stringify(rig.body)}`);
    const run = await operator.post('/api/runs', { planId, rigId: rig.body.id });
    if (run.status !== 201) throw new Error(`run refused: ${JSON.stringify(run.body)}`);
    runIds.push((run.body as RunView).id);
  }
  const engines = runIds.map((id) => {
    const engine = server.runs.engine(id);
    if (!engine) throw new Error(`run ${id} has no engine`);
    return engine;
  });
  return {
    runIds,
    operator,
    feed: (hz) => feedEngines(engines, hz),
    stop: async () => {
      await Promise.all(engines.map((e) => e.stop()));
    },
  };
}

/** The engine's own entry point for a reading from its rig connection. */
const readingPath = (engine: RunEngine) => engine as unknown as { onReading(r: ChannelReading): void };

/**
 * Feeds `perChannelHz` readings/s to each channel of every engine, channels in turn. Readings that fall
 * due within one timer tick are stamped spread over it, the last one now (as a port read just now).
 */
function feedEngines(engines: RunEngine[], perChannelHz: number): () => number {
  const perMs = (perChannelHz * CHANNELS) / 1000;
  const startMs = Date.now();
  let done = 0;
  const timer = setInterval(
    () => {
      const now = Date.now();
      const due = Math.floor((now - startMs) * perMs);
      for (; done < due; done++) {
        const channelIndex = done % CHANNELS;
        const pressure = channelIndex === CHANNELS - 1;
        const value = pressure ? 5 : 10 + Math.sqrt(done) * 1e-4;
        const wallMs = now - (due - 1 - done) / perMs;
        const monoMs = performance.now() - (due - 1 - done) / perMs;
        const reading = { channelIndex, key: pressure ? 'p1' : `g${channelIndex + 1}`, role: pressure ? 'pressure' : 'gauge', monoMs, wallMs, raw: value, value, status: 'ok', deviceSeq: done } as const;
        for (const engine of engines) readingPath(engine).onReading(reading);
      }
    },
    Math.min(10, 1 / perMs),
  );
  return () => {
    clearInterval(timer);
    return done;
  };
}
