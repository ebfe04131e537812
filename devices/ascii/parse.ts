import type { AsciiProfile } from '@shared/devices/schema';

/** Millimetres per printed unit; `counts` are turned into mm by the profile's `scale` alone. */
export const MM_PER_UNIT: Record<AsciiProfile['unit'], number> = { mm: 1, in: 25.4, um: 0.001, counts: 1 };

export type IndicatorParse = { ok: true; valueMm: number; raw: string } | { ok: false; reason: string };

/** A plain decimal number: optional sign, digits, optional fraction. No exponent, hex, spaces or "Infinity". */
const DECIMAL = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)$/;

const compiled = new WeakMap<AsciiProfile, RegExp>();

/**
 * The profile's `pattern` as an anchored regular expression: a line must match it whole.
 * Throws a TypeError naming "pattern" if it does not compile or lacks the named group `value`.
 */
export function indicatorPattern(profile: AsciiProfile): RegExp {
  let re = compiled.get(profile);
  if (re) return re;
  try {
    re = new RegExp(`^(?:${profile.pattern})$`);
  } catch (error) {
    throw new TypeError(`"pattern" of profile "${profile.id}" is not a valid regular expression: ${(error as Error).message}`);
  }
  if (!/\(\?<value>/.test(profile.pattern)) {
    throw new TypeError(`"pattern" of profile "${profile.id}" needs a named group "value"`);
  }
  compiled.set(profile, re);
  return re;
}

/** Millimetres represented by one printed number of this profile (unit, scale and sign together). */
export function mmPerDeviceNumber(profile: AsciiProfile): number {
  return MM_PER_UNIT[profile.unit] * profile.scale * profile.sign;
}

/**
 * Reads one line (terminator removed) of an indicator. Anything that does not match the profile's
 * pattern exactly, or whose `value` group is not a plain decimal number, is rejected with a reason:
 * a doubtful line never becomes a number. ASCII lines carry no checksum, so patterns should fix the
 * width of the number: then inserted noise or a fragment glued to a line always fails to match.
 */
export function parseIndicatorLine(profile: AsciiProfile, line: string): IndicatorParse {
  const match = indicatorPattern(profile).exec(line);
  if (!match) return { ok: false, reason: 'line does not match the profile pattern' };
  const text = match.groups?.value;
  if (text === undefined || !DECIMAL.test(text)) {
    return { ok: false, reason: `value "${text ?? ''}" is not a decimal number` };
  }
  const valueMm = Number(text) * mmPerDeviceNumber(profile);
  if (!Number.isFinite(valueMm)) return { ok: false, reason: `value "${text}" is out of range` };
  // Normalise −0 so "-000.000" and "+000.000" read the same.
  return { ok: true, valueMm: valueMm === 0 ? 0 : valueMm, raw: line };
}
