import { type CurvePoint, checkCurve, interpolateFirstCrossing, pressureAtSettlement, settlementAtPressure } from './curve';
import { InterpretationInputError, requirePositive } from './input-checks';

/** 1 pci (lbf/in³) in MN/m³: 4.4482216152605 N / (0.0254 m)³ = 0.271447 MN/m³ (exact definitions of lbf and inch). */
export const PCI_IN_MN_PER_M3 = 4.4482216152605 / 0.0254 ** 3 / 1e6;
/** 1 psi in kPa (lbf/in²). */
export const PSI_IN_KPA = 4.4482216152605 / 0.0254 ** 2 / 1000;
/** Fixed-deflection convention: 1.25 mm (≈ 0.05 in), IS 9214 / IRC:58, DIN 18134 ks. */
export const FIXED_SETTLEMENT_MM = 1.25;
/** Fixed-pressure convention: 10 psi = 68.9476 kPa (US Army Corps CRD-C 655, 30-in plate). */
export const FIXED_PRESSURE_KPA = 10 * PSI_IN_KPA;

/** k in MN/m³ (= kPa/mm = MPa/m) to pci. */
export function mnPerM3ToPci(kMnM3: number): number {
  return kMnM3 / PCI_IN_MN_PER_M3;
}

/** k in pci to MN/m³. */
export function pciToMnPerM3(kPci: number): number {
  return kPci * PCI_IN_MN_PER_M3;
}

/** A modulus of subgrade reaction from a plate curve, with the point it rests on. */
export interface SubgradeModulus {
  convention: 'fixedSettlement' | 'fixedPressure';
  /** k = p/δ, MN/m³; null when the curve does not reach the convention's point. */
  kMnM3: number | null;
  kPci: number | null;
  pressureKpa: number | null;
  settlementMm: number | null;
  reason: string | null;
  formula: string;
  source: string;
}

function subgradeModulus(convention: SubgradeModulus['convention'], pressureKpa: number | null, settlementMm: number | null, missing: string): SubgradeModulus {
  const k = pressureKpa !== null && settlementMm !== null && settlementMm > 0 ? pressureKpa / settlementMm : null;
  const fixedSettlement = convention === 'fixedSettlement';
  return {
    convention,
    kMnM3: k,
    kPci: k === null ? null : mnPerM3ToPci(k),
    pressureKpa,
    settlementMm,
    reason: k === null ? missing : null,
    formula: fixedSettlement ? 'k = p(δ)/δ, p read at δ by linear interpolation' : 'k = p/δ(p), δ read at p by linear interpolation',
    source: fixedSettlement
      ? 'IS 9214 / IRC:58 (750 mm plate, δ = 1.25 mm); DIN 18134 ks (762 mm plate)'
      : 'US Army Corps CRD-C 655 / UFC 3-260-02 (30-in plate, p = 10 psi)',
  };
}

/**
 * k at a fixed settlement (reference §B.5): k = p(δ)/δ with p interpolated linearly on the curve at δ
 * (default 1.25 mm, IS 9214 / IRC:58 / DIN 18134 ks). k in MN/m³ since kPa/mm = MN/m³.
 */
export function subgradeModulusAtSettlement(curve: readonly CurvePoint[], settlementMm = FIXED_SETTLEMENT_MM): SubgradeModulus {
  checkCurve(curve, 'curve', 2);
  const s = requirePositive(settlementMm, 'settlementMm');
  return subgradeModulus('fixedSettlement', pressureAtSettlement(curve, s), s, `the curve does not reach ${s} mm`);
}

/**
 * k at a fixed pressure (reference §B.5, US Army Corps): k = p/δ(p) with δ interpolated linearly on the
 * curve at p (default 10 psi = 68.9476 kPa).
 */
export function subgradeModulusAtPressure(curve: readonly CurvePoint[], pressureKpa = FIXED_PRESSURE_KPA): SubgradeModulus {
  checkCurve(curve, 'curve', 2);
  const p = requirePositive(pressureKpa, 'pressureKpa');
  return subgradeModulus('fixedPressure', p, settlementAtPressure(curve, p), `the curve does not reach ${+p.toFixed(4)} kPa`);
}

/** A corrected k with its factor. */
export interface CorrectedModulus {
  kMnM3: number;
  factor: number;
  formula: string;
  source: string;
}

/** Plate-size rules for k (reference §B.5). */
export type SubgradeSizeRule = 'terzaghiSand' | 'terzaghiClay';

const TERZAGHI_1955 = 'Terzaghi (1955) Géotechnique 5(4), as reproduced in Das and Bowles';

