/**
 * The README's commands as a user runs them in a terminal: `npm start` and `npm run dev` as their own
 * process group, stopped the way Ctrl-C stops them (SIGINT to the whole group, once or repeatedly,
 * then SIGTERM), or killed with kill -9. Afterwards no process of the product may be left and its
 * ports must be free; the next start must come up on the same data.
 */
import { type ChildProcess, spawn } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import net from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { ROOT_DIR } from '../../server/config';
import { freePort } from '../support/free-port';

let dataDir: string;
/** The ports of the latest launch: fresh for each, since other test files run beside this one and may be handed a port released by the case before. */
let ports: { http: number; db: number; sim: number; dev: number };

beforeAll(() => {
  dataDir = mkdtempSync(path.join(tmpdir(), 'sscope-commands-'));
});

async function freshEnv(): Promise<NodeJS.ProcessEnv> {
  ports = { http: await freePort(), db: await freePort(), sim: await freePort(), dev: await freePort() };
  return {
    ...process.env,
    PORT: String(ports.http),
    SSCOPE_DB_PORT: String(ports.db),
    SSCOPE_SIM_PORT: String(ports.sim),
    SSCOPE_DEV_PORT: String(ports.dev),
    SSCOPE_DATA_DIR: dataDir,
    SSCOPE_SMTP_PORT: '0',
  };
}

/** Process groups of every launch, so a case that failed midway can be cleaned up after. */
const groups: number[] = [];

afterEach(async () => {
  // A case that failed midway leaves its processes (and its ports) behind: end them so the next case starts clean.
  for (const pgid of groups.splice(0)) if (groupAlive(pgid)) killQuietly(-pgid, 'SIGKILL');
  for (const pid of processesNaming(dataDir)) killQuietly(pid, 'SIGKILL');
  for (const until = Date.now() + 10_000; processesNaming(dataDir).length > 0 && Date.now() < until; ) await sleep(100);
});

afterAll(async () => {
  // Whatever a failed case left behind: the data folder names every process of ours.
  for (const pid of processesNaming(dataDir)) killQuietly(pid, 'SIGKILL');
  rmSync(dataDir, { recursive: true, force: true });
});

interface Launched {
  child: ChildProcess;
  /** Everything it printed so far. */
  log(): string;
  /** Resolves once it has printed `text` (its server may answer before the line reaches us); rejects if it exits first. */
  printed(text: string): Promise<void>;
  exited: Promise<void>;
}

/** `npm start` or `npm run dev`, as a terminal would run it: its own process group. */
async function launch(script: 'start' | 'dev'): Promise<Launched> {
  const env = await freshEnv();
  const child = spawn('npm', ['run', script], { cwd: ROOT_DIR, env, detached: true, stdio: ['ignore', 'pipe', 'pipe'] });
  groups.push(child.pid!);
  let log = '';
  const waiting = new Set<{ text: string; resolve: () => void }>();
  const onOutput = (d: Buffer) => {
    log += d;
    for (const w of waiting) {
      if (!log.includes(w.text)) continue;
      waiting.delete(w);
      w.resolve();
    }
  };
  child.stdout!.on('data', onOutput);
  child.stderr!.on('data', onOutput);
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const printed = (text: string) =>
    log.includes(text)
      ? Promise.resolve()
      : new Promise<void>((resolve, reject) => {
          waiting.add({ text, resolve });
          void exited.then(() => reject(new Error(`exited before printing "${text}":\n${log}`)));
        });
  return { child, log: () => log, printed, exited };
}

async function answers(url: string, launched: Launched, within = 150_000): Promise<string> {
  for (const until = Date.now() + within; ; ) {
    try {
      const res = await fetch(url);
      if (res.ok) return await res.text();
    } catch {}
    if (launched.child.exitCode !== null) throw new Error(`exited before ${url} answered:\n${launched.log()}`);
    if (Date.now() > until) throw new Error(`${url} did not answer:\n${launched.log()}`);
    await sleep(250);
  }
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

function killQuietly(pid: number, signal: NodeJS.Signals) {
  try {
    process.kill(pid, signal);
  } catch {}
}

const groupAlive = (pgid: number) => {
  try {
    process.kill(-pgid, 0);
    return true;
  } catch {
    return false;
  }
};

/** Processes whose command line names `text` (the data folder: the database, the simulator, socat). */
function processesNaming(text: string): number[] {
  const found: number[] = [];
  for (const entry of readdirSync('/proc')) {
    if (!/^\d+$/.test(entry) || Number(entry) === process.pid) continue;
    try {
      if (readFileSync(`/proc/${entry}/cmdline`, 'utf8').includes(text)) found.push(Number(entry));
    } catch {}
  }
  return found;
}

/** The pid of the start script itself (node, not the npm and sh wrappers), found in its group. */
function startScriptPid(pgid: number): number {
  for (const entry of readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      const stat = readFileSync(`/proc/${entry}/stat`, 'utf8');
      const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
      const cmd = readFileSync(`/proc/${entry}/cmdline`, 'utf8').split('\0');
      if (Number(fields[2]) === pgid && cmd[0]?.endsWith('node') && cmd.includes('server/ops/start.ts')) return Number(entry);
    } catch {}
  }
  throw new Error(`no start script in process group ${pgid}`);
}

