/**
 * AGS4 values (edition 4.1.1): how a number is written for its data TYPE, and whether a written value
 * matches the TYPE and UNIT its column declares (AGS4 rule 8). Every check answers a message or null.
 */

/** The AGS4 edition Settlescope writes and checks against. */
export const AGS4_EDITION = '4.1.1';

/** The data types of the AGS4 TYPE group; nDP, nSF and nSCI stand for families (2DP, 3SF, 1SCI…). */
export const AGS4_TYPE_NAMES: Readonly<Record<string, string>> = {
  ID: 'Unique identifier',
  PA: 'Text listed in ABBR group',
  PT: 'Text listed in TYPE group',
  PU: 'Text listed in UNIT group',
  X: 'Text',
  XN: 'Text or numeric',
  T: 'Elapsed time',
  DT: 'Date time',
  MC: 'Moisture content',
  DMS: 'Degrees, minutes and seconds',
  YN: 'Yes or no',
  RL: 'Record link',
  U: 'Value with variable format',
};

const FAMILY = /^(\d{1,2})(DP|SF|SCI)$/;

/** A description for the TYPE group, or null when the name is no AGS4 data type. */
export function typeDescription(type: string): string | null {
  const family = FAMILY.exec(type);
  if (family) {
    const n = Number(family[1]);
    if (family[2] === 'DP') return `Value; ${n} decimal place${n === 1 ? '' : 's'}`;
    if (family[2] === 'SF') return `Value; ${n} significant figure${n === 1 ? '' : 's'}`;
    return `Scientific notation; ${n} decimal place${n === 1 ? '' : 's'}`;
  }
  return AGS4_TYPE_NAMES[type] ?? null;
}

/** x rounded half away from zero to n decimals, without binary surprises such as 1.005 → 1.00 (12 significant digits settle the product first). */
function roundTo(x: number, n: number): number {
  const scale = 10 ** n;
  const rounded = Math.round(Number((Math.abs(x) * scale).toPrecision(12))) / scale;
  return x < 0 ? -rounded : rounded;
}

/** A number with exactly n decimal places (`nDP`); never "-0.00". */
export function formatDecimals(x: number, n: number): string {
  const r = roundTo(x, n);
  return (r === 0 ? 0 : r).toFixed(n);
}

/** A number to n significant figures (`nSF`), written out without an exponent: 0.012, 1.2, 120. */
export function formatSignificant(x: number, n: number): string {
  if (x === 0) return (0).toFixed(Math.max(0, n - 1));
  const magnitude = Math.floor(Math.log10(Math.abs(x)));
  const decimals = n - 1 - magnitude;
  if (decimals >= 0) {
    const text = formatDecimals(x, decimals);
    // Rounding can carry into a new digit (9.96 → 10.0 at 3SF): write it again at its new magnitude.
    const again = n - 1 - Math.floor(Math.log10(Math.abs(Number(text))));
    return again < decimals ? formatDecimals(x, Math.max(0, again)) : text;
  }
  const unit = 10 ** -decimals;
  return String(roundTo(x / unit, 0) * unit);
}

/** A number to n decimals in scientific notation (`nSCI`): 1.2E3. */
export function formatScientific(x: number, n: number): string {
  return x.toExponential(n).toUpperCase().replace(/E\+?/, 'E');
}

/** Writes a number for its AGS4 type (nDP, nSF, nSCI, U); other types take numbers as plain text. */
export function formatNumber(x: number, type: string): string {
  if (!Number.isFinite(x)) throw new RangeError(`not a finite number: ${x}`);
  const family = FAMILY.exec(type);
  if (family?.[2] === 'DP') return formatDecimals(x, Number(family[1]));
  if (family?.[2] === 'SF') return formatSignificant(x, Number(family[1]));
  if (family?.[2] === 'SCI') return formatScientific(x, Number(family[1]));
  return String(x);
}

const PLAIN_NUMBER = /^-?\d+(\.\d+)?$/;
const ANY_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** A regular expression for a DT value written in the format its UNIT names (yyyy-mm-dd, hh:mm, yyyy-mm-ddThh:mm:ss…). */
export function dateTimePattern(unit: string): RegExp | null {
  if (!/^[ymdhsTZ:+.\-/ ]+$/.test(unit) || !/[ymdhs]/.test(unit)) return null;
  const body = unit.replace(/[.+]/g, (c) => `\\${c}`).replace(/[ymdhs]/g, '\\d');
  return new RegExp(`^${body}$`);
}

/** The calendar date in a `yyyy-mm-dd…` value is real (no 2024-02-30). */
function realDate(value: string, unit: string): boolean {
  const at = unit.indexOf('yyyy-mm-dd');
  if (at < 0) return true;
  const [y, m, d] = value
    .slice(at, at + 10)
    .split('-')
    .map(Number);
  const date = new Date(Date.UTC(y, m - 1, d));
  return date.getUTCFullYear() === y && date.getUTCMonth() === m - 1 && date.getUTCDate() === d;
}

/**
 * Why a value does not match its column's TYPE (and, for DT, UNIT), or null when it does. An empty value
 * matches every type (AGS4 rule 12: only KEY and REQUIRED headings must hold data). PA, PT and PU are
 * checked against the ABBR, TYPE and UNIT groups elsewhere; X, ID, XN, RL, T and MC are text here.
 */
export function valueProblem(value: string, type: string, unit: string): string | null {
  if (value === '') return null;
  const family = FAMILY.exec(type);
  if (family) {
    const n = Number(family[1]);
    if (family[2] === 'DP') {
      const ok = n === 0 ? /^-?\d+$/.test(value) : new RegExp(`^-?\\d+\\.\\d{${n}}$`).test(value);
      return ok ? null : `"${value}" is not a number with exactly ${n} decimal place${n === 1 ? '' : 's'} (${type})`;
    }
    if (family[2] === 'SF') {
      return PLAIN_NUMBER.test(value) && formatSignificant(Number(value), n) === value
        ? null
        : `"${value}" is not a number to ${n} significant figure${n === 1 ? '' : 's'} (${type})`;
    }
    return new RegExp(`^-?\\d\\.\\d{${n}}E[+-]?\\d+$`).test(value)
      ? null
      : `"${value}" is not in scientific notation with ${n} decimal place${n === 1 ? '' : 's'} (${type})`;
  }
  if (type === 'U') return ANY_NUMBER.test(value) ? null : `"${value}" is not a number (U)`;
  if (type === 'YN') return /^(Y|N)$/i.test(value) ? null : `"${value}" is not Y or N (YN)`;
  if (type === 'DT') {
    const pattern = dateTimePattern(unit);
    if (!pattern) return `the UNIT "${unit}" of a DT column must name a date/time format such as yyyy-mm-dd`;
    return pattern.test(value) && realDate(value, unit) ? null : `"${value}" is not a date/time in the format ${unit} (DT)`;
  }
  return null;
}