/**
 * k for another plate or footing width, Terzaghi (1955) (reference §B.5):
 * sand k_B = k_0.3·((B + 0.3)/(2B))², clay k_B = k_0.3·0.3/B (B in m). From a plate of width B1 other than
 * 0.3 m the rule is applied as a ratio: k_B = k_B1·f(B)/f(B1) [calc].
 */
export function subgradeSizeCorrection(kMnM3: number, fromWidthM: number, toWidthM: number, rule: SubgradeSizeRule): CorrectedModulus {
  const k = requirePositive(kMnM3, 'kMnM3');
  const b1 = requirePositive(fromWidthM, 'fromWidthM');
  const b = requirePositive(toWidthM, 'toWidthM');
  if (rule === 'terzaghiSand') {
    const f = (w: number) => ((w + 0.3) / (2 * w)) ** 2;
    const factor = f(b) / f(b1);
    return { kMnM3: k * factor, factor, formula: 'k_B = k_0.3·((B + 0.3)/(2B))² (B in m)', source: TERZAGHI_1955 };
  }
  if (rule === 'terzaghiClay') return { kMnM3: (k * b1) / b, factor: b1 / b, formula: 'k_B = k_0.3·(0.3/B) (B in m)', source: TERZAGHI_1955 };
  throw new InterpretationInputError('rule', `unknown size rule "${rule}"`);
}

/** k of a B×L rectangle in clay from the B×B square: k·(1 + 0.5·B/L)/1.5 (Terzaghi 1955; reference §B.5). */
export function rectangleInClay(kSquareMnM3: number, widthM: number, lengthM: number): CorrectedModulus {
  const k = requirePositive(kSquareMnM3, 'kSquareMnM3');
  const b = requirePositive(widthM, 'widthM');
  const l = requirePositive(lengthM, 'lengthM');
  if (l < b) throw new InterpretationInputError('lengthM', 'must not be shorter than the width');
  const factor = (1 + (0.5 * b) / l) / 1.5;
  return { kMnM3: k * factor, factor, formula: 'k_B×L = k_B×B·(1 + 0.5·B/L)/1.5', source: TERZAGHI_1955 };
}

/** IRC:58 rule: k of the 750 mm plate = ½ k of the 300 mm plate (reference §B.5 [mem]). */
export function ircK750FromK300(k300MnM3: number): CorrectedModulus {
  return { kMnM3: requirePositive(k300MnM3, 'k300MnM3') * 0.5, factor: 0.5, formula: 'k_750 = 0.5·k_300', source: 'IRC:58' };
}

/**
 * Saturation correction (reference §B.5; US Army Corps CRD-C 655 / UFC 3-260-02): k_s = k_u·d/d_s with d,
 * d_s the deformations of unsoaked and soaked consolidometer specimens under the test pressure.
 */
export function saturationCorrection(kMnM3: number, unsoakedDeformationMm: number, soakedDeformationMm: number): CorrectedModulus {
  const factor = requirePositive(unsoakedDeformationMm, 'unsoakedDeformationMm') / requirePositive(soakedDeformationMm, 'soakedDeformationMm');
  return { kMnM3: requirePositive(kMnM3, 'kMnM3') * factor, factor, formula: 'k_s = k_u·d/d_s', source: 'US Army Corps CRD-C 655; UFC 3-260-02' };
}

/** One k estimate from a CBR correlation (information only, not a test result). */
export interface CbrCorrelation {
  name: string;
  kMnM3: number | null;
  kPci: number | null;
  reason: string | null;
  formula: string;
  source: string;
}

/** IRC:58 table, soaked CBR (%) → k (MPa/m) (reference §B.5 [seen-2nd]). */
export const IRC_CBR_TABLE: readonly (readonly [number, number])[] = [
  [2, 21],
  [3, 28],
  [4, 35],
  [5, 42],
  [7, 48],
  [10, 55],
  [15, 62],
  [20, 69],
  [50, 140],
  [100, 220],
];

function fromMnM3(name: string, kMnM3: number | null, reason: string | null, formula: string, source: string): CbrCorrelation {
  return { name, kMnM3, kPci: kMnM3 === null ? null : mnPerM3ToPci(kMnM3), reason, formula, source };
}

/**
 * k from CBR by the published correlations, for information beside a measured k (reference §B.5):
 * IRC:58 table (linear interpolation, CBR 2–100 %), FAA AC 150/5320-6 k(pci) = (1500·CBR/26)^0.7788,
 * PCA k(pci) = 53.438·CBR^0.5719, UK DMRB IAN 73/06 CBR = 6.1×10⁻⁸·k762^1.733 (k in kPa/m) inverted.
 */
