/** Small numeric helpers for the benchmark: percentiles, timing and CPU/RSS sampling of this process. */
import { performance } from 'node:perf_hooks';

/** The q-quantile (0..1) of the values by nearest rank; NaN when there are none. */
export function quantile(values: readonly number[], q: number): number {
  if (values.length === 0) return Number.NaN;
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1))];
}

export const median = (values: readonly number[]) => quantile(values, 0.5);

/** Runs `fn` and returns its result with the elapsed wall time in ms. */
export async function timed<T>(fn: () => Promise<T> | T): Promise<{ ms: number; result: T }> {
  const start = performance.now();
  const result = await fn();
  return { ms: performance.now() - start, result };
}

export const sleep = (ms: number) => new Promise<void>((r) => setTimeout(r, ms));

/** CPU of this process as % of one core and its peak RSS (MB), sampled every 500 ms over `ms`. */
export async function processLoad(ms: number): Promise<{ cpuPercent: number; rssMb: number }> {
  const cpu0 = process.cpuUsage();
  const t0 = performance.now();
  let rss = process.memoryUsage().rss;
  const until = t0 + ms;
  while (performance.now() < until) {
    await sleep(Math.min(500, until - performance.now()));
    rss = Math.max(rss, process.memoryUsage().rss);
  }
  const cpu = process.cpuUsage(cpu0);
  const wallUs = (performance.now() - t0) * 1000;
  return { cpuPercent: ((cpu.user + cpu.system) / wallUs) * 100, rssMb: rss / 2 ** 20 };
}
