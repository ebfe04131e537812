/**
 * `npm run bench`: measures the speed figures P1–P6 of tests/README.md against a private MariaDB and an
 * in-process server, prints one table (figure, target, same-run baseline, verdict) and writes
 * .artifacts/bench/results.json. Every scenario is bounded in time; one that fails is reported, not fatal.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { cpus, totalmem } from 'node:os';
import path from 'node:path';
import { ROOT_DIR } from '../../server/config';
import { startServer } from '../../server/main';
import { seedDemo } from '../../server/seed/demo';
import { demoEmail } from '../support/api';
import { httpSignIn } from '../support/live-server';
import { benchArchive } from './archive';
import { benchBrowserSession } from './browser-session';
import { type BenchDatabase, CLIENT_DIR, startBenchDatabase } from './database';
import { benchFanOut } from './fan-out';
import { benchInterpretation } from './interpretation';
import { createLiveRuns } from './live-runs';
import { benchReplay } from './replay';
import { echoBaseline, joinViewers, liveLatency } from './socket-latency';
import { processLoad } from './stats';
import { type Row, renderTable, verdict } from './table';

const OUT_DIR = path.join(ROOT_DIR, '.artifacts', 'bench');
/** Scenario sizes (the load envelope of tests/README.md). */
const SIZE = {
  archiveRows: 300_000,
  replayDays: 7,
  plotWidthPx: 1000,
  latencyViewers: 20,
  latencyMs: 10_000,
  /** Run-clock acceleration of the browser session (24 h in 120 s). */
  browserSpeed: 720,
  fanOut: { runs: 50, viewersPerRun: 10, hz: 10, warmupMs: 5_000, measureMs: 15_000 },
};

/** BENCH_ONLY=P1,P5 runs only those scenarios (for working on one figure). */
const ONLY = process.env.BENCH_ONLY?.split(',');

const ms = (x: number) => `${x.toFixed(x < 10 ? 2 : 0)} ms`;
const perS = (x: number) => `${Math.round(x).toLocaleString('en')} rows/s`;

async function main(): Promise<void> {
  const started = Date.now();
  const rows: Row[] = [];
  const results: Record<string, unknown> = {};
  /** Runs one scenario; a failure becomes a row saying so instead of ending the benchmark. */
  const scenario: Scenario = async (id, fn, toRows) => {
    if (ONLY && !ONLY.includes(id)) {
      rows.push({ id, figure: '(skipped: BENCH_ONLY)', measured: '', target: '', baseline: '', verdict: 'not run' });
      return;
    }
    process.stderr.write(`[bench] ${id} … `);
    const t0 = Date.now();
    try {
      const r = await fn();
      results[id] = r;
      rows.push(...toRows(r));
      process.stderr.write(`${((Date.now() - t0) / 1000).toFixed(1)} s\n`);
    } catch (err) {
      results[id] = { error: (err as Error).message };
      rows.push({ id, figure: 'not measured', measured: `error: ${(err as Error).message.split('\n')[0].slice(0, 80)}`, target: '', baseline: '', verdict: 'ERROR' });
      process.stderr.write(`failed: ${(err as Error).stack}\n`);
    }
  };

  const bench = await startBenchDatabase();
  try {
    await measureAll(bench, scenario, results);
  } finally {
    await bench.remove();
  }
  results.totalS = (Date.now() - started) / 1000;
  mkdirSync(OUT_DIR, { recursive: true });
  writeFileSync(path.join(OUT_DIR, 'results.json'), JSON.stringify({ rows, results }, null, 2));
  const m = results.machine as Record<string, unknown> | undefined;
  if (m) process.stdout.write(`Settlescope bench — ${m.cpus} × ${m.cpuModel}, ${m.memoryGb} GB RAM, Node ${m.node}, MariaDB ${m.mariadb}; ${results.totalS} s in all\n`);
  process.stdout.write(renderTable(rows));
}

