/**
 * A private MariaDB instance for Settlescope: its own data folder, socket and port on 127.0.0.1.
 * Used by `npm start`, the test suites and the benchmark; it never touches a system database.
 */
import { type ChildProcess, execFile, spawn } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import net from 'node:net';
import { userInfo } from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import createDebug from 'debug';
import { ensureDebianPackages, findBinary } from './debian';

const run = promisify(execFile);
const debug = createDebug('sscope:ops:mariadb');

export interface MariadbOptions {
  /** Folder holding `mariadb/` (data), `run/` (socket, pid) and the error log. */
  baseDir: string;
  /** TCP port on 127.0.0.1. */
  port: number;
  /** InnoDB buffer pool, e.g. "256M". Default "128M". */
  bufferPool?: string;
  /** Where to say what happened to an instance left running by an earlier start. Default console.log. */
  log?: (message: string) => void;
}

export interface MariadbInstance {
  port: number;
  socket: string;
  /** Runs SQL as the administrative account over the private socket. */
  adminSql(sql: string): Promise<string>;
  stop(): Promise<void>;
  /** The server process, so callers can SIGSTOP/SIGKILL it in fault tests. */
  process: ChildProcess;
}

const isRoot = () => process.getuid?.() === 0;

/** Finds mariadbd, installing Debian's mariadb-server when missing and we are root. */
export const ensureMariadbInstalled = () => ensureDebianPackages([{ binary: 'mariadbd', pkg: 'mariadb-server' }, { binary: 'mariadb-install-db', pkg: 'mariadb-server' }]);

function serverArgs(o: Required<MariadbOptions>, dataDir: string, runDir: string): string[] {
  const args = [
    '--no-defaults',
    `--datadir=${dataDir}`,
    `--socket=${path.join(runDir, 'mysqld.sock')}`,
    `--pid-file=${path.join(runDir, 'mysqld.pid')}`,
    `--port=${o.port}`,
    '--bind-address=127.0.0.1',
    '--skip-name-resolve',
    `--log-error=${path.join(o.baseDir, 'mariadb.err')}`,
    `--innodb-buffer-pool-size=${o.bufferPool}`,
    '--character-set-server=utf8mb4',
    '--collation-server=utf8mb4_unicode_ci',
    '--max-connections=300',
  ];
  if (isRoot()) args.splice(1, 0, '--user=root');
  return args;
}

async function initialise(dataDir: string): Promise<void> {
  if (existsSync(path.join(dataDir, 'mysql'))) return;
  mkdirSync(dataDir, { recursive: true });
  const me = userInfo().username;
  debug('initialising %s', dataDir);
  await run(findBinary('mariadb-install-db') ?? 'mariadb-install-db', [
    '--no-defaults',
    `--datadir=${dataDir}`,
    `--user=${me}`,
    '--auth-root-authentication-method=socket',
    `--auth-root-socket-user=${me}`,
    '--skip-test-db',
  ], { maxBuffer: 16 << 20 });
}

