/**
 * AGS4 files (edition 4.1.1) holding PLTG and PLTT → Settlescope test records, one per test (LOCA_ID,
 * PLTG_DPTH, PLTG_TESN), its load cycles joined in cycle order. The file must pass the AGS4 checks first;
 * then every problem a record would have is named by the line, group and heading it comes from.
 *
 * Reading: the plate from PLTG_PSHP/PLTG_PSIZ, else a circular plate of PLTG_PDIA; stages in cycle order,
 * each in the order its first reading appears; the time from PLTT_TMIN, else PLTT_TIME; the pressure from
 * PLTT_PRES, else PLTT_LOAD over the plate area; gauges from PLTT_SET1–4 and PLTT_S5–S12, keyed by
 * PLTG_GAUG (else g1, g2… by column); branch and target from PLTT_BRCH and PLTT_TGT, else inferred: a
 * stage at the seating load is seating, a rise loading (reloading after the first cycle), a fall
 * unloading, and the target is the pressure of the stage's last reading. PLTT_REM becomes a note event.
 * PLTT_MSET is derived and not read. Units are not converted: a column in another unit is refused.
 */
import { plateAreaM2, plateForceKn, platePressureKpa, type Plate } from '../domain/plate';
import { PROCEDURE_PROFILES } from '../procedures/profiles';
import { RECORD_BRANCHES, RECORD_FORMAT, RECORD_VERSION, type TestRecord } from '../records/schema';
import { validateRecord } from '../records/validate';
import { checkAgs4 } from './check';
import { type Ags4Group, type Ags4Problem, type Ags4Row, cell, ProblemList } from './parse';
import { EXPECTED_UNITS, GENERATED_REMARKS, gaugeHeading, toAscii } from './plate-map';

export interface ImportedPlateTest {
  locationId: string;
  reference: string;
  depthM: number;
  /** Line of the test's first PLTG row. */
  line: number;
  record: TestRecord;
}

export interface ImportedLocation {
  id: string;
  remarks?: string;
  finalDepthM?: number;
}

export type Ags4Import =
  | { ok: true; tests: ImportedPlateTest[]; locations: ImportedLocation[]; ignoredGroups: string[] }
  | { ok: false; problems: Ags4Problem[]; omitted: number; ignoredGroups: string[] };

const SETTLESCOPE = 'settlescope';

function byName(groups: readonly Ags4Group[], name: string): Ags4Group | undefined {
  return groups.find((g) => g.name === name && g.usable);
}

const numberOr = (text: string | undefined): number | undefined => (text === undefined || text === '' ? undefined : Number(text));
const textOr = (text: string | undefined): string | undefined => (text === undefined || text === '' ? undefined : text);

/** Drops undefined fields (and objects left empty), so a record never carries `key: undefined`. */
function prune<T extends Record<string, unknown>>(o: T): T | undefined {
  const kept = Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined));
  return Object.keys(kept).length ? (kept as T) : undefined;
}

interface CycleRow {
  line: number;
  cycle: string;
  row: Ags4Row;
}

interface TestRows {
  locationId: string;
  depth: string;
  reference: string;
  cycles: CycleRow[];
  readings: Map<string, Ags4Row[]>;
}

/** PLTG_REM without the remarks the export adds itself (square plate, readings left out). */
function ownRemarks(text: string | undefined): string | undefined {
  if (text === undefined) return undefined;
  return (
    text
      .split('; ')
      .filter((part) => !GENERATED_REMARKS.some((re) => re.test(part)))
      .join('; ') || undefined
  );
}

const cycleOrder = (a: string, b: string) => {
  const [x, y] = [Number(a), Number(b)];
  return Number.isFinite(x) && Number.isFinite(y) ? x - y : 0;
};

