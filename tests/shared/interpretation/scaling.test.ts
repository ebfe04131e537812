import { describe, expect, it } from 'vitest';
import {
  bondRatio,
  clayLinearRatio,
  dasSandRatio,
  footingSettlement,
  footingUltimatePressure,
  plateSettlementForFooting,
  scalingWarnings,
  terzaghiPeckSandRatio,
} from '@shared/interpretation/scaling';
import { expectRel } from './tolerance';

describe('settlement scaling on sand (Terzaghi & Peck)', () => {
  // reference §C1, computed from the formula of Terzaghi & Peck (1948, 1967) / IS 1888 usage [calc].
  const rows: [number, number, number, number, number][] = [
    [0.3, 10.0, 1.5, 2.777778, 27.7778],
    [0.6, 5.0, 2.0, 1.701323, 8.5066],
    [0.3, 12.0, 3.0, 3.305785, 39.6694],
    [0.75, 6.0, 2.5, 1.5625, 9.375],
  ];
  it.each(rows)('B_p %s m, S_p %s mm, B_f %s m → ratio %s, S_f %s mm (reference §C1 [calc])', (bp, sp, bf, ratio, sf) => {
    expectRel(terzaghiPeckSandRatio(bp, bf), ratio);
    const scaled = footingSettlement(sp, bp, bf, { kind: 'terzaghiPeckSand' });
    expectRel(scaled.settlementMm, sf);
    expect(scaled.source).toMatch(/Terzaghi & Peck/);
  });

  it('tends to 4.0 as the footing grows, for a 0.3 m plate (reference §C1 [calc])', () => {
    expectRel(terzaghiPeckSandRatio(0.3, 1e6), 4.0);
  });

  it('inverse: permissible 25 mm on a 2.0 m footing is 8.2656 mm on a 0.3 m plate (reference §C1 [calc])', () => {
    const back = plateSettlementForFooting(25, 0.3, 2.0, { kind: 'terzaghiPeckSand' });
    expectRel(back.ratio, 3.024575);
    expectRel(back.settlementMm, 8.2656);
  });

  it('Das form: 2.762410 for B_p = 0.305 m, identical to Terzaghi & Peck at 0.3 m (reference §C1 [calc])', () => {
    expectRel(dasSandRatio(0.305, 1.5), 2.76241);
    expectRel(dasSandRatio(0.3, 1.5), terzaghiPeckSandRatio(0.3, 1.5), 1e-12);
  });
});

describe('settlement scaling on clay and after Bond', () => {
  it('clay: S_f = S_p·B_f/B_p gives 50.0 mm (reference §C2 [calc])', () => {
    expectRel(footingSettlement(10, 0.3, 1.5, { kind: 'clayLinear' }).settlementMm, 50.0);
  });

  it('Bond (1961): (B_f/B_p)^(n+1)', () => {
    // From the published formula [calc]: B_f/B_p = 5, n = 0.5 ⇒ 5^1.5 = √125 = 11.180340;
    // n = 0 reduces to the clay ratio 5.
    expectRel(bondRatio(0.3, 1.5, 0.5), 11.18034);
    expectRel(bondRatio(0.3, 1.5, 0), clayLinearRatio(0.3, 1.5), 1e-12);
    expect(() => bondRatio(0.3, 1.5, -0.1)).toThrow(/exponentN/);
  });

  it('rejects non-positive widths and settlements naming the field', () => {
    expect(() => terzaghiPeckSandRatio(0, 1)).toThrow(/plateWidthM/);
    expect(() => footingSettlement(-1, 0.3, 1, { kind: 'clayLinear' })).toThrow(/plateSettlementMm/);
    expect(() => footingSettlement(1, 0.3, 1, { kind: 'cubic' } as never)).toThrow(/scaling\.kind/);
  });
});

describe('ultimate pressure scaling', () => {
  it('sand ∝ width, clay unchanged (reference §C2 and §B.3 [calc])', () => {
    // Sand: q_u,f = 400·1.5/0.3 = 2000 kPa. Clay: q_u,f = q_u,p (reference §C2).
    expectRel(footingUltimatePressure(400, 0.3, 1.5, 'cohesionless').qUltKpa, 2000);
    expect(footingUltimatePressure(400, 0.3, 1.5, 'cohesive').qUltKpa).toBe(400);
    expect(() => footingUltimatePressure(400, 0.3, 1.5, 'mixed')).toThrow(/soil: a c–φ soil has no single-plate scaling/);
  });
});

describe('scalingWarnings', () => {
  const codes = (w: { code: string }[]) => w.map((x) => x.code).sort();

  it('sand: ratio limit, depth of influence, scale effect on q_u, water table within the footing width', () => {
    const w = scalingWarnings({ soil: 'cohesionless', plateWidthM: 0.3, footingWidthM: 2, scaling: { kind: 'terzaghiPeckSand' }, scalesUltimate: true, waterTableBelowTestM: 1.2 });
    expect(codes(w)).toEqual(['depth_of_influence', 'sand_ratio_limit', 'sand_ultimate_scale_effect', 'water_table']);
    expect(w.find((x) => x.code === 'depth_of_influence')?.message).toMatch(/0\.60 m.*4\.00 m/);
    for (const x of w) expect(x.message.length).toBeGreaterThan(20);
  });

  it('clay: long-term settlement, and a sand rule applied to clay', () => {
    expect(codes(scalingWarnings({ soil: 'cohesive', plateWidthM: 0.3, footingWidthM: 2, scaling: { kind: 'clayLinear' } }))).toEqual(['clay_long_term', 'depth_of_influence']);
    expect(codes(scalingWarnings({ soil: 'cohesive', plateWidthM: 0.3, footingWidthM: 2, scaling: { kind: 'dasSand' } }))).toContain('sand_rule_on_clay');
  });

  it('c–φ soil, a footing no wider than the plate, a deep water table', () => {
    expect(codes(scalingWarnings({ soil: 'mixed', plateWidthM: 0.6, footingWidthM: 0.6, waterTableBelowTestM: 5 }))).toEqual(['footing_not_wider', 'mixed_soil']);
  });
});
