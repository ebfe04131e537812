/**
 * A vitest reporter that times each project: wall time from its first file being queued to its last
 * file ending (projects overlap, so these do not add up to the run), and the files' own summed time.
 * `tests/run.ts` passes it with SSCOPE_TEST_TIMING=<file> and prints the figures after its steps;
 * without that variable it prints them itself.
 */
import { writeFileSync } from 'node:fs';
import type { Reporter, TestModule } from 'vitest/node';

export interface ProjectTiming {
  project: string;
  files: number;
  /** First file queued → last file ended, ms. */
  wallMs: number;
  /** Sum of the files' test and hook time, ms. */
  filesMs: number;
}

export default class TimingReporter implements Reporter {
  private readonly projects = new Map<string, { start: number; end: number; files: number; filesMs: number }>();

  onTestModuleQueued(module: TestModule): void {
    this.entry(module).start = Math.min(this.entry(module).start, performance.now());
  }

  onTestModuleEnd(module: TestModule): void {
    const entry = this.entry(module);
    entry.end = Math.max(entry.end, performance.now());
    entry.files += 1;
    entry.filesMs += module.diagnostic().duration;
  }

  onTestRunEnd(): void {
    const timings: ProjectTiming[] = [...this.projects].map(([project, e]) => ({ project, files: e.files, wallMs: Math.max(0, e.end - e.start), filesMs: e.filesMs }));
    const file = process.env.SSCOPE_TEST_TIMING;
    if (file) writeFileSync(file, JSON.stringify(timings));
    else for (const line of formatProjectTimings(timings)) console.log(line);
  }

  private entry(module: TestModule) {
    const name = module.project.name || 'default';
    let entry = this.projects.get(name);
    if (!entry) {
      entry = { start: Number.POSITIVE_INFINITY, end: 0, files: 0, filesMs: 0 };
      this.projects.set(name, entry);
    }
    return entry;
  }
}

const seconds = (ms: number) => `${(ms / 1000).toFixed(1)} s`;

export function formatProjectTimings(timings: ProjectTiming[]): string[] {
  return timings.map((t) => `  vitest ${t.project.padEnd(12)} ${seconds(t.wallMs).padStart(8)}  (${t.files} files, ${seconds(t.filesMs)} in the files)`);
}
