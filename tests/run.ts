/**
 * `npm test`: installs what the suites need when missing (Debian packages, as root), then
 * type-checks, lints, builds the client, and runs every vitest project (unit, integration on a
 * private MariaDB, client components, browser end-to-end). Stops at the first failing step.
 *
 * `npm test -- <vitest arguments>` (`--project unit`, a file path, `-t name`) runs only vitest with
 * them: no type-check, lint or build, except that a filter naming e2e builds the client it serves.
 * Either way the duration of each step and of each vitest project is printed at the end.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { ensureDebianPackages } from '../server/ops/debian';
import { type ProjectTiming, formatProjectTimings } from './support/timing-reporter';

const durations: { title: string; ms: number }[] = [];
const timingDir = mkdtempSync(path.join(tmpdir(), 'sscope-test-timing-'));
const timingFile = path.join(timingDir, 'projects.json');

function summary(): void {
  console.log('\nDurations:');
  for (const { title, ms } of durations) console.log(`  ${title.padEnd(19)} ${`${(ms / 1000).toFixed(1)} s`.padStart(8)}`);
  if (existsSync(timingFile)) for (const line of formatProjectTimings(JSON.parse(readFileSync(timingFile, 'utf8')) as ProjectTiming[])) console.log(line);
  rmSync(timingDir, { recursive: true, force: true });
}

async function step(title: string, run: () => number | Promise<number>): Promise<void> {
  const started = Date.now();
  const status = await run();
  durations.push({ title, ms: Date.now() - started });
  if (status !== 0) {
    console.error(`\n✗ ${title} failed (exit ${status}).`);
    summary();
    process.exit(status || 1);
  }
  console.log(`✓ ${title} (${((Date.now() - started) / 1000).toFixed(1)} s)`);
}

const command = (title: string, cmd: string, args: string[], env: NodeJS.ProcessEnv = {}) =>
  step(title, () => {
    console.log(`\n▶ ${title}: ${cmd} ${args.join(' ')}`);
    const r = spawnSync(cmd, args, { stdio: 'inherit', env: { ...process.env, FORCE_COLOR: process.env.CI ? '0' : '1', ...env } });
    return r.status ?? 1;
  });

const bin = (name: string) => `node_modules/.bin/${name}`;
const filter = process.argv.slice(2);
const everything = filter.length === 0;

await step('Debian packages', async () => {
  await ensureDebianPackages([
    { binary: 'mariadbd', pkg: 'mariadb-server' },
    { binary: 'socat', pkg: 'socat' },
    { binary: 'chromium', pkg: 'chromium' },
  ]);
  return 0;
});
if (everything) {
  await command('type-check', bin('tsc'), ['--noEmit', '-p', '.']);
  await command('lint', bin('biome'), ['lint', '.']);
}
// The e2e project serves the built client, so a run that may reach it builds it first.
if (everything || filter.some((a) => a.includes('e2e'))) await command('client build', bin('vite'), ['build', '--logLevel', 'warn']);
const reporters = filter.some((a) => a.startsWith('--reporter')) ? [] : ['--reporter=default'];
await command('tests', bin('vitest'), ['run', ...filter, ...reporters, '--reporter=./tests/support/timing-reporter.ts'], { SSCOPE_TEST_TIMING: timingFile });
summary();