async function ping(socket: string): Promise<boolean> {
  try {
    await run(findBinary('mariadb-admin') ?? 'mariadb-admin', ['--no-defaults', `--socket=${socket}`, `-u${userInfo().username}`, 'ping']);
    return true;
  } catch {
    return false;
  }
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Initialises (first time only) and starts the private instance; resolves when it answers. */
export async function startMariadb(options: MariadbOptions): Promise<MariadbInstance> {
  const o = { bufferPool: '128M', log: console.log, ...options };
  const dataDir = path.join(o.baseDir, 'mariadb');
  const runDir = path.join(o.baseDir, 'run');
  const socket = path.join(runDir, 'mysqld.sock');
  mkdirSync(runDir, { recursive: true });
  await initialise(dataDir);
  await stopLeftover(runDir, dataDir, socket, o.log);
  await assertPortFree(o.port, o.baseDir);
  rmSync(socket, { force: true });

  // Its own process group: a Ctrl-C in the terminal reaches the start script, which stops the
  // database last and waits for it, instead of the database dying mid-shutdown beside it.
  const child = spawn(findBinary('mariadbd') ?? 'mariadbd', serverArgs(o, dataDir, runDir), { stdio: 'ignore', detached: true });
  let exited = false;
  const exit = new Promise<void>((resolve) => {
    child.once('exit', () => {
      exited = true;
      resolve();
    });
  });
  const deadline = Date.now() + 30_000;
  while (!(await ping(socket))) {
    if (exited) throw new Error(`MariaDB exited during start-up; see ${path.join(o.baseDir, 'mariadb.err')}:\n${tail(path.join(o.baseDir, 'mariadb.err'))}`);
    if (Date.now() > deadline) {
      child.kill('SIGKILL');
      throw new Error('MariaDB did not answer within 30 s');
    }
    await sleep(50);
  }
  debug('ready on 127.0.0.1:%d (pid %d)', o.port, child.pid);

  const adminSql = async (sql: string) => {
    const { stdout } = await run(findBinary('mariadb') ?? 'mariadb', ['--no-defaults', `--socket=${socket}`, `-u${userInfo().username}`, '-N', '-B', '-e', sql]);
    return stdout;
  };
  let stopping: Promise<void> | null = null;
  // Once, however many callers ask: a clean shutdown (SIGTERM), SIGKILL only after 30 s.
  const stop = () => {
    stopping ??= (async () => {
      if (exited) return;
      child.kill('SIGTERM');
      if (!(await settlesWithin(exit, 30_000))) {
        child.kill('SIGKILL');
        await exit;
      }
    })();
    return stopping;
  };
  return { port: o.port, socket, adminSql, stop, process: child };
}

const settlesWithin = (p: Promise<unknown>, ms: number) =>
  new Promise<boolean>((resolve) => {
    const timer = setTimeout(() => resolve(false), ms);
    void p.then(() => {
      clearTimeout(timer);
      resolve(true);
    });
  });

const alive = (pid: number) => {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
};

/** The pid of a mariadbd serving this data folder, from its pid file (checked against /proc). */
function ownServerPid(runDir: string, dataDir: string): number | null {
  let pid: number;
  try {
    pid = Number(readFileSync(path.join(runDir, 'mysqld.pid'), 'utf8').trim());
  } catch {
    return null;
  }
  if (!Number.isInteger(pid) || pid <= 0 || !alive(pid)) return null;
  try {
    const cmdline = readFileSync(`/proc/${pid}/cmdline`, 'utf8').split('\0');
    return cmdline.includes(`--datadir=${dataDir}`) ? pid : null;
  } catch {
    return null; // no /proc: cannot prove it is ours
  }
}

/**
 * An instance of ours left running (the start script was killed, or crashed) is stopped cleanly
 * so this start owns the one it runs; a server on our socket that we cannot identify stops the start.
 */
async function stopLeftover(runDir: string, dataDir: string, socket: string, log: (m: string) => void): Promise<void> {
  const pid = ownServerPid(runDir, dataDir);
  if (pid === null) {
    if (await ping(socket)) {
      throw new Error(`A MariaDB server answers on ${socket} but its pid file does not name it; stop it with:\n  mariadb-admin --no-defaults --socket=${socket} -u${userInfo().username} shutdown`);
    }
    return;
  }
  log(`A MariaDB of this data folder was left running by an earlier start (pid ${pid}); stopping it cleanly before starting again…`);
  process.kill(pid, 'SIGTERM');
  const until = Date.now() + 60_000;
  while (alive(pid) && Date.now() < until) await sleep(50);
  if (alive(pid)) {
    log(`MariaDB (pid ${pid}) did not stop within 60 s; killing it (InnoDB recovers on the next start).`);
    process.kill(pid, 'SIGKILL');
    while (alive(pid)) await sleep(50);
  }
  log('The earlier MariaDB has stopped.');
}

/** Refuses to start when another program already listens on the port, naming what to do. */
async function assertPortFree(port: number, baseDir: string): Promise<void> {
  const free = await new Promise<boolean>((resolve) => {
    const probe = net.createServer();
    probe.once('error', () => resolve(false));
    probe.listen(port, '127.0.0.1', () => probe.close(() => resolve(true)));
  });
  if (!free) {
    throw new Error(`Port ${port} on 127.0.0.1 is taken by another program (not the database in ${baseDir}). Stop that program (see: ss -ltnp 'sport = :${port}'), or use another port, e.g. SSCOPE_DB_PORT=${port + 1} npm start.`);
  }
}

function tail(file: string): string {
  try {
    return readFileSync(file, 'utf8').split('\n').slice(-15).join('\n');
  } catch {
    return '(no log)';
  }
}

const ident = (s: string) => {
  if (!/^[A-Za-z0-9_]+$/.test(s)) throw new Error(`unsafe identifier "${s}"`);
  return s;
};
const literal = (s: string) => `'${s.replace(/\\/g, '\\\\').replace(/'/g, "\\'")}'`;

/** Creates the database and an application account limited to it (idempotent). */
export async function ensureDatabase(db: MariadbInstance, database: string, user: string, password: string): Promise<void> {
  await db.adminSql(
    [
      `CREATE DATABASE IF NOT EXISTS ${ident(database)} CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`,
      `CREATE USER IF NOT EXISTS ${literal(user)}@'127.0.0.1' IDENTIFIED BY ${literal(password)}`,
      `ALTER USER ${literal(user)}@'127.0.0.1' IDENTIFIED BY ${literal(password)}`,
      `GRANT ALL PRIVILEGES ON ${ident(database)}.* TO ${literal(user)}@'127.0.0.1'`,
    ].join('; '),
  );
}
