/**
 * Settlescope test records → one AGS4 file (edition 4.1.1): PROJ, TRAN, UNIT, TYPE, ABBR, DICT, LOCA per
 * test location, PLTG per test and load cycle, PLTT per reading. What the dictionary cannot hold goes
 * into DICT headings (plate shape and size, gauge keys, gauges beyond four, the stage's branch and target,
 * the plate pressure, times finer than 0.1 min, the mean settlement, crew, ground and water table). Two
 * things are settled by stated choices, each named in the notes, in PLTG_REM and in TRAN_REM:
 * - a square plate has no diameter: PLTG_PDIA holds the equivalent-area diameter (PLTG_PSHP and PLTG_PSIZ
 *   keep the shape and side);
 * - PLTT_TIME (a key, 0.1 min) cannot tell apart two readings of one stage within the same 0.1 min: of
 *   such readings only the last is written (PLTT_TMIN keeps its exact time); the count left out is stated.
 * Text becomes printable ASCII (° → deg, é → e); that too is stated.
 */
import { plateForceKn } from '../domain/plate';
import { meanSettlement } from '../interpretation/reduction';
import { findProfile } from '../procedures/profiles';
import type { RecordReading, TestRecord } from '../records/schema';
import type { HeadingDef } from './dictionary';
import {
  droppedRemark,
  equivalentDiameterMm,
  squarePlateRemark,
  extraGaugeColumn,
  gaugeHeading,
  loadCycles,
  PLTG_USER,
  PLTT_USER,
  timeSlot,
  toAscii,
} from './plate-map';
import { type Ags4Table, type Ags4Value, dictionaryColumns, writeAgs4 } from './write';
import { AGS4_EDITION, formatDecimals } from './values';

/** Results of the interpretation that PLTG holds. Null where the interpretation gives none. */
export interface PlateResults {
  /** Per load cycle (1, 2…): the strain modulus and the factors of the second-order fit s = a0 + a1·σ0 + a2·σ0². */
  cycles: { cycle: number; modulusMpa: number | null; a0: number; a1: number; a2: number }[];
  ev2Mpa: number | null;
  subgradeMpaPerM: number | null;
  elasticMpa: number | null;
}

export interface PlateTestExport {
  /** LOCA_ID of the test's location. */
  locationId: string;
  /** PLTG_TESN: unique per location and depth. */
  reference: string;
  /** PLTG_DPTH, m. */
  depthM: number;
  record: TestRecord;
  /** TEST_STAT. */
  status?: string;
  /** PLTG_CONT. */
  organisation?: string;
  results?: PlateResults;
}

export interface Ags4ExportInput {
  project: { id: string; name?: string; site?: string; client?: string; contractor?: string };
  transmission: {
    issue: number;
    date: string;
    status: string;
    producer: string;
    recipient?: string;
    description?: string;
    /** Further remarks for TRAN_REM (e.g. tests left out of the file and why). */
    remarks?: string[];
  };
  locations: { id: string; remarks?: string; finalDepthM?: number }[];
  tests: PlateTestExport[];
}

export interface Ags4Export {
  text: string;
  /** The stated choices the file needed (readings left out, square plates, text changed to ASCII). */
  notes: string[];
}

const pick = (o: object, key: string): unknown => (o && typeof o === 'object' ? (o as Record<string, unknown>)[key] : undefined);
const finite = (x: unknown): number | null => (typeof x === 'number' && Number.isFinite(x) ? x : null);
const applied = (finding: unknown): unknown => (pick(finding as object, 'applies') === true ? pick(finding as object, 'result') : undefined);

/**
 * The PLTG results of an interpretation (as the analysis gives it or as saved with a signature): Ev1 and
 * Ev2 with their fits, k at the fixed settlement (else at the fixed pressure), the secant elastic modulus.
 * Read defensively: a saved interpretation may come from an older version of the analysis.
 */
