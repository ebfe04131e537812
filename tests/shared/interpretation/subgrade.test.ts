import { describe, expect, it } from 'vitest';
import {
  FIXED_PRESSURE_KPA,
  ircK750FromK300,
  mnPerM3ToPci,
  PCI_IN_MN_PER_M3,
  pciToMnPerM3,
  rectangleInClay,
  saturationCorrection,
  subgradeModulusAtPressure,
  subgradeModulusAtSettlement,
  subgradeModulusFromCbr,
  subgradeSizeCorrection,
} from '@shared/interpretation/subgrade';
import { curve, expectRel } from './tolerance';

// reference §C7, computed from the formula [calc]: 762 mm plate.
const C7 = curve([0, 20, 40, 60, 80, 100], [0, 0.32, 0.66, 1.02, 1.4, 1.82]);

describe('k from the plate curve', () => {
  it('at 1.25 mm: p = 72.1053 kPa, k = 57.684 MPa/m = 212.51 pci (reference §C7 [calc])', () => {
    const k = subgradeModulusAtSettlement(C7);
    expectRel(k.pressureKpa, 72.1053);
    expectRel(k.kMnM3, 57.684);
    expectRel(k.kPci, 212.51);
    expect(k.convention).toBe('fixedSettlement');
  });

  it('at 10 psi = 68.9476 kPa (US Army Corps convention)', () => {
    // reference §0 conversions [calc]: 1 psi = 6.894757 kPa. On the C7 curve 68.9476 kPa lies between (60, 1.02)
    // and (80, 1.40): δ = 1.02 + 0.38·8.9476/20 = 1.190004 mm ⇒ k = 68.9476/1.190004 = 57.939 MPa/m [calc].
    expectRel(FIXED_PRESSURE_KPA, 68.94757);
    const k = subgradeModulusAtPressure(C7);
    expectRel(k.settlementMm, 1.190004);
    expectRel(k.kMnM3, 57.939);
  });

  it('returns null with a reason when the curve does not reach the point', () => {
    const short = curve([0, 20, 40], [0, 0.32, 0.66]);
    const k = subgradeModulusAtSettlement(short);
    expect(k).toMatchObject({ kMnM3: null, kPci: null, pressureKpa: null });
    expect(k.reason).toMatch(/does not reach 1\.25 mm/);
    expect(subgradeModulusAtPressure(short).reason).toMatch(/does not reach 68\.9476 kPa/);
    expect(() => subgradeModulusAtSettlement(short, 0)).toThrow(/settlementMm/);
    expect(() => subgradeModulusAtSettlement(C7.slice(0, 1))).toThrow(/curve: needs at least 2 points/);
  });

  it('converts to and from pci: 1 pci = 0.271447 MN/m³, 100 pci = 27.14 MPa/m (reference §0 units [calc])', () => {
    expectRel(PCI_IN_MN_PER_M3, 0.271447);
    expectRel(pciToMnPerM3(100), 27.1447);
    expectRel(mnPerM3ToPci(pciToMnPerM3(123.4)), 123.4, 1e-12);
  });
});

describe('plate-size and other corrections', () => {
  it('k_300 = 150 MPa/m to 0.762 m and to a 2.0 m footing (reference §C7, computed from the formula of Terzaghi (1955) [calc])', () => {
    expectRel(subgradeSizeCorrection(150, 0.3, 0.762, 'terzaghiSand').kMnM3, 72.84);
    expectRel(subgradeSizeCorrection(150, 0.3, 0.762, 'terzaghiClay').kMnM3, 59.055);
    expectRel(ircK750FromK300(150).kMnM3, 75.0);
    expectRel(subgradeSizeCorrection(150, 0.3, 2.0, 'terzaghiSand').kMnM3, 49.594);
    expectRel(subgradeSizeCorrection(150, 0.3, 2.0, 'terzaghiClay').kMnM3, 22.5);
    expectRel(rectangleInClay(22.5, 2, 4).factor, 0.8333);
  });

  it('from a plate other than 0.3 m the sand rule applies as a ratio', () => {
    // [calc] 0.3 → 0.762 → 2.0 m in two steps equals 0.3 → 2.0 m in one (reference §C7: 49.594).
    const via762 = subgradeSizeCorrection(subgradeSizeCorrection(150, 0.3, 0.762, 'terzaghiSand').kMnM3, 0.762, 2.0, 'terzaghiSand');
    expectRel(via762.kMnM3, 49.594);
  });

  it('saturation: k_s = k_u·d/d_s', () => {
    // From the formula (CRD-C 655) [calc]: 60·0.5/0.8 = 37.5 MPa/m.
    expectRel(saturationCorrection(60, 0.5, 0.8).kMnM3, 37.5);
    expect(() => saturationCorrection(60, 0.5, 0)).toThrow(/soakedDeformationMm/);
  });

  it('rejects a rectangle shorter than its width', () => {
    expect(() => rectangleInClay(20, 4, 2)).toThrow(/lengthM/);
  });
});

describe('CBR correlations (information only)', () => {
  const byName = (cbr: number) => Object.fromEntries(subgradeModulusFromCbr(cbr).map((c) => [c.name, c]));

  it('IRC:58 table: exact rows and linear interpolation between them (reference §B.5 table [seen-2nd])', () => {
    expect(byName(10)['IRC:58 table'].kMnM3).toBe(55);
    expectRel(byName(6)['IRC:58 table'].kMnM3, 45); // halfway between 5 → 42 and 7 → 48
    expect(byName(1)['IRC:58 table']).toMatchObject({ kMnM3: null, kPci: null });
    expect(byName(150)['IRC:58 table'].reason).toMatch(/CBR 2–100 %/);
  });

  it('FAA and PCA at CBR 10 (computed from the published formulas [calc])', () => {
    // FAA: (1500·10/26)^0.7788 = 576.923^0.7788 = 141.370 pci; PCA: 53.438·10^0.5719 = 199.411 pci.
    expectRel(byName(10).FAA.kPci, 141.37);
    expectRel(byName(10).PCA.kPci, 199.411);
  });

  it('DMRB IAN 73/06: k = 57.7 MPa/m ⇔ CBR 10.9 % (reference §B.5 [seen-2nd; calc])', () => {
    // CBR = 6.1×10⁻⁸·57700^1.733 = 10.8755 % [calc]; reference §B.5 rounds it to 10.9 %.
    expectRel(byName(10.8755).DMRB.kMnM3, 57.7);
    expectRel(byName(10.9).DMRB.kMnM3, 57.7, 3e-3); // the rounding of 10.9 moves k by 0.13 %
  });

  it('rejects a non-positive CBR', () => {
    expect(() => subgradeModulusFromCbr(0)).toThrow(/cbrPercent/);
  });
});
