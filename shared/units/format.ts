/**
 * Numbers in words people read: every quantity rounded to what its unit can honestly show, the same on
 * every screen and in every log line. A figure carries no more places than its instruments resolve
 * (common practice for site records: pressure to 0.1 kPa, settlement to 0.01 mm, rate to 0.001 mm/min).
 */

/** Decimal places per unit; a unit not listed gets {@link DEFAULT_PLACES}. */
export const UNIT_PLACES: Readonly<Record<string, number>> = {
  kPa: 1,
  MPa: 2,
  bar: 1,
  psi: 0,
  kN: 2,
  mm: 2,
  'mm/min': 3,
  min: 1,
  s: 0,
  h: 1,
  '%': 1,
  'MN/m³': 1,
  'MN/m3': 1,
  '°': 2,
  '°C': 1,
};

export const DEFAULT_PLACES = 2;

/** Decimal places for a unit (case-sensitive: "MPa" and "mPa" differ). */
export function unitPlaces(unit: string | null | undefined): number {
  return unit != null && unit in UNIT_PLACES ? UNIT_PLACES[unit] : DEFAULT_PLACES;
}

/**
 * A number to a fixed number of places, never "-0.00": a value that rounds to zero is shown as zero.
 * "—" for null, undefined, NaN or an infinity (nothing honest to print).
 */
export function formatFixed(value: number | null | undefined, places: number): string {
  if (value == null || !Number.isFinite(value)) return '—';
  const text = value.toFixed(places);
  // "-0.00" and "-0" carry a sign the figure does not have.
  return /^-0(\.0*)?$/.test(text) ? text.slice(1) : text;
}

/** A value in its unit's precision, without the unit: "7.1" for 7.07355 kPa. */
export function formatValue(value: number | null | undefined, unit: string | null | undefined): string {
  return formatFixed(value, unitPlaces(unit));
}

/** A value with its unit: "7.1 kPa", "-0.012 mm/min", "—" when unknown (no unit after a dash). */
export function formatQuantity(value: number | null | undefined, unit: string | null | undefined): string {
  const text = formatValue(value, unit);
  return text === '—' || !unit ? text : `${text} ${unit}`;
}

/**
 * A planned figure (a stage target, a limit someone typed) in its unit's precision with trailing zeros
 * dropped: "300" and "7.1" rather than "300.0" and "7.07355302630646". Measured values keep their fixed
 * places through {@link formatValue}, so their digits do not jump as they change.
 */
export function formatPlanned(value: number | null | undefined, unit: string | null | undefined): string {
  const text = formatValue(value, unit);
  return text.includes('.') ? text.replace(/\.?0+$/, '') : text;
}