export function subgradeModulusFromCbr(cbrPercent: number): CbrCorrelation[] {
  const cbr = requirePositive(cbrPercent, 'cbrPercent');
  const [low, high] = [IRC_CBR_TABLE[0][0], IRC_CBR_TABLE[IRC_CBR_TABLE.length - 1][0]];
  const irc = cbr < low || cbr > high ? null : interpolateFirstCrossing(IRC_CBR_TABLE.map((r) => r[0]), IRC_CBR_TABLE.map((r) => r[1]), cbr);
  return [
    fromMnM3('IRC:58 table', irc, irc === null ? `the table covers CBR ${low}–${high} %` : null, 'linear interpolation of the CBR–k table', 'IRC:58'),
    fromMnM3('FAA', pciToMnPerM3((1500 * cbr / 26) ** 0.7788), null, 'k (pci) = (1500·CBR/26)^0.7788', 'FAA AC 150/5320-6'),
    fromMnM3('PCA', pciToMnPerM3(53.438 * cbr ** 0.5719), null, 'k (pci) = 53.438·CBR^0.5719', 'PCA (Packard)'),
    fromMnM3('DMRB', (cbr / 6.1e-8) ** (1 / 1.733) / 1000, null, 'CBR = 6.1×10⁻⁸·k762^1.733 (k762 in kPa/m), inverted', 'UK DMRB IAN 73/06'),
  ];
}

/** Plates the k conventions of pavement design are defined on, mm: 750 (IRC:58) and 762 = 30 in (ASTM, US Army Corps, DIN ks). */
export const STANDARD_K_PLATES_MM = [750, 762] as const;

/** "k, 300 mm plate": every k is printed with the plate it was measured on. */
export function kLabel(plateMm: number): string {
  return `k, ${+plateMm.toFixed(1)} mm plate`;
}

/** k for the 750/762 mm plate: measured on it, or converted by a named rule with its caution. */
export type StandardPlateK =
  | { kind: 'measured'; kMnM3: number; kPci: number; label: string; caution: null; formula: string; source: string }
  | { kind: 'converted'; kMnM3: number; kPci: number; label: string; caution: string; formula: string; source: string }
  | { kind: 'none'; reason: string };

/**
 * The 750/762 mm plate value of a measured k: the same value when the plate is one of them; from a 300 mm
 * plate by the IRC:58 rule k_750 = ½·k_300 (a rule of thumb, printed with its caution); none otherwise,
 * since no conversion between other plate sizes is named by a standard here.
 */
export function kForStandardPlate(kMnM3: number, plateMm: number): StandardPlateK {
  const k = requirePositive(kMnM3, 'kMnM3');
  if ((STANDARD_K_PLATES_MM as readonly number[]).includes(plateMm)) {
    return { kind: 'measured', kMnM3: k, kPci: mnPerM3ToPci(k), label: kLabel(plateMm), caution: null, formula: 'measured on the plate itself', source: 'the test' };
  }
  if (plateMm === 300) {
    const c = ircK750FromK300(k);
    return {
      kind: 'converted',
      kMnM3: c.kMnM3,
      kPci: mnPerM3ToPci(c.kMnM3),
      label: 'k, 750 mm plate by the IRC:58 conversion',
      caution: 'A conversion, not a measurement: the ratio between plate sizes depends on the soil and its layering; a test on the 750/762 mm plate is the reference.',
      formula: c.formula,
      source: 'IRC:58 (k of the 750 mm plate = ½ k of the 300 mm plate; from memory)',
    };
  }
  return { kind: 'none', reason: `no standard conversion from a ${plateMm} mm plate to the 750/762 mm plate: test with the large plate for a design k` };
}

/** A CBR estimated from a measured k (information beside the test, not a CBR test). */
export interface CbrEstimate {
  cbrPercent: number;
  formula: string;
  source: string;
}

/**
 * CBR from k of the 762 mm plate by the UK DMRB IAN 73/06 correlation CBR = 6.1×10⁻⁸·k762^1.733 (k in kPa/m),
 * the inverse of the DMRB entry of {@link subgradeModulusFromCbr}; information only.
 */
export function cbrFromK762(k762MnM3: number): CbrEstimate {
  return {
    cbrPercent: 6.1e-8 * (requirePositive(k762MnM3, 'k762MnM3') * 1000) ** 1.733,
    formula: 'CBR = 6.1×10⁻⁸·k762^1.733 (k762 in kPa/m)',
    source: 'UK DMRB IAN 73/06 correlation (information only, not a CBR test)',
  };
}
