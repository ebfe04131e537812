/**
 * P5: the run console in headless Chromium while a run is fed at 10 Hz per channel of run time, with
 * the run clock accelerated so a whole 24-hour session's samples pass in a couple of minutes. Reads
 * Chromium's own counters (CDP Performance: script time; frames counted by requestAnimationFrame),
 * long tasks (PerformanceObserver 'longtask') and the JS heap after garbage collection.
 */
import { existsSync } from 'node:fs';
import path from 'node:path';
import type { RunningServer } from '../../server/main';
import { demoEmail } from '../support/api';
import { launchChromium, signInPage, watchForErrors } from '../support/browser';
import { command } from '../support/sim-run';
import { createLiveRuns } from './live-runs';
import { sleep } from './stats';

export interface BrowserSessionOptions {
  /** Built client folder the server serves. */
  clientDir: string;
  /** Run-clock acceleration (24 h pass in 24 h / speed of wall time). */
  speed: number;
  /** Session length in run-clock hours. Default 24. */
  hours?: number;
  /** Readings per second per channel, in run time. Default 10. */
  hz?: number;
}

export interface BrowserSessionResult {
  speed: number;
  hours: number;
  /** Readings actually fed (all channels). */
  samplesFed: number;
  frames: number;
  scriptMsPerFrame: number;
  longTasks: number;
  maxLongTaskMs: number;
  /** JS heap after GC (MB) before, halfway through and after the session. */
  heapStartMb: number;
  heapHalfMb: number;
  heapEndMb: number;
  pageErrors: string[];
}

interface PageCounters {
  frames: number;
  /** [startTime, duration] of each long task, page clock ms. */
  longTasks: [number, number][];
}

/**
 * Starts counting frames and long tasks in the page. A string, not a function: the TypeScript
 * loader's helpers (e.g. __name) do not exist in the page.
 */
const COUNTERS_SCRIPT = `(() => {
  const counters = { frames: 0, longTasks: [] };
  window.__bench = counters;
  const frame = () => { counters.frames += 1; requestAnimationFrame(frame); };
  requestAnimationFrame(frame);
  new PerformanceObserver((list) => { for (const e of list.getEntries()) counters.longTasks.push([e.startTime, e.duration]); }).observe({ type: 'longtask' });
})()`;

export async function benchBrowserSession(server: RunningServer, o: BrowserSessionOptions): Promise<BrowserSessionResult> {
  if (!existsSync(path.join(o.clientDir, 'index.html'))) throw new Error(`no built client in ${o.clientDir}: run \`npm run build\` first`);
  const hours = o.hours ?? 24;
  const hz = o.hz ?? 10;
  const live = await createLiveRuns(server, 1, o.speed);
  const runId = live.runIds[0];
  const warmup = live.feed(1);
  await sleep(500);
  await command(live.operator, runId, { type: 'zero' });
  await command(live.operator, runId, { type: 'start' });
  warmup();

  const browser = await launchChromium();
  try {
    const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
    const errors = watchForErrors(page);
    await signInPage(page, server.url, demoEmail('operator'));
    await page.goto(`${server.url}/runs/${runId}`);
    await page.locator('canvas').first().waitFor({ timeout: 30_000 });
    const cdp = await page.context().newCDPSession(page);
    await cdp.send('Performance.enable');
    const metrics = async () => Object.fromEntries((await cdp.send('Performance.getMetrics')).metrics.map((m) => [m.name, m.value]));
    // Forced collections are long tasks of their own: their windows are left out of the count.
    const gcWindows: [number, number][] = [];
    const pageNow = async () => (await page.evaluate('performance.now()')) as number;
    const heapMb = async () => {
      const from = await pageNow();
      await cdp.send('HeapProfiler.collectGarbage');
      gcWindows.push([from, await pageNow()]);
      return (await metrics()).JSHeapUsedSize / 2 ** 20;
    };

    const heapStartMb = await heapMb();
    await page.evaluate(COUNTERS_SCRIPT);
    const before = await metrics();
    const stop = live.feed(hz * o.speed);
    const halfMs = (hours * 3_600_000) / o.speed / 2;
    await sleep(halfMs);
    const heapHalfMb = await heapMb();
    await sleep(halfMs);
    const readings = stop();
    await sleep(500);
    const after = await metrics();
    const counters = (await page.evaluate('window.__bench')) as PageCounters;
    const heapEndMb = await heapMb();
    const inGc = ([start, duration]: [number, number]) => gcWindows.some(([a, b]) => start + duration >= a && start <= b);
    const longTasks = counters.longTasks.filter((t) => !inGc(t)).map(([, duration]) => duration);
    return {
      speed: o.speed,
      hours,
      samplesFed: readings,
      frames: counters.frames,
      scriptMsPerFrame: ((after.ScriptDuration - before.ScriptDuration) * 1000) / Math.max(1, counters.frames),
      longTasks: longTasks.length,
      maxLongTaskMs: Math.max(0, ...longTasks),
      heapStartMb,
      heapHalfMb,
      heapEndMb,
      pageErrors: errors,
    };
  } finally {
    await browser.close();
    await live.stop();
  }
}