type Scenario = <T>(id: string, fn: () => Promise<T>, toRows: (r: T) => Row[]) => Promise<void>;

async function measureAll(bench: BenchDatabase, scenario: Scenario, results: Record<string, unknown>): Promise<void> {
  const server = await startServer(bench.config);
  try {
    await seedDemo();
    const machine = {
      cpus: cpus().length,
      cpuModel: cpus()[0]?.model ?? 'unknown',
      memoryGb: +(totalmem() / 2 ** 30).toFixed(1),
      node: process.version,
      mariadb: bench.version,
    };
    results.machine = machine;
    const idle = await processLoad(5_000);
    results.idle = idle;

    await scenario(
      'P1',
      async () => {
        const echo = await echoBaseline(2_000);
        const live = await createLiveRuns(server, 1);
        const { cookie } = await httpSignIn(server.url, demoEmail('operator'));
        const sockets = await joinViewers(server.url, cookie, live.runIds[0], SIZE.latencyViewers);
        const latency = await liveLatency(sockets, () => live.feed(10), SIZE.latencyMs);
        for (const s of sockets) s.close();
        await live.stop();
        return { viewers: SIZE.latencyViewers, latency, echo };
      },
      (r) => [
        { id: 'P1', figure: `live latency p95, ${r.viewers} viewers, 6 ch × 10 Hz (${r.latency.count} arrivals)`, measured: ms(r.latency.p95), target: '≤ 50 ms', baseline: `echo RTT p95 ${ms(r.echo.p95)}`, verdict: verdict(r.latency.p95 <= 50) },
        { id: 'P1', figure: 'live latency p99', measured: ms(r.latency.p99), target: '≤ 100 ms', baseline: `echo RTT p99 ${ms(r.echo.p99)}`, verdict: verdict(r.latency.p99 <= 100) },
      ],
    );

    await scenario(
      'P4',
      () => benchFanOut(server, SIZE.fanOut),
      (r) => [
        {
          id: 'P4',
          figure: `fan-out CPU, ${r.runs} runs × ${r.viewersPerRun} viewers, 6 ch × ${r.hz} Hz (${(100 * r.delivered).toFixed(1)} % delivered)`,
          measured: `${r.cpuPercent.toFixed(1)} % of a core`,
          target: '≤ 50 %',
          baseline: `idle ${idle.cpuPercent.toFixed(1)} %`,
          verdict: verdict(r.cpuPercent <= 50),
        },
        { id: 'P4', figure: 'fan-out RSS (peak)', measured: `${r.rssMb.toFixed(0)} MB`, target: '≤ 400 MB', baseline: `idle ${idle.rssMb.toFixed(0)} MB`, verdict: verdict(r.rssMb <= 400) },
      ],
    );
    await scenario(
      'P2',
      async () => {
        const conn = await bench.rawConnection();
        try {
          return await benchArchive(server.sequelize, conn, SIZE.archiveRows);
        } finally {
          await conn.end();
        }
      },
      (r) => [
        {
          id: 'P2',
          figure: `archive throughput, ${r.rows.toLocaleString('en')} rows (best of 3)`,
          measured: `${perS(r.archiverRowsPerS)} (${(r.archiverRowsPerS / r.rawRowsPerS).toFixed(2)} ×)`,
          target: '≥ 0.5 × raw, ≥ 100,000/s',
          baseline: `raw batch() ${perS(r.rawRowsPerS)}`,
          verdict: verdict(r.archiverRowsPerS >= 0.5 * r.rawRowsPerS && r.archiverRowsPerS >= 100_000),
        },
      ],
    );

    await scenario(
      'P3',
      async () => {
        const conn = await bench.rawConnection();
        try {
          const { cookie } = await httpSignIn(server.url, demoEmail('engineer'));
          return await benchReplay({ baseUrl: server.url, cookie, conn, sequelize: server.sequelize, days: SIZE.replayDays, widthPx: SIZE.plotWidthPx });
        } finally {
          await conn.end();
        }
      },
      (r) => {
        const run = `${SIZE.replayDays}-day 1 Hz 6-ch run, ${(r.rows / 1e6).toFixed(2)} M rows`;
        const all = `all rows ${ms(r.allRowsMs)} (${r.allRowsNote})`;
        return [
          { id: 'P3', figure: `replay overview of a ${run}, per-minute rollups built at close in ${r.rollupS.toFixed(1)} s (first / median of 5)`, measured: `${ms(r.overviewFirstMs)} / ${ms(r.overviewMedianMs)}`, target: '≤ 300 ms', baseline: all, verdict: verdict(Math.max(r.overviewFirstMs, r.overviewMedianMs) <= 300) },
          { id: 'P3', figure: '1-hour zoom (slowest / median of 10)', measured: `${ms(r.zoomMaxMs)} / ${ms(r.zoomMedianMs)}`, target: '≤ 100 ms', baseline: '', verdict: verdict(r.zoomMaxMs <= 100) },
          { id: 'P3', figure: `points per series sent (plot ${SIZE.plotWidthPx} px)`, measured: String(r.maxPointsPerSeries), target: `≤ ${4 * SIZE.plotWidthPx}`, baseline: `${r.rows / 6} per series`, verdict: verdict(r.maxPointsPerSeries <= 4 * SIZE.plotWidthPx) },
        ];
      },
    );

    await scenario(
      'P6',
      () => benchInterpretation(OUT_DIR),
      (r) => [
        { id: 'P6', figure: `analyzeRecord, week-long record (${r.readings} readings; first / median of 7)`, measured: `${ms(r.analyzeFirstMs)} / ${ms(r.analyzeMedianMs)}`, target: '≤ 200 ms', baseline: '—', verdict: verdict(Math.max(r.analyzeFirstMs, r.analyzeMedianMs) <= 200) },
        { id: 'P6', figure: '`npm run analyze` on that record file (spawned)', measured: ms(r.cliMs), target: '≤ 2 s', baseline: `\`analyze --help\` ${ms(r.cliStartupMs)}`, verdict: verdict(r.cliMs <= 2000) },
      ],
    );

    await scenario(
      'P5',
      () => benchBrowserSession(server, { clientDir: CLIENT_DIR, speed: SIZE.browserSpeed }),
      (r) => {
        const session = `browser, ${r.hours} h at 10 Hz × 6 ch (${(r.samplesFed / 1e6).toFixed(2)} M samples, run clock ×${r.speed}, ${r.frames} frames)`;
        const pageErrors = r.pageErrors.filter((e) => e.startsWith('pageerror')).length;
        const errors = pageErrors ? `; ${pageErrors} page errors` : '';
        return [
          { id: 'P5', figure: `${session}: script per frame`, measured: ms(r.scriptMsPerFrame), target: '≤ 10 ms', baseline: '—', verdict: verdict(r.scriptMsPerFrame <= 10) },
          { id: 'P5', figure: 'longest task (long tasks > 50 ms counted)', measured: `${r.longTasks ? ms(r.maxLongTaskMs) : 'none'} (${r.longTasks})`, target: 'no task > 50 ms', baseline: '—', verdict: verdict(r.longTasks === 0) },
          {
            id: 'P5',
            figure: 'JS heap after GC: start → halfway → end',
            measured: `${r.heapStartMb.toFixed(1)} → ${r.heapHalfMb.toFixed(1)} → ${r.heapEndMb.toFixed(1)} MB${errors}`,
            target: 'bounded (2nd half grows ≤ max(2 MB, 10 %))',
            baseline: '—',
            verdict: verdict(r.heapEndMb - r.heapHalfMb <= Math.max(2, 0.1 * r.heapHalfMb)),
          },
        ];
      },
    );
  } finally {
    await server.close();
  }
}

main().then(
  () => process.exit(0),
  (err) => {
    process.stderr.write(`${(err as Error).stack}\n`);
    process.exit(1);
  },
);
