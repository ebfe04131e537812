/**
 * `npm start`: everything a new user needs, on one machine, with no manual step —
 * a private MariaDB, migrations, demo data, the built client and the API on http://127.0.0.1:8080.
 * `npm run dev` (`--dev`): the same, with the Vite dev server and an API that reloads on change.
 * Ctrl-C (once or more) or SIGTERM stops everything this started, the database last and cleanly.
 */
import { type ChildProcess, spawn } from 'node:child_process';
import path from 'node:path';
import { ROOT_DIR, defaultConfig } from '../config';
import { initModels } from '../db/models';
import { migrate } from '../db/migrator';
import { createSequelize } from '../db/sequelize';
import { startServer } from '../main';
import { DEMO_PASSWORD, DEMO_USERS, seedDemo } from '../seed/demo';
import { seedDemoMedia } from '../seed/demo-media';
import { startAutoOperator } from './auto-operator';
import { clientBuildIsCurrent } from './client-build';
import { loadOrCreateSecrets } from './local-state';
import { ensureDatabase, ensureMariadbInstalled, startMariadb } from './mariadb';
import { createShutdown } from './shutdown';
import { type SimulatorProcess, startSimulator, upsertDemoRig } from './simulated-rig';

const dev = process.argv.includes('--dev');
const base = defaultConfig();
const secrets = loadOrCreateSecrets(base.dataDir);
const config = defaultConfig({ sessionSecret: process.env.SSCOPE_SESSION_SECRET ?? secrets.sessionSecret, db: { ...base.db, password: process.env.SSCOPE_DB_PASSWORD ?? secrets.dbPassword } });
const shutdown = createShutdown();
/** A path as the user best reads it: relative inside the checkout, absolute elsewhere. */
const shown = (p: string) => (p.startsWith(ROOT_DIR + path.sep) ? path.relative(ROOT_DIR, p) : p);

/** Resolves when the API answers its health check (the dev API starts in its own process). */
async function apiAnswers(url: string, child: ChildProcess): Promise<void> {
  for (const until = Date.now() + 120_000; ; ) {
    if (child.exitCode !== null) throw new Error(`the API exited (code ${child.exitCode}) before it answered`);
    try {
      if ((await fetch(url)).ok) return;
    } catch {}
    if (Date.now() > until) throw new Error(`the API did not answer ${url} within 120 s`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

/** A child process that the shutdown stops (SIGTERM, SIGKILL after 10 s) and waits for. */
function child(name: string, cmd: string, args: string[], env: NodeJS.ProcessEnv): ChildProcess {
  const c = spawn(cmd, args, { cwd: ROOT_DIR, env: { ...process.env, ...env }, stdio: 'inherit' });
  const exited = new Promise<void>((resolve) => c.once('exit', () => resolve()));
  shutdown.add(name, async () => {
    if (c.exitCode !== null || c.signalCode !== null) return;
    c.kill('SIGTERM');
    const timer = setTimeout(() => c.kill('SIGKILL'), 10_000);
    await exited;
    clearTimeout(timer);
  });
  return c;
}

async function startDemoRig(): Promise<SimulatorProcess | null> {
  if (process.env.SSCOPE_SIMULATOR === '0') return null;
  const scenario = process.env.SSCOPE_SIM_SCENARIO ?? 'dense-sand';
  const speed = Number(process.env.SSCOPE_SIM_SPEED ?? 60);
  const sim = await startSimulator({ scenario, speed, gauges: 3, controlPort: Number(process.env.SSCOPE_SIM_PORT ?? 8091), dir: path.join(config.dataDir, 'pty'), name: 'demo' });
  shutdown.add('the simulated rig', () => sim.stop());
  console.log(`Simulated rig: ${scenario} at ×${speed}, ports in ${shown(path.join(config.dataDir, 'pty'))}/, control ${sim.controlUrl}`);
  return sim;
}

/** Demo data once into an empty database, and the demo rig pointed at this start's simulator (its id). */
async function seedDemoData(sim: SimulatorProcess | null): Promise<number | null> {
  if (await seedDemo()) {
    await seedDemoMedia(config.dataDir);
    console.log('Demo data seeded.');
  }
  return sim ? (await upsertDemoRig(sim)).id : null;
}

/**
 * The demo's automatic operator at the simulated rig: it follows the rig's runs through the API as
 * the demo operator and pumps to each prompted target (SSCOPE_AUTO_OPERATOR=0 leaves that to you,
 * through the simulator's control port).
 */
function startDemoOperator(sim: SimulatorProcess | null, rigId: number | null): void {
  if (!sim || rigId === null || process.env.SSCOPE_AUTO_OPERATOR === '0') return;
  const email = DEMO_USERS.find((u) => u.role === 'operator')!.email;
  const operator = startAutoOperator({ serverUrl: `http://${config.host}:${config.port}`, controlUrl: sim.controlUrl, rigId, email, password: DEMO_PASSWORD });
  shutdown.add('the automatic operator', () => operator.stop());
}

try {
  await ensureMariadbInstalled();
  console.log(`Starting the private MariaDB on 127.0.0.1:${config.db.port} (data in ${shown(config.dataDir)}/db)…`);
  const db = await startMariadb({ baseDir: path.join(config.dataDir, 'db'), port: config.db.port, bufferPool: '256M' });
  shutdown.add('MariaDB', async () => {
    await db.stop();
    console.log('MariaDB stopped.');
  });
  await ensureDatabase(db, config.db.database, config.db.user, config.db.password);
  const sim = await startDemoRig();

  let url: string;
  if (dev) {
    // Migrate and seed on a connection of our own before the watcher starts its API, so the first
    // page load finds demo data; the connection is closed only after its last use.
    const sequelize = createSequelize(config.db, 2);
    try {
      initModels(sequelize);
      await migrate(sequelize);
      startDemoOperator(sim, await seedDemoData(sim));
    } finally {
      await sequelize.close();
    }
    const env = { SSCOPE_DB_PASSWORD: config.db.password, SSCOPE_SESSION_SECRET: config.sessionSecret, PORT: String(config.port) };
    const api = child('the API', path.join(ROOT_DIR, 'node_modules', '.bin', 'tsx'), ['watch', 'server/index.ts'], env);
    await apiAnswers(`http://${config.host}:${config.port}/api/health`, api);
    const { createServer } = await import('vite');
    const vite = await createServer({ configFile: path.join(ROOT_DIR, 'vite.config.ts') });
    await vite.listen();
    shutdown.add('the Vite dev server', () => vite.close());
    url = vite.resolvedUrls?.local[0] ?? 'http://127.0.0.1:5173/';
  } else {
    if (clientBuildIsCurrent()) console.log('The client build is up to date.');
    else {
      console.log('Building the client…');
      const { build } = await import('vite');
      await build({ configFile: path.join(ROOT_DIR, 'vite.config.ts'), logLevel: 'warn' });
    }
    const server = await startServer(config);
    shutdown.add('the server', () => server.close());
    startDemoOperator(sim, await seedDemoData(sim));
    url = `${server.url}/`;
  }

  console.log(`\nSettlescope is running at ${url}\n\nDemo sign-ins (password "${DEMO_PASSWORD}" for each):`);
  for (const u of DEMO_USERS) console.log(`  ${u.role.padEnd(9)} ${u.email}`);
  console.log(`\nPress Ctrl-C to stop (the database stops too; data stays in ${shown(config.dataDir)}/).`);
} catch (err) {
  console.error(`\nStart-up failed: ${(err as Error).message}`);
  await shutdown.stop(1);
}
