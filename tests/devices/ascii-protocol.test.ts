import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { asciiProfileSchema, type AsciiProfile } from '@shared/devices/schema';
import { polledMmIndicator, statusCountsIndicator, streamingInchIndicator } from '@shared/devices/default-profiles';
import { encodeIndicatorLine } from '../../devices/ascii/encode';
import { parseIndicatorLine } from '../../devices/ascii/parse';

const profile = (overrides: Partial<AsciiProfile>): AsciiProfile => asciiProfileSchema.parse({ ...polledMmIndicator, id: 'test', ...overrides });

describe('parseIndicatorLine: lines accepted', () => {
  // 1 in = 25.4 mm exactly (international yard and pound agreement, 1959).
  it.each([
    [polledMmIndicator, '+012.345 mm', 12.345],
    [polledMmIndicator, '-000.120 mm', -0.12],
    [polledMmIndicator, '+000.000 mm', 0],
    [polledMmIndicator, '-000.000 mm', 0],
    [streamingInchIndicator, '+0.4858in', 0.4858 * 25.4],
    [streamingInchIndicator, '-1.0000in', -25.4],
    [statusCountsIndicator, 'A,+0024690', -24690 * 0.0005],
    [statusCountsIndicator, 'A,-0000002', 0.001],
    [profile({ pattern: String.raw`(?<value>[+-]\d{5})um`, unit: 'um' }), '+12345um', 12.345],
    [profile({ pattern: String.raw`(?<value>\S+) mm`, scale: 2 }), '12.5 mm', 25],
  ])('%#: %j', (p, line, mm) => {
    const parsed = parseIndicatorLine(p, line);
    expect(parsed.ok).toBe(true);
    if (parsed.ok) {
      expect(parsed.valueMm).toBeCloseTo(mm, 12);
      expect(Object.is(parsed.valueMm, -0)).toBe(false);
      expect(parsed.raw).toBe(line);
    }
  });
});

describe('parseIndicatorLine: lines rejected, never a number', () => {
  const loose = profile({ pattern: String.raw`(?<value>\S+) mm` });
  it.each([
    [polledMmIndicator, '+012.345mm'],
    [polledMmIndicator, '012.345 mm'],
    [polledMmIndicator, '+12.345 mm'],
    [polledMmIndicator, '+012.3456 mm'],
    [polledMmIndicator, ' +012.345 mm'],
    [polledMmIndicator, '+012.345 mm '],
    [polledMmIndicator, '+012.345 mm\r'],
    [polledMmIndicator, '+012.345 in'],
    [polledMmIndicator, '+012,345 mm'],
    [polledMmIndicator, '+012.345 mm+001.000 mm'],
    [polledMmIndicator, '+01\u00ff.345 mm'],
    [polledMmIndicator, ''],
    [polledMmIndicator, 'ERR'],
    [streamingInchIndicator, '+0.4858 in'],
    [streamingInchIndicator, '+.4858in'],
    [statusCountsIndicator, 'E,+0024690'],
    [statusCountsIndicator, 'A,0024690'],
    [statusCountsIndicator, 'A,+002469'],
    // A loose pattern still yields only plain decimals: no exponent, hex, Infinity or bare sign.
    [loose, '1e3 mm'],
    [loose, '0x10 mm'],
    [loose, 'Infinity mm'],
    [loose, '+ mm'],
    [loose, '. mm'],
    // The pattern must match the whole line even when it carries no anchors.
    [profile({ pattern: String.raw`(?<value>\d+)` }), 'x12'],
  ])('%#: %j', (p, line) => {
    const parsed = parseIndicatorLine(p, line);
    expect(parsed.ok).toBe(false);
    expect(parsed).not.toHaveProperty('valueMm');
    if (!parsed.ok) expect(parsed.reason).toMatch(/pattern|decimal/);
  });

  it('names "pattern" when the profile pattern is broken', () => {
    expect(() => parseIndicatorLine(profile({ pattern: '(' }), '1')).toThrow(/"pattern".*not a valid regular expression/);
    expect(() => parseIndicatorLine(profile({ pattern: String.raw`(\d+) mm` }), '1 mm')).toThrow(/"pattern".*named group "value"/);
  });
});

describe('encodeIndicatorLine', () => {
  it.each([
    [polledMmIndicator, 12.345, '+012.345 mm\r\n'],
    [polledMmIndicator, -0.12, '-000.120 mm\r\n'],
    [polledMmIndicator, -0.0001, '+000.000 mm\r\n'],
    [streamingInchIndicator, 0.4858 * 25.4, '+0.4858in\r'],
    [statusCountsIndicator, -12.345, 'A,+0024690\n'],
    [profile({ pattern: String.raw`^D(?<value>-?\d+\.\d{2})\.$` }), -1.5, 'D-1.50.\r\n'],
    [profile({ pattern: String.raw`^D(?<value>-?\d+\.\d{2})\.$` }), 1.5, 'D1.50.\r\n'],
  ])('%#: %s mm', (p, mm, line) => {
    expect(encodeIndicatorLine(p, mm)).toBe(line);
  });

  it('speaks only what the parser reads back, to within half a display step', () => {
    const steps: [AsciiProfile, number, number][] = [
      [polledMmIndicator, 0.001, 999],
      [streamingInchIndicator, 0.0001 * 25.4, 9.9999 * 25.4],
      [statusCountsIndicator, 0.0005, 4999],
    ];
    for (const [p, step, max] of steps) {
      fc.assert(
        fc.property(fc.double({ min: -max, max, noNaN: true }), (mm) => {
          const line = encodeIndicatorLine(p, mm);
          expect(line.endsWith(p.terminator)).toBe(true);
          const parsed = parseIndicatorLine(p, line.slice(0, -p.terminator.length));
          expect(parsed.ok && Math.abs(parsed.valueMm - mm)).toBeLessThanOrEqual(step / 2 + 1e-9);
        }),
      );
    }
  });

  it('refuses values the display cannot show', () => {
    expect(() => encodeIndicatorLine(polledMmIndicator, 1000)).toThrow(RangeError);
    expect(() => encodeIndicatorLine(polledMmIndicator, Number.NaN)).toThrow(RangeError);
    expect(() => encodeIndicatorLine(profile({ pattern: String.raw`(?<value>\d{3}\.\d{3}) mm` }), -1)).toThrow(/negative/);
  });

  it('refuses patterns that are not literal text around a plain number, naming "pattern"', () => {
    expect(() => encodeIndicatorLine(profile({ pattern: String.raw`(?<value>[+-]\d{3}\.\d{3})\s*mm` }), 1)).toThrow(/"pattern".*cannot be encoded/);
    expect(() => encodeIndicatorLine(profile({ pattern: String.raw`(?<value>\S+) mm` }), 1)).toThrow(/"pattern".*cannot be encoded/);
    expect(() => encodeIndicatorLine(profile({ pattern: String.raw`(?<value>[+-]\d{3}\.\d{3}) (mm|MM)` }), 1)).toThrow(/"pattern"/);
  });
});
