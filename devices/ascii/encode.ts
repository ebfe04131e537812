import type { AsciiProfile } from '@shared/devices/schema';
import { mmPerDeviceNumber, parseIndicatorLine } from './parse';

/** How the number is printed, read back from the profile's `value` group. */
interface NumberLayout {
  /** 'always' prints + or −, 'negative' only −, 'never' allows no negative values. */
  sign: 'always' | 'negative' | 'never';
  /** Zero-padded width of the integer part; 0 means no padding. */
  intDigits: number;
  fracDigits: number;
}

interface LineTemplate {
  prefix: string;
  suffix: string;
  layout: NumberLayout;
}

/**
 * The `value` group forms an encoder understands: an optional sign class, `\d`, `\d{n}` or `\d+`, and an
 * optional `\.\d{m}` fraction, e.g. `(?<value>[+-]\d{3}\.\d{3})`.
 */
const VALUE_GROUP = /\(\?<value>(\[\+-\]\??|\[-\+\]\??|-\?)?\\d(?:\{(\d+)\}|(\+))?(?:\\\.\\d\{(\d+)\})?\)/;
const REGEX_SYNTAX = /[\\^$.*+?()[\]{}|]/;

const templates = new WeakMap<AsciiProfile, LineTemplate>();

function notEncodable(profile: AsciiProfile, why: string): TypeError {
  return new TypeError(`"pattern" of profile "${profile.id}" cannot be encoded: ${why}`);
}

/** Undoes backslash escapes of a literal part of the pattern; refuses anything that is not literal. */
function literal(profile: AsciiProfile, part: string): string {
  let text = '';
  for (let i = 0; i < part.length; i++) {
    let ch = part[i];
    if (ch === '\\') {
      ch = part[++i] ?? '';
      // \d, \s, \w … are classes, not characters.
      if (ch === '' || /[A-Za-z0-9]/.test(ch)) throw notEncodable(profile, `"\\${ch}" is not a literal character`);
    } else if (REGEX_SYNTAX.test(ch)) {
      throw notEncodable(profile, `"${part}" is not literal text`);
    }
    text += ch;
  }
  return text;
}

function lineTemplate(profile: AsciiProfile): LineTemplate {
  const cached = templates.get(profile);
  if (cached) return cached;
  const pattern = profile.pattern.replace(/^\^/, '').replace(/(?<!\\)\$$/, '');
  const match = VALUE_GROUP.exec(pattern);
  if (!match) throw notEncodable(profile, 'the "value" group is not of the form [+-]?\\d{n}(\\.\\d{m})?');
  const signClass = match[1] ?? '';
  const layout: NumberLayout = {
    sign: signClass === '' ? 'never' : signClass.endsWith('?') ? 'negative' : 'always',
    intDigits: match[3] ? 0 : Number(match[2] ?? 1),
    fracDigits: match[4] ? Number(match[4]) : 0,
  };
  const template = {
    prefix: literal(profile, pattern.slice(0, match.index)),
    suffix: literal(profile, pattern.slice(match.index + match[0].length)),
    layout,
  };
  templates.set(profile, template);
  return template;
}

function formatNumber(value: number, layout: NumberLayout): string {
  const digits = Math.abs(value).toFixed(layout.fracDigits);
  const negative = value < 0 && Number(digits) !== 0;
  if (negative && layout.sign === 'never') throw new RangeError(`negative value ${value} cannot be printed by this profile`);
  const [intPart, fracPart] = digits.split('.');
  if (layout.intDigits > 0 && intPart.length > layout.intDigits) {
    throw new RangeError(`value ${value} needs more than ${layout.intDigits} integer digits`);
  }
  const signText = negative ? '-' : layout.sign === 'always' ? '+' : '';
  return signText + intPart.padStart(layout.intDigits, '0') + (fracPart === undefined ? '' : `.${fracPart}`);
}

/**
 * The line (terminator included) an indicator of this profile prints for a reading in mm, rounded
 * to the profile's resolution. Used by the rig simulator to speak the same protocol the reader
 * parses. Throws if the pattern is not a literal prefix + number + literal suffix, or if the value
 * does not fit the printed width.
 */
export function encodeIndicatorLine(profile: AsciiProfile, valueMm: number): string {
  if (!Number.isFinite(valueMm)) throw new RangeError(`value ${valueMm} is not a finite number`);
  const { prefix, suffix, layout } = lineTemplate(profile);
  const line = prefix + formatNumber(valueMm / mmPerDeviceNumber(profile), layout) + suffix;
  // The encoder must only ever speak what the parser accepts.
  if (!parseIndicatorLine(profile, line).ok) throw notEncodable(profile, `encoded line "${line}" does not parse back`);
  return line + profile.terminator;
}
