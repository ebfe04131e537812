/**
 * AGS4 values (edition 4.1.1, rule 8: values as their TYPE and UNIT say). Check values are worked by hand
 * from the type definitions: nDP = exactly n decimal places, nSF = n significant figures, DT = the
 * date/time format the UNIT names.
 */
import { formatDecimals, formatNumber, formatSignificant, valueProblem } from '@shared/ags4/values';
import { describe, expect, it } from 'vitest';

describe('writing numbers for their AGS4 type', () => {
  it('nDP: exactly n decimals, rounded half away from zero, never "-0.00"', () => {
    expect(formatDecimals(1.005, 2)).toBe('1.01'); // hand-worked: 1.005 → 1.01 (not the binary 1.00)
    expect(formatDecimals(-1.25, 1)).toBe('-1.3');
    expect(formatDecimals(-0.001, 2)).toBe('0.00');
    expect(formatDecimals(508.3, 0)).toBe('508');
    expect(formatNumber(0.5, '2DP')).toBe('0.50');
    expect(formatDecimals(1.2e-17, 2)).toBe('0.00'); // a fit factor that is zero but for rounding noise
  });

  it('nSF: n significant figures written out, a carry moving the magnitude', () => {
    expect(formatSignificant(0.01234, 2)).toBe('0.012');
    expect(formatSignificant(1.25, 2)).toBe('1.3');
    expect(formatSignificant(123.4, 2)).toBe('120');
    expect(formatSignificant(9.96, 3)).toBe('9.96');
    expect(formatSignificant(9.996, 3)).toBe('10.0');
    expect(formatSignificant(0, 2)).toBe('0.0');
  });
});

describe('checking values against their TYPE (AGS4 rule 8)', () => {
  it('nDP takes exactly n decimals', () => {
    expect(valueProblem('1.50', '2DP', 'mm')).toBeNull();
    expect(valueProblem('1.5', '2DP', 'mm')).toMatch(/exactly 2 decimal places/);
    expect(valueProblem('1.500', '2DP', 'mm')).toMatch(/exactly 2 decimal places/);
    expect(valueProblem('12', '0DP', 'mm')).toBeNull();
    expect(valueProblem('12.0', '0DP', 'mm')).toMatch(/0 decimal places/);
    expect(valueProblem('1,5', '1DP', 'kN')).toMatch(/1 decimal place/);
  });

  it('nSF takes the value as written to n significant figures', () => {
    expect(valueProblem('0.012', '2SF', '%')).toBeNull();
    expect(valueProblem('120', '2SF', '%')).toBeNull();
    expect(valueProblem('0.0123', '2SF', '%')).toMatch(/2 significant figures/);
  });

  it('DT follows the format in UNIT and names real dates', () => {
    expect(valueProblem('2024-07-02', 'DT', 'yyyy-mm-dd')).toBeNull();
    expect(valueProblem('02/07/2024', 'DT', 'yyyy-mm-dd')).toMatch(/format yyyy-mm-dd/);
    expect(valueProblem('2024-02-30', 'DT', 'yyyy-mm-dd')).toMatch(/not a date/);
    expect(valueProblem('2024-07-02T10:15', 'DT', 'yyyy-mm-ddThh:mm')).toBeNull();
    expect(valueProblem('2024-07-02', 'DT', '')).toMatch(/must name a date\/time format/);
  });

  it('an empty value fits every type (AGS4 rule 12); U is any number; text types take any text', () => {
    for (const type of ['2DP', '2SF', 'DT', 'U', 'X', 'ID']) expect(valueProblem('', type, 'yyyy-mm-dd')).toBeNull();
    expect(valueProblem('1.2e3', 'U', '')).toBeNull();
    expect(valueProblem('about 3', 'U', '')).toMatch(/not a number/);
    expect(valueProblem('anything, "quoted"', 'X', '')).toBeNull();
  });
});