export function plateResults(analysis: unknown): PlateResults {
  const moduli = applied(pick(analysis as object, 'deformationModuli')) as object | undefined;
  const branch = (key: string, cycle: number) => {
    const b = moduli ? (pick(moduli, key) as object | null | undefined) : undefined;
    if (!b) return [];
    const [a0, a1, a2] = ['a0', 'a1', 'a2'].map((k) => finite(pick(b, k)));
    return a0 === null || a1 === null || a2 === null ? [] : [{ cycle, modulusMpa: finite(pick(b, 'evMnM2')), a0, a1, a2 }];
  };
  const subgrade = pick(analysis as object, 'subgradeModulus') as object | undefined;
  const k = (key: string) => finite(pick(applied(subgrade ? pick(subgrade, key) : undefined) as object, 'kMnM3'));
  const cycles = [...branch('ev1', 1), ...branch('ev2', 2)];
  return {
    cycles,
    ev2Mpa: cycles.find((c) => c.cycle === 2)?.modulusMpa ?? null,
    subgradeMpaPerM: k('atSettlement') ?? k('atPressure'),
    elasticMpa: finite(pick(applied(pick(analysis as object, 'elasticModulus')) as object, 'eMpa')),
  };
}

/** Collects the stated choices while texts and readings are written. */
class Notes {
  readonly list: string[] = [];
  private asciiChanged = 0;

  text(value: string | undefined): string | undefined {
    if (value === undefined) return undefined;
    const ascii = toAscii(value);
    if (ascii.changed) this.asciiChanged++;
    return ascii.text;
  }

  all(): string[] {
    return this.asciiChanged
      ? [...this.list, `${this.asciiChanged} text${this.asciiChanged === 1 ? '' : 's'} changed to printable ASCII (AGS4 allows no other characters)`]
      : this.list;
  }
}

/** Per stage, the readings PLTT_TIME can key: the last of each 0.1 min slot. */
function keyedReadings(readings: readonly RecordReading[]): { kept: RecordReading[]; dropped: number } {
  const bySlot = new Map<string, RecordReading>();
  for (const r of readings) bySlot.set(timeSlot(r.tMin), r);
  const kept = [...bySlot.values()];
  return { kept, dropped: readings.length - kept.length };
}

const DATE = /^\d{4}-\d{2}-\d{2}$/;

