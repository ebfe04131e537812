/** P6: interpretation of a week-long record in-process, and the `npm run analyze` CLI on a file of it. */
import { spawnSync } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { analyzeRecord } from '../../shared/interpretation/analyze-record';
import { ROOT_DIR } from '../../server/config';
import { weekLongClayRecord } from '../shared/records/synthetic';
import { median, timed } from './stats';

export interface InterpretationResult {
  readings: number;
  analyzeFirstMs: number;
  analyzeMedianMs: number;
  cliMs: number;
  cliStartupMs: number;
}

export async function benchInterpretation(outDir: string): Promise<InterpretationResult> {
  const record = weekLongClayRecord();
  const runs = [];
  for (let i = 0; i < 7; i++) runs.push((await timed(() => analyzeRecord(record))).ms);
  mkdirSync(outDir, { recursive: true });
  const file = path.join(outDir, 'week-long-record.json');
  writeFileSync(file, JSON.stringify(record));
  const analyze = (...args: string[]) =>
    timed(() => {
      const child = spawnSync('npm', ['run', '--silent', 'analyze', '--', ...args], { cwd: ROOT_DIR, encoding: 'utf8' });
      if (child.status !== 0) throw new Error(`npm run analyze ${args.join(' ')} exited ${child.status}: ${child.stderr}`);
    });
  // Baseline: the same command that only prints its help (npm, Node and tsx start-up).
  const help = await analyze('--help');
  const cli = await analyze(file);
  const readings = record.stages.reduce((n, s) => n + s.readings.length, 0);
  return { readings, analyzeFirstMs: runs[0], analyzeMedianMs: median(runs), cliMs: cli.ms, cliStartupMs: help.ms };
}
