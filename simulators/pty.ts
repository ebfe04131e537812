import { type ChildProcess, spawn } from 'node:child_process';
import { existsSync, lstatSync, mkdirSync, unlinkSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';

/*
 * Pseudo-terminal pairs made by socat: `NAME-dev` is the simulated instrument's end, `NAME-app`
 * the end the application opens as if it were a serial port. socat is spawned without a shell,
 * so the PID we hold is socat's own, and killing it removes both ends.
 */

/** Options of {@link PtyPair}. */
export interface PtyPairOptions {
  /** Link name prefix: the links are `NAME-dev` and `NAME-app`. */
  name: string;
  /** Run-time folder for the links, created if missing. Defaults to ".data/pty". */
  dir?: string;
  /** Longest wait for both links to appear, ms. Defaults to 5000. */
  readyTimeoutMs?: number;
  /** The socat program. Defaults to "socat" on the PATH. */
  socat?: string;
}

export const DEFAULT_PTY_DIR = '.data/pty';

const live = new Set<ChildProcess>();
let exitHookInstalled = false;

/** Last-resort cleanup: a socat of ours must not outlive this process. */
function installExitHook(): void {
  if (exitHookInstalled) return;
  exitHookInstalled = true;
  process.once('exit', () => {
    for (const child of live) child.kill('SIGTERM'); // socat removes its links on TERM
  });
}

function hasExited(child: ChildProcess): boolean {
  return child.exitCode !== null || child.signalCode !== null;
}

/** Removes a link left by a socat that no longer runs; refuses one whose pty is still alive. */
function clearStaleLink(path: string): void {
  let isLink = false;
  try {
    isLink = lstatSync(path).isSymbolicLink();
  } catch {
    return; // nothing there
  }
  if (!isLink) throw new Error(`${path} exists and is not a pty link; remove it or choose another "dir"`);
  if (existsSync(path)) throw new Error(`${path} is in use by another pty pair (is a simulator already running?)`);
  unlinkSync(path);
}

export class PtyPair {
  readonly devicePath: string;
  readonly appPath: string;
  #child?: ChildProcess;
  #stderr = '';
  readonly #options: PtyPairOptions;

  constructor(options: PtyPairOptions) {
    if (!/^[A-Za-z0-9._-]+$/.test(options.name)) throw new TypeError(`"name" must be letters, digits, ".", "_" or "-" (got "${options.name}")`);
    this.#options = options;
    const dir = resolve(options.dir ?? DEFAULT_PTY_DIR);
    this.devicePath = join(dir, `${options.name}-dev`);
    this.appPath = join(dir, `${options.name}-app`);
  }

  /** socat's process id while it runs. */
  get pid(): number | undefined {
    return this.#child && !hasExited(this.#child) ? this.#child.pid : undefined;
  }

  get running(): boolean {
    return this.pid !== undefined;
  }

  /** Starts socat and resolves once both links exist. */
  async start(): Promise<void> {
    if (this.running) return;
    mkdirSync(resolve(this.#options.dir ?? DEFAULT_PTY_DIR), { recursive: true });
    clearStaleLink(this.devicePath);
    clearStaleLink(this.appPath);
    const args = ['-d', '-d', `pty,raw,echo=0,link=${this.devicePath}`, `pty,raw,echo=0,link=${this.appPath}`];
    const child = spawn(this.#options.socat ?? 'socat', args, { stdio: ['ignore', 'ignore', 'pipe'] });
    this.#child = child;
    this.#stderr = '';
    live.add(child);
    installExitHook();
    child.stderr?.on('data', (chunk: Buffer) => {
      this.#stderr = (this.#stderr + chunk.toString()).slice(-2000);
    });
    child.once('exit', () => live.delete(child));
    const spawnError = new Promise<Error>((done) => child.once('error', done));

    const deadline = Date.now() + (this.#options.readyTimeoutMs ?? 5000);
    while (!(existsSync(this.devicePath) && existsSync(this.appPath))) {
      const failed = await Promise.race([spawnError, sleep(10).then(() => undefined)]);
      if (failed) throw new Error(`cannot start socat: ${failed.message}`);
      if (hasExited(child)) throw new Error(`socat exited before the ptys were ready: ${this.#stderr.trim() || 'no message'}`);
      if (Date.now() > deadline) {
        await this.stop();
        throw new Error(`socat did not create ${this.devicePath} and ${this.appPath} in time`);
      }
    }
  }

  /** Kills socat (TERM, then KILL after a second), waits for it to exit and removes the links. */
  async stop(): Promise<void> {
    const child = this.#child;
    if (!child) return; // never started: the links, if any, are not ours
    this.#child = undefined;
    if (!hasExited(child)) {
      const exited = new Promise<void>((done) => child.once('exit', () => done()));
      child.kill('SIGTERM');
      const inTime = await Promise.race([exited.then(() => true), sleep(1000).then(() => false)]);
      if (!inTime) {
        child.kill('SIGKILL');
        await exited;
      }
    }
    live.delete(child);
    for (const path of [this.devicePath, this.appPath]) {
      try {
        unlinkSync(path);
      } catch {
        // socat removed it already
      }
    }
  }
}

/** A started pty pair. */
export async function createPtyPair(options: PtyPairOptions): Promise<PtyPair> {
  const pair = new PtyPair(options);
  await pair.start();
  return pair;
}