function testRows(raw: PlateTestExport, notes: Notes) {
  const test = { ...raw, locationId: notes.text(raw.locationId)!, reference: notes.text(raw.reference)! };
  const { record } = test;
  const plate = record.plate;
  const cycles = loadCycles(record.stages);
  const keys = record.gauges.map((g) => g.key);
  const square = plate.shape === 'square';
  const profile = record.plan?.procedureId ? findProfile(record.plan.procedureId) : undefined;
  const testDate = record.metadata?.testDate;
  const id = `${test.locationId} ${test.reference}`;
  const general: string[] = [];
  if (record.metadata?.notes) general.push(notes.text(record.metadata.notes)!);
  if (testDate && !DATE.test(testDate)) general.push(`Test date: ${notes.text(testDate)}`);
  if (square) general.push(squarePlateRemark(formatDecimals(plate.sizeMm, 1)));
  const eventsAt = new Map<string, string[]>();
  const loose: string[] = [];

  const plttRows: Record<string, Ags4Value>[] = [];
  const droppedByCycle = new Map<number, number>();
  record.stages.forEach((stage, s) => {
    const cycle = cycles[s];
    const { kept, dropped } = keyedReadings(stage.readings);
    if (dropped) droppedByCycle.set(cycle, (droppedByCycle.get(cycle) ?? 0) + dropped);
    for (const event of record.events ?? []) {
      if (event.stage !== stage.index) continue;
      // An event goes with the reading nearest its time (the stage's first when it has none).
      const at = event.tMin === undefined ? kept[0] : kept.reduce((a, b) => (Math.abs(b.tMin - event.tMin!) < Math.abs(a.tMin - event.tMin!) ? b : a));
      const slot = `${stage.index}|${timeSlot(at.tMin)}`;
      eventsAt.set(slot, [...(eventsAt.get(slot) ?? []), notes.text(event.text)!]);
    }
    for (const r of kept) {
      const gauges = keys.map((k) => r.gauges[k]);
      plttRows.push({
        LOCA_ID: test.locationId,
        PLTG_DPTH: test.depthM,
        PLTG_TESN: test.reference,
        PLTG_CYC: String(cycle),
        PLTT_STG: String(stage.index),
        PLTT_TIME: timeSlot(r.tMin),
        PLTT_LOAD: plateForceKn(plate, r.pressureKpa),
        ...Object.fromEntries(gauges.map((g, i) => [gaugeHeading(i + 1), g])),
        PLTT_REM: eventsAt.get(`${stage.index}|${timeSlot(r.tMin)}`)?.join('; '),
        PLTT_BRCH: stage.branch,
        PLTT_TGT: stage.targetKpa,
        PLTT_PRES: r.pressureKpa,
        PLTT_TMIN: r.tMin,
        PLTT_MSET: meanSettlement(gauges),
      });
    }
  });
  for (const event of record.events ?? []) if (event.stage === undefined) loose.push(notes.text(event.text)!);
  for (const [cycle, dropped] of droppedByCycle)
    notes.list.push(
      `${id} cycle ${cycle}: ${dropped} reading${dropped === 1 ? '' : 's'} left out (a later reading of the same stage falls in the same 0.1 min of PLTT_TIME)`,
    );
  if (square) notes.list.push(`${id}: square plate, PLTG_PDIA holds the equivalent-area diameter`);

  const results = test.results;
  const pltgRows = [...new Set(cycles)].map((cycle) => {
    const fit = results?.cycles.find((c) => c.cycle === cycle);
    const dropped = droppedByCycle.get(cycle);
    const remarks = [...general, ...(cycle === 1 ? loose : []), ...(dropped ? [droppedRemark(dropped)] : [])];
    return {
      LOCA_ID: test.locationId,
      PLTG_DPTH: test.depthM,
      PLTG_TESN: test.reference,
      PLTG_CYC: String(cycle),
      PLTG_PDIA: square ? equivalentDiameterMm(plate.sizeMm) : plate.sizeMm,
      PLTG_SEAT: record.plan?.seatingPressureKpa === undefined ? null : plateForceKn(plate, record.plan.seatingPressureKpa),
      PLTG_FA0: fit?.a0,
      PLTG_FA1: fit?.a1,
      PLTG_FA2: fit?.a2,
      PLTG_SMOD: fit?.modulusMpa,
      PLTG_EV2: cycle === 2 ? results?.ev2Mpa : null,
      PLTG_MOSR: cycle === 1 ? results?.subgradeMpaPerM : null,
      PLTG_EMOD: cycle === 1 ? results?.elasticMpa : null,
      PLTG_DATE: testDate && DATE.test(testDate) ? testDate : null,
      PLTG_REM: remarks.join('; '),
      PLTG_ENV: notes.text(record.metadata?.weather),
      PLTG_METH: notes.text(profile?.name ?? record.plan?.procedureId),
      PLTG_CONT: notes.text(test.organisation),
      TEST_STAT: notes.text(test.status),
      PLTG_PSHP: plate.shape,
      PLTG_PSIZ: plate.sizeMm,
      PLTG_GAUG: keys.join('|'),
      PLTG_CREW: notes.text(record.metadata?.crew),
      PLTG_SOIL: notes.text(record.ground?.description),
      PLTG_WTBT: record.ground?.waterTableBelowTestM,
    };
  });
  return {
    pltgRows,
    plttRows,
    gauges: keys.length,
    fineTimes: plttRows.some((r) => formatDecimals(r.PLTT_TMIN as number, 3) !== formatDecimals(Number(r.PLTT_TIME), 3)),
  };
}

const PLTG_HEADINGS = [
  'LOCA_ID',
  'PLTG_DPTH',
  'PLTG_TESN',
  'PLTG_CYC',
  'PLTG_PDIA',
  'PLTG_SEAT',
  'PLTG_FA0',
  'PLTG_FA1',
  'PLTG_FA2',
  'PLTG_SMOD',
  'PLTG_EV2',
  'PLTG_MOSR',
  'PLTG_EMOD',
  'PLTG_DATE',
  'PLTG_REM',
  'PLTG_ENV',
  'PLTG_METH',
  'PLTG_CONT',
  'TEST_STAT',
];

