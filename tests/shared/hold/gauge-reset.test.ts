import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { findUnmarkedJumps, gaugeSettlement, resetOffset } from '@shared/hold/gauge-reset';

describe('gauge reset keeps settlement continuous', () => {
  it('reproduces reference §C12 (calc/CP): 24.30 before, 1.15 after → offset 23.15 mm; later raw 3.00 → 26.15 mm', () => {
    const offset = resetOffset(24.3, 1.15, 1);
    expect(offset).toBeCloseTo(23.15, 12);
    expect(gaugeSettlement(24.3, 0, 1)).toBeCloseTo(24.3, 12);
    expect(gaugeSettlement(1.15, 0, 1, [offset])).toBeCloseTo(24.3, 12);
    expect(gaugeSettlement(3, 0, 1, [offset])).toBeCloseTo(26.15, 12);
  });

  it('applies the gauge sign: s = sign × (reading − zero) + Σ offsets (reference §B.1, common practice)', () => {
    expect(gaugeSettlement(20.5, 24.0, -1)).toBeCloseTo(3.5, 12);
    expect(gaugeSettlement(22.0, 24.0, -1, [resetOffset(0.6, 24.0, -1)])).toBeCloseTo(25.4, 12);
  });

  it('property: settlement just after any sequence of resets equals settlement just before', () => {
    fc.assert(
      fc.property(
        fc.constantFrom<1 | -1>(1, -1),
        fc.double({ min: 0, max: 50, noNaN: true }),
        fc.array(fc.tuple(fc.double({ min: 0, max: 50, noNaN: true }), fc.double({ min: 0, max: 50, noNaN: true })), { minLength: 1, maxLength: 6 }),
        (sign, zero, resets) => {
          const offsets: number[] = [];
          return resets.every(([before, after]) => {
            const s0 = gaugeSettlement(before, zero, sign, offsets);
            offsets.push(resetOffset(before, after, sign));
            return Math.abs(gaugeSettlement(after, zero, sign, offsets) - s0) <= 1e-9;
          });
        },
      ),
    );
  });

  it('throws naming the field for a non-finite reading', () => {
    expect(() => gaugeSettlement(Number.NaN, 0, 1)).toThrow(/^rawMm:/);
    expect(() => resetOffset(1, Number.POSITIVE_INFINITY, 1)).toThrow(/^afterMm:/);
  });
});

describe('jump detector', () => {
  const readings = [
    { tMin: 0, rawMm: 24.1 },
    { tMin: 1, rawMm: 24.3 },
    { tMin: 2, rawMm: 1.15 }, // reset, recorded at 1.5 min
    { tMin: 3, rawMm: 1.3 },
    { tMin: 4, rawMm: 2.8 }, // 1.5 mm jump, unrecorded
    { tMin: 5, rawMm: 3.8 }, // exactly 100 divisions: not a jump
  ];

  it('flags a jump of more than N divisions that no reset marks', () => {
    const jumps = findUnmarkedJumps(readings, [1.5], { resolutionMm: 0.01 });
    expect(jumps).toHaveLength(1);
    expect(jumps[0]).toMatchObject({ index: 4, fromMin: 3, toMin: 4, fromMm: 1.3, toMm: 2.8 });
    expect(jumps[0].jumpMm).toBeCloseTo(1.5, 12);
    expect(jumps[0].divisions).toBeCloseTo(150, 9);
  });

  it('flags the reset jump too when the reset was not recorded', () => {
    expect(findUnmarkedJumps(readings, [], { resolutionMm: 0.01 }).map((j) => j.index)).toEqual([2, 4]);
  });

  it('uses the configured number of divisions', () => {
    expect(findUnmarkedJumps(readings, [1.5], { resolutionMm: 0.01, maxDivisions: 200 })).toEqual([]);
  });

  it('throws naming the field for a bad resolution', () => {
    expect(() => findUnmarkedJumps(readings, [], { resolutionMm: 0 })).toThrow(/^resolutionMm:/);
  });
});
