import { describe, expect, it } from 'vitest';
import { describeDeviceProblem } from '@shared/devices/problems';
import { convertUnit, outsideInstrumentRange } from '@shared/devices/range';

describe('outsideInstrumentRange', () => {
  const transducer = { min: 0, max: 70, unit: 'MPa' };

  it('passes readings inside the range and within 1 % of the span beyond its ends', () => {
    expect(outsideInstrumentRange(12.5, 'MPa', transducer)).toBeNull();
    expect(outsideInstrumentRange(70.6, 'MPa', transducer)).toBeNull(); // 0.6 < 1 % of 70
    expect(outsideInstrumentRange(-0.5, 'MPa', transducer)).toBeNull();
  });

  it('names a reading beyond the slack, in the register unit', () => {
    expect(outsideInstrumentRange(71, 'MPa', transducer)).toBe('71 MPa is outside 0 – 70 MPa');
    expect(outsideInstrumentRange(-2, 'MPa', transducer)).toBe('-2 MPa is outside 0 – 70 MPa');
    // 1e9 MPa: what a float read in the wrong word order may show (0x4148 0x0000 read as 0x00004148 is tiny; the reverse is huge).
    expect(outsideInstrumentRange(1e9, 'MPa', transducer)).toMatch(/outside/);
  });

  it('converts between units of one family (1 bar = 0.1 MPa, 1 in = 25.4 mm, by definition)', () => {
    expect(convertUnit(700, 'bar', 'MPa')).toBeCloseTo(70, 12);
    expect(convertUnit(1, 'in', 'mm')).toBeCloseTo(25.4, 12);
    expect(outsideInstrumentRange(800, 'bar', transducer)).toBe('80 MPa is outside 0 – 70 MPa');
    expect(outsideInstrumentRange(30, 'mm', { min: 0, max: 25, unit: 'mm' })).toBe('30 mm is outside 0 – 25 mm');
  });

  it('says nothing when the register gives no range or a unit of another kind', () => {
    expect(outsideInstrumentRange(1e9, 'MPa', { min: null, max: null, unit: 'MPa' })).toBeNull();
    expect(outsideInstrumentRange(1e9, 'MPa', { min: 0, max: 350, unit: 'kN' })).toBeNull();
  });

  it('words the problem for the device check', () => {
    expect(describeDeviceProblem({ kind: 'outside-range', detail: '71 MPa is outside 0 – 70 MPa' })).toBe("Outside the instrument's range: 71 MPa is outside 0 – 70 MPa");
  });
});