/** Writes the tests as one AGS4 file, with the notes of every stated choice it needed. */
export function exportAgs4(input: Ags4ExportInput): Ags4Export {
  const notes = new Notes();
  const tests = input.tests.map((t) => testRows(t, notes));
  const gauges = Math.max(1, ...tests.map((t) => t.gauges));
  const userPltt: HeadingDef[] = [
    PLTT_USER.branch,
    PLTT_USER.target,
    PLTT_USER.pressure,
    ...(tests.some((t) => t.fineTimes) ? [PLTT_USER.time] : []),
    PLTT_USER.mean,
    ...Array.from({ length: Math.max(0, gauges - 4) }, (_, i) => extraGaugeColumn(i + 5)),
  ];
  const text = (value: string | undefined) => notes.text(value);
  const proj: Ags4Table = {
    group: 'PROJ',
    columns: dictionaryColumns('PROJ', ['PROJ_ID', 'PROJ_NAME', 'PROJ_LOC', 'PROJ_CLNT', 'PROJ_CONT']),
    rows: [
      {
        PROJ_ID: text(input.project.id),
        PROJ_NAME: text(input.project.name),
        PROJ_LOC: text(input.project.site),
        PROJ_CLNT: text(input.project.client),
        PROJ_CONT: text(input.project.contractor),
      },
    ],
  };
  const loca: Ags4Table = {
    group: 'LOCA',
    columns: dictionaryColumns('LOCA', ['LOCA_ID', 'LOCA_TYPE', 'LOCA_REM', 'LOCA_FDEP']),
    rows: input.locations.map((l) => ({ LOCA_ID: text(l.id), LOCA_TYPE: 'TP', LOCA_REM: text(l.remarks), LOCA_FDEP: l.finalDepthM })),
  };
  const tran = {
    producer: text(input.transmission.producer),
    status: text(input.transmission.status),
    description: text(input.transmission.description ?? 'Plate loading tests'),
    recipient: text(input.transmission.recipient),
    remarks: (input.transmission.remarks ?? []).map((r) => text(r)!),
  };
  const all = notes.all();
  const tables: Ags4Table[] = [
    proj,
    {
      group: 'TRAN',
      columns: dictionaryColumns('TRAN', [
        'TRAN_ISNO',
        'TRAN_DATE',
        'TRAN_PROD',
        'TRAN_STAT',
        'TRAN_DESC',
        'TRAN_AGS',
        'TRAN_RECV',
        'TRAN_DLIM',
        'TRAN_RCON',
        'TRAN_REM',
      ]),
      rows: [
        {
          TRAN_ISNO: String(input.transmission.issue),
          TRAN_DATE: input.transmission.date,
          TRAN_PROD: tran.producer,
          TRAN_STAT: tran.status,
          TRAN_DESC: tran.description,
          TRAN_AGS: AGS4_EDITION,
          TRAN_RECV: tran.recipient,
          TRAN_DLIM: '|',
          TRAN_RCON: '+',
          TRAN_REM: [
            'User-defined headings (DICT) hold what PLTG and PLTT cannot: plate shape and size, gauge keys, gauges beyond four, stage branch and target pressure, plate pressure, times finer than 0.1 min, mean settlement',
            ...all,
            ...tran.remarks,
          ].join('; '),
        },
      ],
    },
    loca,
    {
      group: 'PLTG',
      columns: dictionaryColumns('PLTG', PLTG_HEADINGS),
      userColumns: Object.values(PLTG_USER),
      rows: tests.flatMap((t) => t.pltgRows),
    },
    {
      group: 'PLTT',
      columns: dictionaryColumns('PLTT', [
        'LOCA_ID',
        'PLTG_DPTH',
        'PLTG_TESN',
        'PLTG_CYC',
        'PLTT_STG',
        'PLTT_TIME',
        'PLTT_LOAD',
        'PLTT_SET1',
        'PLTT_SET2',
        'PLTT_SET3',
        'PLTT_SET4',
        'PLTT_REM',
      ]),
      userColumns: userPltt,
      rows: tests.flatMap((t) => t.plttRows),
    },
  ];
  return { text: writeAgs4(tables, [{ heading: 'LOCA_TYPE', code: 'TP', description: 'Trial pit' }]), notes: all };
}
