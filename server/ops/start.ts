/**
 * `npm start`: everything a new user needs, on one machine, with no manual step —
 * a private MariaDB, migrations, demo data, the built client and the API on http://127.0.0.1:8080.
 * `npm run dev` (`--dev`): the same, with the Vite dev server and an API that reloads on change.
 * Ctrl-C stops everything this started.
 */
import { type ChildProcess, spawn } from 'node:child_process';
import path from 'node:path';
import { ROOT_DIR, defaultConfig } from '../config';
import { startServer } from '../main';
import { DEMO_PASSWORD, DEMO_USERS, seedDemo } from '../seed/demo';
import { seedDemoMedia } from '../seed/demo-media';
import { loadOrCreateSecrets } from './local-state';
import { ensureDatabase, ensureMariadbInstalled, startMariadb } from './mariadb';
import { startSimulator, upsertDemoRig } from './simulated-rig';

const dev = process.argv.includes('--dev');
const base = defaultConfig();
const secrets = loadOrCreateSecrets(base.dataDir);
const config = defaultConfig({ sessionSecret: process.env.SSCOPE_SESSION_SECRET ?? secrets.sessionSecret, db: { ...base.db, password: process.env.SSCOPE_DB_PASSWORD ?? secrets.dbPassword } });
const cleanups: (() => Promise<void> | void)[] = [];

async function stopAll(code = 0) {
  for (const fn of cleanups.reverse()) {
    try {
      await fn();
    } catch (err) {
      console.error(err);
    }
  }
  process.exit(code);
}
process.once('SIGINT', () => void stopAll());
process.once('SIGTERM', () => void stopAll());

function child(cmd: string, args: string[], env: NodeJS.ProcessEnv): ChildProcess {
  const c = spawn(cmd, args, { cwd: ROOT_DIR, env: { ...process.env, ...env }, stdio: 'inherit' });
  cleanups.push(() => {
    c.kill('SIGTERM');
  });
  return c;
}

try {
  await ensureMariadbInstalled();
  console.log(`Starting the private MariaDB on 127.0.0.1:${config.db.port} (data in ${path.relative(ROOT_DIR, config.dataDir)}/db)…`);
  const db = await startMariadb({ baseDir: path.join(config.dataDir, 'db'), port: config.db.port, bufferPool: '256M' });
  cleanups.push(() => db.stop());
  await ensureDatabase(db, config.db.database, config.db.user, config.db.password);

  let url: string;
  if (dev) {
    const env = { SSCOPE_DB_PASSWORD: config.db.password, SSCOPE_SESSION_SECRET: config.sessionSecret, PORT: String(config.port) };
    // Migrate and seed before the watcher starts, so the first page load finds demo data.
    const once = await startServer({ ...config, port: 0, clientDir: null });
    if (await seedDemo()) await seedDemoMedia(config.dataDir);
    await once.close();
    child(path.join(ROOT_DIR, 'node_modules', '.bin', 'tsx'), ['watch', 'server/index.ts'], env);
    const { createServer } = await import('vite');
    const vite = await createServer({ configFile: path.join(ROOT_DIR, 'vite.config.ts') });
    await vite.listen();
    cleanups.push(() => vite.close());
    url = vite.resolvedUrls?.local[0] ?? 'http://127.0.0.1:5173/';
  } else {
    console.log('Building the client…');
    const { build } = await import('vite');
    await build({ configFile: path.join(ROOT_DIR, 'vite.config.ts'), logLevel: 'warn' });
    const server = await startServer(config);
    cleanups.push(() => server.close());
    if (await seedDemo()) {
      await seedDemoMedia(config.dataDir);
      console.log('Demo data seeded.');
    }
    url = `${server.url}/`;
  }

  if (process.env.SSCOPE_SIMULATOR !== '0') {
    const scenario = process.env.SSCOPE_SIM_SCENARIO ?? 'dense-sand';
    const speed = Number(process.env.SSCOPE_SIM_SPEED ?? 60);
    const sim = await startSimulator({ scenario, speed, gauges: 3, controlPort: Number(process.env.SSCOPE_SIM_PORT ?? 8091), dir: '.data/pty', name: 'demo' });
    cleanups.push(() => sim.stop());
    await upsertDemoRig(sim);
    console.log(`Simulated rig: ${scenario} at ×${speed}, ports in .data/pty/, control ${sim.controlUrl}`);
  }

  console.log(`\nSettlescope is running at ${url}\n\nDemo sign-ins (password "${DEMO_PASSWORD}" for each):`);
  for (const u of DEMO_USERS) console.log(`  ${u.role.padEnd(9)} ${u.email}`);
  console.log('\nPress Ctrl-C to stop (the database stops too; data stays in .data/).');
} catch (err) {
  console.error(`\nStart-up failed: ${(err as Error).message}`);
  await stopAll(1);
}
