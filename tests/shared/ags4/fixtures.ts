import { readFileSync } from 'node:fs';
import path from 'node:path';
import { analyzeRecord } from '@shared/interpretation/analyze-record';
import { type Ags4ExportInput, exportAgs4, plateResults } from '@shared/ags4/plate-export';
import type { TestRecord } from '@shared/records/schema';

const FIXTURES = path.join(import.meta.dirname, '../../fixtures/records');

/** The example records of tests/fixtures/records: a two-cycle modulus test (300 mm, one gauge) and a bearing test (450 mm square, four gauges). */
export const fixtureRecord = (name: 'modulus-two-cycle-300' | 'sand-bearing-450-square'): TestRecord =>
  JSON.parse(readFileSync(path.join(FIXTURES, `${name}.json`), 'utf8'));

/** An export of the given records, each at its own location, with the interpretation's results. */
export function exportInput(records: readonly TestRecord[]): Ags4ExportInput {
  return {
    project: { id: 'DEMO-1', name: 'Demo project', site: 'Demo site', client: 'Demo client' },
    transmission: { issue: 2, date: '2026-12-02', status: 'Preliminary', producer: 'Settlescope' },
    locations: records.map((r, i) => ({ id: r.metadata?.pit ?? `L${i}`, finalDepthM: r.ground?.testDepthM })),
    tests: records.map((r, i) => ({
      locationId: r.metadata?.pit ?? `L${i}`,
      reference: `R${i + 1}`,
      depthM: r.ground?.testDepthM ?? 0.5,
      record: r,
      status: 'draft',
      results: plateResults(analyzeRecord(r)),
    })),
  };
}

/** The AGS4 text of the two fixture records. */
export const fixtureFile = () => exportAgs4(exportInput([fixtureRecord('modulus-two-cycle-300'), fixtureRecord('sand-bearing-450-square')]));

/** Replaces one line (1-based) of a CR+LF text. */
export function withLine(text: string, line: number, replace: (old: string) => string): string {
  const lines = text.split('\r\n');
  lines[line - 1] = replace(lines[line - 1]);
  return lines.join('\r\n');
}

/** The 1-based number of the first line matching. */
export function lineOf(text: string, match: (line: string) => boolean, after = 0): number {
  const at = text.split('\r\n').findIndex((l, i) => i >= after && match(l));
  if (at < 0) throw new Error('no such line');
  return at + 1;
}
