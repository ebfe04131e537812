/**
 * P4: many live runs, each watched by several sockets, fed at 10 Hz per channel. The server runs in
 * this process (with the feeder, which is cheap); the viewers live in a child process.
 */
import { type ChildProcess, fork } from 'node:child_process';
import path from 'node:path';
import type { RunningServer } from '../../server/main';
import { httpSignIn } from '../support/live-server';
import { demoEmail } from '../support/api';
import { CHANNELS, createLiveRuns } from './live-runs';
import { processLoad, sleep } from './stats';

export interface FanOutOptions {
  runs: number;
  viewersPerRun: number;
  hz: number;
  warmupMs: number;
  measureMs: number;
}

export interface FanOutResult extends FanOutOptions {
  cpuPercent: number;
  rssMb: number;
  /** Samples that reached the viewers ÷ samples fed × viewers. */
  delivered: number;
}

function message<T>(child: ChildProcess, type: string, timeoutMs: number): Promise<T> {
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`viewer process: no '${type}' within ${timeoutMs} ms`)), timeoutMs);
    const onMessage = (m: { type: string; message?: string }) => {
      if (m.type !== type && m.type !== 'error') return;
      clearTimeout(timer);
      child.off('message', onMessage);
      if (m.type === 'error') reject(new Error(`viewer process: ${m.message}`));
      else resolve(m as T);
    };
    child.on('message', onMessage);
  });
}

export async function benchFanOut(server: RunningServer, o: FanOutOptions): Promise<FanOutResult> {
  const live = await createLiveRuns(server, o.runs);
  const { cookie } = await httpSignIn(server.url, demoEmail('operator'));
  const child = fork(path.join(import.meta.dirname, 'viewer-process.ts'), {
    execArgv: ['--import', 'tsx'],
    env: { ...process.env, BENCH_VIEWERS: JSON.stringify({ baseUrl: server.url, cookie, runIds: live.runIds, perRun: o.viewersPerRun }) },
  });
  try {
    await message(child, 'ready', 120_000);
    const stop = live.feed(o.hz);
    await sleep(o.warmupMs);
    child.send({ type: 'reset' });
    const load = await processLoad(o.measureMs);
    child.send({ type: 'report' });
    const { samples } = await message<{ samples: number }>(child, 'report', 10_000);
    stop();
    const expected = o.runs * o.viewersPerRun * CHANNELS * o.hz * (o.measureMs / 1000);
    return { ...o, ...load, delivered: samples / expected };
  } finally {
    child.send({ type: 'exit' });
    await live.stop();
  }
}
