/**
 * What Settlescope's test record and the AGS4 plate loading groups (PLTG, PLTT; edition 4.1.1) share, and
 * the user-defined headings (DICT) for what the dictionary cannot hold. Used by both the export and the
 * import so that the two read the same columns the same way.
 */
import type { RecordStage } from '../records/schema';
import type { HeadingDef } from './dictionary';
import { formatDecimals } from './values';

const user = (name: string, type: string, description: string, unit = ''): HeadingDef => ({ name, status: 'OTHER', unit, type, description });

/** Gauges beyond the dictionary's four: PLTT_S5 … PLTT_S12 (the record holds at most 12). */
export const extraGaugeHeading = (n: number) => `PLTT_S${n}`;

/** The gauge column of the n-th gauge (1-based). */
export const gaugeHeading = (n: number) => (n <= 4 ? `PLTT_SET${n}` : extraGaugeHeading(n));

/** PLTG headings Settlescope adds through DICT. */
export const PLTG_USER = {
  shape: user('PLTG_PSHP', 'X', 'Plate shape: circular or square'),
  size: user('PLTG_PSIZ', '1DP', 'Plate diameter (circular) or side (square)', 'mm'),
  gauges: user('PLTG_GAUG', 'X', 'Keys of the settlement gauges in column order, separated by the concatenation delimiter'),
  crew: user('PLTG_CREW', 'X', 'Test crew'),
  soil: user('PLTG_SOIL', 'X', 'Description of the ground at the test level'),
  water: user('PLTG_WTBT', '2DP', 'Depth of the water table below the test level', 'm'),
} as const;

/** PLTT headings Settlescope adds through DICT (gauges beyond four come from {@link extraGaugeColumn}). */
export const PLTT_USER = {
  branch: user('PLTT_BRCH', 'X', 'Branch of the load stage: seating, loading, unloading or reloading'),
  target: user('PLTT_TGT', '1DP', 'Target plate pressure of the load stage', 'kPa'),
  pressure: user('PLTT_PRES', '1DP', 'Mean plate pressure at the reading', 'kPa'),
  time: user('PLTT_TMIN', '3DP', 'Elapsed time in the stage, finer than PLTT_TIME', 'min'),
  mean: user('PLTT_MSET', '2DP', 'Mean settlement of the gauges', 'mm'),
} as const;

export const extraGaugeColumn = (n: number): HeadingDef => user(extraGaugeHeading(n), '2DP', `Settlement of gauge ${n}`, 'mm');

/** Units the import reads each column in (it converts none). */
export const EXPECTED_UNITS: Readonly<Record<string, string>> = {
  PLTG_DPTH: 'm',
  PLTG_PDIA: 'mm',
  PLTG_SEAT: 'kN',
  PLTG_PSIZ: 'mm',
  PLTG_WTBT: 'm',
  PLTT_TIME: 'min',
  PLTT_LOAD: 'kN',
  PLTT_TGT: 'kPa',
  PLTT_PRES: 'kPa',
  PLTT_TMIN: 'min',
  PLTT_MSET: 'mm',
  ...Object.fromEntries(Array.from({ length: 12 }, (_, i) => [gaugeHeading(i + 1), 'mm'])),
};

/** The type of PLTT_TIME, the dictionary's: two readings of one stage within the same 0.1 min share a key. */
export const TIME_DECIMALS = 1;

/** The PLTT_TIME key of a reading time. */
export const timeSlot = (tMin: number) => formatDecimals(tMin, TIME_DECIMALS);

/**
 * Load cycle (PLTG_CYC) of each stage: 1 from the start, and one more each time reloading begins after
 * another branch. A two-cycle modulus test gives 1 (seating, loading, unloading) and 2 (reloading…).
 */
export function loadCycles(stages: readonly Pick<RecordStage, 'branch'>[]): number[] {
  let cycle = 1;
  return stages.map((stage, i) => {
    if (i > 0 && stage.branch === 'reloading' && stages[i - 1].branch !== 'reloading') cycle++;
    return cycle;
  });
}

/** The remarks the export adds to PLTG_REM; the import leaves them out of the record's notes. */
export const squarePlateRemark = (sideMm: string) => `Square plate ${sideMm} mm: PLTG_PDIA is the equivalent-area diameter`;
export const droppedRemark = (count: number) => `${count} readings within 0.1 min of a later one left out`;
export const GENERATED_REMARKS = [/^Square plate \S+ mm: PLTG_PDIA is the equivalent-area diameter$/, /^\d+ readings within 0\.1 min of a later one left out$/];

/** Equivalent-area diameter of a square plate of side b: D = 2b/√π, so that πD²/4 = b². */
export const equivalentDiameterMm = (sideMm: number) => (2 * sideMm) / Math.sqrt(Math.PI);

const REPLACEMENTS: Readonly<Record<string, string>> = {
  '°': ' deg ',
  µ: 'u',
  μ: 'u',
  '·': '.',
  '×': 'x',
  '±': '+/-',
  '≤': '<=',
  '≥': '>=',
  '–': '-',
  '—': '-',
  '‘': "'",
  '’': "'",
  '“': '"',
  '”': '"',
  '…': '...',
  ß: 'ss',
  Æ: 'AE',
  æ: 'ae',
  Ø: 'O',
  ø: 'o',
};

/**
 * Text as printable ASCII (AGS4 rule 1): line breaks and tabs become spaces, accents are dropped
 * (é → e), superscripts become digits (m² → m2), a few signs get ASCII spellings (° → deg) and anything
 * else becomes "?". `changed` says whether the text had to change, so that the export can say so.
 */
export function toAscii(text: string): { text: string; changed: boolean } {
  const out = text
    .replace(/\r\n|[\r\n\t]/g, ' ')
    .replace(/[^ -~]/g, (c) => REPLACEMENTS[c] ?? c)
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .replace(/[^ -~]/g, '?')
    .replace(/ {2,}/g, ' ')
    .trim();
  return { text: out, changed: out !== text };
}