const portFree = (port: number) =>
  new Promise<boolean>((resolve) => {
    const probe = net.createServer();
    probe.once('error', () => resolve(false));
    probe.listen(port, '127.0.0.1', () => probe.close(() => resolve(true)));
  });

/** Waits for the group and every process naming the data folder to end; then the ports must be free. */
async function expectAllStopped(launched: Launched, within = 60_000) {
  const pgid = launched.child.pid!;
  const until = Date.now() + within;
  while ((groupAlive(pgid) || processesNaming(dataDir).length > 0) && Date.now() < until) await sleep(100);
  expect(groupAlive(pgid), `process group still alive:\n${launched.log()}`).toBe(false);
  expect(processesNaming(dataDir), `left running:\n${launched.log()}`).toEqual([]);
  for (const port of [ports.http, ports.db, ports.sim]) expect(await portFree(port), `port ${port} still taken`).toBe(true);
}

/** Shut down cleanly means InnoDB finished its shutdown, not that the process was killed. */
const lastShutdownClean = () => readFileSync(path.join(dataDir, 'db', 'mariadb.err'), 'utf8').trimEnd().endsWith('Shutdown complete');

describe('npm start and npm run dev stop completely and start again', () => {
  it('Ctrl-C (SIGINT to the group) stops everything, the database cleanly', async () => {
    const run = await launch('start');
    expect(JSON.parse(await answers(`http://127.0.0.1:${ports.http}/api/health`, run))).toMatchObject({ app: 'ok', database: 'ok' });
    // As a user would: Ctrl-C once it says it is running (the API answers while the demo data is still
    // being seeded, in one transaction that a Ctrl-C before the end leaves for the next start to do).
    await run.printed('Settlescope is running');
    process.kill(-run.child.pid!, 'SIGINT');
    await expectAllStopped(run);
    expect(run.log()).toContain('MariaDB stopped.');
    expect(lastShutdownClean()).toBe(true);
  });

  it('Ctrl-C twice and then SIGTERM do not cut the shutdown short; the next start reuses the data', async () => {
    const run = await launch('start');
    await answers(`http://127.0.0.1:${ports.http}/api/health`, run);
    await run.printed('Settlescope is running');
    expect(run.log()).toContain('Settlescope is running'); // the same data folder: no second seeding
    expect(run.log()).not.toContain('Demo data seeded');
    process.kill(-run.child.pid!, 'SIGINT');
    await sleep(150);
    killQuietly(-run.child.pid!, 'SIGINT');
    await sleep(150);
    killQuietly(-run.child.pid!, 'SIGTERM');
    await expectAllStopped(run);
    expect(run.log()).toContain('MariaDB stopped.');
    expect(lastShutdownClean()).toBe(true);
  });

  it('after kill -9 of the start script, the next start stops the database it left and comes up', async () => {
    const first = await launch('start');
    await answers(`http://127.0.0.1:${ports.http}/api/health`, first);
    process.kill(startScriptPid(first.child.pid!), 'SIGKILL');
    await first.exited;
    // The database outlives a killed script (it has its own process group); the simulated rig does not.
    const leftover = processesNaming(dataDir);
    expect(leftover.length).toBeGreaterThan(0);

    const second = await launch('start');
    await answers(`http://127.0.0.1:${ports.http}/api/health`, second);
    expect(second.log()).toMatch(/left running by an earlier start \(pid \d+\); stopping it cleanly/);
    expect(second.log()).toContain('The earlier MariaDB has stopped.');
    for (const pid of leftover) expect(processesNaming(dataDir)).not.toContain(pid);
    process.kill(-second.child.pid!, 'SIGINT');
    await expectAllStopped(second);
  });

  it('npm run dev serves the page and the API through the Vite dev server, and Ctrl-C stops it all', async () => {
    const run = await launch('dev');
    const health = await answers(`http://127.0.0.1:${ports.dev}/api/health`, run);
    expect(JSON.parse(health)).toMatchObject({ app: 'ok', database: 'ok' });
    expect(await answers(`http://127.0.0.1:${ports.dev}/`, run)).toContain('<div id="root">');
    process.kill(-run.child.pid!, 'SIGINT');
    await expectAllStopped(run);
    expect(await portFree(ports.dev)).toBe(true);
    expect(lastShutdownClean()).toBe(true);
  });
});