/** The records of one test; problems are named at their rows. */
function readTest(
  test: TestRows,
  pltg: Ags4Group,
  pltt: Ags4Group,
  project: { name?: string; client?: string; site?: string },
  problems: ProblemList,
): TestRecord | null {
  const first = test.cycles[0];
  const g = (heading: string) => cell(pltg, first.row, heading);
  const at = (line: number, group: string, heading: string | undefined, message: string) => problems.add({ line, group, heading, rule: SETTLESCOPE, message });
  const before = problems.size;

  const shape = g('PLTG_PSHP');
  const size = numberOr(g('PLTG_PSIZ'));
  const diameter = numberOr(g('PLTG_PDIA'));
  let plate: Plate | null = null;
  if (shape !== undefined && shape !== '' && shape !== 'circular' && shape !== 'square')
    at(first.line, 'PLTG', 'PLTG_PSHP', `"${shape}" is not a plate shape (circular or square)`);
  else if (shape === 'square' && size === undefined) at(first.line, 'PLTG', 'PLTG_PSIZ', 'a square plate needs its side in PLTG_PSIZ');
  else if (size !== undefined || diameter !== undefined) plate = { shape: shape === 'square' ? 'square' : 'circular', sizeMm: size ?? (diameter as number) };
  else at(first.line, 'PLTG', 'PLTG_PDIA', 'the plate diameter is missing');

  const gaugeColumns = Array.from({ length: 12 }, (_, i) => gaugeHeading(i + 1)).filter((hd) => pltt.headings.includes(hd));
  const allRows = test.cycles.flatMap((c) => test.readings.get(c.cycle) ?? []);
  const used = gaugeColumns.filter((hd) => allRows.some((r) => (cell(pltt, r, hd) ?? '') !== ''));
  const named = textOr(g('PLTG_GAUG'))?.split('|');
  const keys = named && named.length === used.length ? named : used.map((hd) => `g${hd.replace(/^PLTT_(SET|S)/, '')}`);
  if (used.length === 0) at(first.line, 'PLTG', 'PLTT_SET1', 'the test has no settlement readings');

  const seatKn = numberOr(g('PLTG_SEAT'));
  const stages: TestRecord['stages'] = [];
  const events: NonNullable<TestRecord['events']> = [];
  const stageNames: string[] = [];
  let previousPressure = -Infinity;
  for (const [c, cycle] of test.cycles.entries()) {
    const rows = test.readings.get(cycle.cycle) ?? [];
    if (rows.length === 0) at(cycle.line, 'PLTG', 'PLTG_CYC', `load cycle "${cycle.cycle}" has no PLTT readings`);
    const order: string[] = [];
    const byStage = new Map<string, Ags4Row[]>();
    for (const r of rows) {
      const stage = cell(pltt, r, 'PLTT_STG') ?? '';
      const list = byStage.get(stage);
      if (list) list.push(r);
      else {
        order.push(stage);
        byStage.set(stage, [r]);
      }
    }
    for (const name of order) {
      const stageRows = byStage.get(name)!;
      const readings = stageRows
        .map((r) => {
          const tMin = numberOr(cell(pltt, r, 'PLTT_TMIN')) ?? (numberOr(cell(pltt, r, 'PLTT_TIME')) as number);
          const pressure = numberOr(cell(pltt, r, 'PLTT_PRES'));
          const load = numberOr(cell(pltt, r, 'PLTT_LOAD'));
          if (pressure === undefined && load === undefined) at(r.line, 'PLTT', 'PLTT_LOAD', 'the reading has neither a load nor a plate pressure');
          const gauges: Record<string, number> = {};
          used.forEach((hd, i) => {
            const value = numberOr(cell(pltt, r, hd));
            if (value === undefined) at(r.line, 'PLTT', hd, 'empty: every reading of a test gives every gauge the test uses');
            else gauges[keys[i]] = value;
          });
          const rem = textOr(cell(pltt, r, 'PLTT_REM'));
          const pressureKpa = pressure ?? (plate && load !== undefined ? Math.round(platePressureKpa(plate, load) * 100) / 100 : 0);
          return { line: r.line, rem, reading: { tMin, pressureKpa, gauges } };
        })
        .sort((a, b) => a.reading.tMin - b.reading.tMin);
      const last = readings[readings.length - 1].reading.pressureKpa;
      const branchText = textOr(cell(pltt, stageRows[0], 'PLTT_BRCH'));
      if (branchText !== undefined && !(RECORD_BRANCHES as readonly string[]).includes(branchText))
        at(stageRows[0].line, 'PLTT', 'PLTT_BRCH', `"${branchText}" is not a branch (${RECORD_BRANCHES.join(', ')})`);
      const seating =
        plate && seatKn !== undefined && seatKn > 0 && stages.length === 0 && Math.abs(plateAreaM2(plate) * last - seatKn) <= 0.05 * seatKn + 0.05;
      const inferred = seating ? 'seating' : last < previousPressure ? 'unloading' : c === 0 ? 'loading' : 'reloading';
      const branch = (branchText as TestRecord['stages'][number]['branch'] | undefined) ?? inferred;
      const targetKpa = numberOr(cell(pltt, stageRows[0], 'PLTT_TGT')) ?? Math.round(last * 10) / 10;
      previousPressure = last;
      stageNames.push(name);
      const index = stages.length;
      stages.push({ index, branch, targetKpa, readings: readings.map((r) => r.reading) });
      for (const r of readings) if (r.rem) events.push({ stage: index, tMin: r.reading.tMin, kind: 'note', text: r.rem });
    }
  }
  // Stage numbers of the file are kept when they are whole numbers rising through the test.
  const numbers = stageNames.map(Number);
  if (numbers.every((n, i) => Number.isInteger(n) && n >= 0 && n <= 10_000 && (i === 0 || n > numbers[i - 1]) && /^\d+$/.test(stageNames[i]))) {
    stages.forEach((s, i) => {
      s.index = numbers[i];
    });
    for (const e of events) e.stage = numbers[e.stage as number];
  }
  if (problems.size > before || !plate) return null;

  const method = textOr(g('PLTG_METH'));
  // The export writes a procedure's name in ASCII; a procedure id is taken as well.
  const procedureId = method === undefined ? undefined : PROCEDURE_PROFILES.find((p) => toAscii(p.name).text === method || p.id === method)?.id;
  // The seating stage's target stands for the seating pressure when it gives the same PLTG_SEAT (0.1 kN).
  const seatingStage = stages.find((s) => s.branch === 'seating');
  const seatingKpa =
    seatKn === undefined
      ? undefined
      : seatingStage && Math.abs(plateForceKn(plate, seatingStage.targetKpa) - seatKn) <= 0.05 + 1e-9
        ? seatingStage.targetKpa
        : Math.round(platePressureKpa(plate, seatKn) * 100) / 100;
  const draft = {
    format: RECORD_FORMAT,
    version: RECORD_VERSION,
    metadata: prune({
      project: project.name,
      client: project.client,
      site: project.site,
      pit: test.locationId,
      testDate: textOr(g('PLTG_DATE')),
      crew: textOr(g('PLTG_CREW')),
      weather: textOr(g('PLTG_ENV')),
      notes:
        [ownRemarks(textOr(g('PLTG_REM'))), method !== undefined && procedureId === undefined ? `Method: ${method}` : undefined].filter(Boolean).join('; ') ||
        undefined,
    }),
    plate,
    plan: prune({ procedureId, seatingPressureKpa: seatingKpa }),
    ground: prune({ description: textOr(g('PLTG_SOIL')), testDepthM: Number(test.depth), waterTableBelowTestM: numberOr(g('PLTG_WTBT')) }),
    gauges: keys.map((key) => ({ key })),
    stages,
    ...(events.length ? { events } : {}),
  };
  const record = validateRecord(prune(draft), (path, message) =>
    at(first.line, 'PLTG', undefined, `test ${test.reference}: ${path.join('.') || '(record)'}: ${message}`),
  );
  return record;
}

