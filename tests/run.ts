/**
 * `npm test`: installs what the suites need when missing (Debian packages, as root), then
 * type-checks, lints, builds the client, and runs every vitest project (unit, integration on a
 * private MariaDB, client components, browser end-to-end). Stops at the first failing step.
 */
import { spawnSync } from 'node:child_process';
import { ensureDebianPackages } from '../server/ops/debian';

const step = (title: string, cmd: string, args: string[]) => {
  console.log(`\n▶ ${title}: ${cmd} ${args.join(' ')}`);
  const started = Date.now();
  const r = spawnSync(cmd, args, { stdio: 'inherit', env: { ...process.env, FORCE_COLOR: process.env.CI ? '0' : '1' } });
  if (r.status !== 0) {
    console.error(`\n✗ ${title} failed (exit ${r.status ?? r.signal}).`);
    process.exit(r.status ?? 1);
  }
  console.log(`✓ ${title} (${((Date.now() - started) / 1000).toFixed(1)} s)`);
};

await ensureDebianPackages([
  { binary: 'mariadbd', pkg: 'mariadb-server' },
  { binary: 'socat', pkg: 'socat' },
  { binary: 'chromium', pkg: 'chromium' },
]);
const bin = (name: string) => `node_modules/.bin/${name}`;
step('type-check', bin('tsc'), ['--noEmit', '-p', '.']);
step('lint', bin('biome'), ['lint', '.']);
step('client build', bin('vite'), ['build', '--logLevel', 'warn']);
const filter = process.argv.slice(2);
step('tests', bin('vitest'), ['run', ...filter]);