/** Checks the units of the columns the import reads. */
function checkUnits(group: Ags4Group, problems: ProblemList): void {
  group.headings.forEach((heading, i) => {
    const expected = EXPECTED_UNITS[heading];
    if (expected !== undefined && group.units[i] !== expected)
      problems.add({
        line: group.headerLines.unit,
        group: group.name,
        heading,
        rule: SETTLESCOPE,
        message: `read in ${expected}; the file gives "${group.units[i]}" (units are not converted)`,
      });
  });
}

/** Reads the plate loading tests of an AGS4 file: all of them, or every problem and none. */
export function importAgs4(text: string): Ags4Import {
  const checked = checkAgs4(text);
  const { ignoredGroups } = checked;
  if (checked.problems.length > 0) return { ok: false, problems: checked.problems, omitted: checked.omitted, ignoredGroups };
  const problems = new ProblemList();
  const { groups } = checked.file;
  const pltg = byName(groups, 'PLTG');
  const pltt = byName(groups, 'PLTT');
  if (!pltg || pltg.rows.length === 0 || !pltt) {
    problems.add({
      group: pltg ? 'PLTT' : 'PLTG',
      rule: SETTLESCOPE,
      message: pltg ? 'the file has no PLTT group: there are no readings' : 'the file holds no plate loading tests (no PLTG rows)',
    });
    return { ok: false, problems: problems.sorted(), omitted: problems.omitted, ignoredGroups };
  }
  checkUnits(pltg, problems);
  checkUnits(pltt, problems);
  const proj = byName(groups, 'PROJ');
  const projRow = proj?.rows[0];
  const project =
    projRow && proj
      ? { name: textOr(cell(proj, projRow, 'PROJ_NAME')), client: textOr(cell(proj, projRow, 'PROJ_CLNT')), site: textOr(cell(proj, projRow, 'PROJ_LOC')) }
      : {};

  const tests = new Map<string, TestRows>();
  const testKey = (group: Ags4Group, row: Ags4Row) => ['LOCA_ID', 'PLTG_DPTH', 'PLTG_TESN'].map((k) => cell(group, row, k) ?? '').join('\u0000');
  for (const row of pltg.rows) {
    const id = testKey(pltg, row);
    const test = tests.get(id) ?? {
      locationId: cell(pltg, row, 'LOCA_ID') ?? '',
      depth: cell(pltg, row, 'PLTG_DPTH') ?? '',
      reference: cell(pltg, row, 'PLTG_TESN') ?? '',
      cycles: [],
      readings: new Map<string, Ags4Row[]>(),
    };
    test.cycles.push({ line: row.line, cycle: cell(pltg, row, 'PLTG_CYC') ?? '', row });
    tests.set(id, test);
  }
  for (const row of pltt.rows) {
    const test = tests.get(testKey(pltt, row));
    if (!test) continue; // the AGS4 parent check has named it
    const cycle = cell(pltt, row, 'PLTG_CYC') ?? '';
    const list = test.readings.get(cycle);
    if (list) list.push(row);
    else test.readings.set(cycle, [row]);
  }
  const out: ImportedPlateTest[] = [];
  if (problems.size === 0) {
    for (const test of tests.values()) {
      test.cycles.sort((a, b) => cycleOrder(a.cycle, b.cycle));
      const record = readTest(test, pltg, pltt, project, problems);
      if (record) out.push({ locationId: test.locationId, reference: test.reference, depthM: Number(test.depth), line: test.cycles[0].line, record });
    }
  }
  if (problems.size > 0) return { ok: false, problems: problems.sorted(), omitted: problems.omitted, ignoredGroups };
  const loca = byName(groups, 'LOCA');
  const locations = (loca?.rows ?? []).map((r) => ({
    id: cell(loca!, r, 'LOCA_ID') ?? '',
    ...prune({ remarks: textOr(cell(loca!, r, 'LOCA_REM')), finalDepthM: numberOr(cell(loca!, r, 'LOCA_FDEP')) }),
  }));
  return { ok: true, tests: out, locations: locations.filter((l) => out.some((t) => t.locationId === l.id)), ignoredGroups };
}
