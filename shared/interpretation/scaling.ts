import { InterpretationInputError, requireInRange, requirePositive } from './input-checks';

/** Soil behaviour for scaling: granular (drained), clay (undrained, homogeneous) or a c–φ soil. */
export type ScalingSoil = 'cohesionless' | 'cohesive' | 'mixed';

/** How a plate settlement is scaled to a footing at the same pressure (reference §B.3). */
export type SettlementScaling =
  | { kind: 'terzaghiPeckSand' }
  | { kind: 'dasSand' }
  | { kind: 'clayLinear' }
  /** Bond (1961): exponent n from 0.03 (clay) to 0.5 (dense sand). */
  | { kind: 'bond'; exponentN: number };

/** A scaled settlement with the ratio S_f/S_p that produced it. */
export interface ScaledSettlement {
  ratio: number;
  settlementMm: number;
  formula: string;
  source: string;
}

/** A caution about scaling, for display beside the result. */
export interface ScalingWarning {
  code: string;
  severity: 'warning' | 'info';
  message: string;
}

/** Bond (1961) exponent n by soil, as [low, high] (reference §B.3 [mem]). */
export const BOND_EXPONENT_RANGES = {
  clay: [0.03, 0.05],
  sandyClay: [0.08, 0.1],
  looseSand: [0.2, 0.25],
  mediumDenseSand: [0.25, 0.35],
  denseSand: [0.4, 0.5],
} as const;

/** Terzaghi & Peck's 0.3 m (1 ft) reference width, m. */
const REFERENCE_WIDTH_M = 0.3;

function widths(plateWidthM: number, footingWidthM: number): [number, number] {
  return [requirePositive(plateWidthM, 'plateWidthM'), requirePositive(footingWidthM, 'footingWidthM')];
}

/**
 * S_f/S_p on sand, Terzaghi & Peck (1948, 1967): [B_f(B_p + 0.3)/(B_p(B_f + 0.3))]², B in m (reference §B.3).
 * Tends to 4.0 as B_f → ∞ for B_p = 0.3 m.
 */
export function terzaghiPeckSandRatio(plateWidthM: number, footingWidthM: number): number {
  const [bp, bf] = widths(plateWidthM, footingWidthM);
  return ((bf * (bp + REFERENCE_WIDTH_M)) / (bp * (bf + REFERENCE_WIDTH_M))) ** 2;
}

/** S_f/S_p on sand, Das form: [2B_f/(B_f + B_p)]², identical to Terzaghi & Peck when B_p = 0.3 m (reference §B.3). */
export function dasSandRatio(plateWidthM: number, footingWidthM: number): number {
  const [bp, bf] = widths(plateWidthM, footingWidthM);
  return ((2 * bf) / (bf + bp)) ** 2;
}

/** S_f/S_p on homogeneous clay (undrained, elastic): B_f/B_p (Terzaghi & Peck; reference §B.3). */
export function clayLinearRatio(plateWidthM: number, footingWidthM: number): number {
  const [bp, bf] = widths(plateWidthM, footingWidthM);
  return bf / bp;
}

/** S_f/S_p after Bond (1961): (B_f/B_p)^(n+1) (reference §B.3). n = 0 reproduces the clay ratio. */
export function bondRatio(plateWidthM: number, footingWidthM: number, exponentN: number): number {
  const [bp, bf] = widths(plateWidthM, footingWidthM);
  return (bf / bp) ** (requireInRange(exponentN, 0, 1, 'exponentN') + 1);
}

const SCALINGS = {
  terzaghiPeckSand: { formula: 'S_f = S_p·[B_f(B_p + 0.3)/(B_p(B_f + 0.3))]² (B in m)', source: 'Terzaghi & Peck (1948, 1967) Soil Mechanics in Engineering Practice' },
  dasSand: { formula: 'S_f = S_p·[2B_f/(B_f + B_p)]²', source: 'Das, Principles of Foundation Engineering (plate load test)' },
  clayLinear: { formula: 'S_f = S_p·B_f/B_p', source: 'Terzaghi & Peck (1948, 1967); elastic half-space' },
  bond: { formula: 'S_f = S_p·(B_f/B_p)^(n+1)', source: 'Bond (1961) Géotechnique 11(2)' },
} as const;

/** The names a practitioner reads for each settlement-scaling rule. */
export const SCALING_NAMES: Record<SettlementScaling['kind'], string> = {
  terzaghiPeckSand: 'the Terzaghi & Peck sand rule',
  dasSand: 'the sand rule in Das’s form',
  clayLinear: 'the linear rule for clay',
  bond: 'Bond’s rule',
};

/** The scaling rule in words, with Bond's exponent when it has one. */
export function scalingName(scaling: SettlementScaling): string {
  return scaling.kind === 'bond' ? `${SCALING_NAMES.bond} (n = ${scaling.exponentN})` : SCALING_NAMES[scaling.kind];
}

/** A footing or plate outline for shape factors: width over length (1 for a square or circle, 0 for a strip). */
export function breadthOverLength(shape: 'square' | 'circular' | 'strip' | 'rectangular', widthM: number, lengthM?: number | null): number {
  if (shape === 'square' || shape === 'circular') return 1;
  if (shape === 'strip') return 0;
  if (lengthM === undefined || lengthM === null) throw new InterpretationInputError('footing.lengthM', 'a rectangular footing needs its length for the shape factor');
  if (lengthM < widthM) throw new InterpretationInputError('footing.lengthM', 'must not be shorter than the width');
  return widthM / lengthM;
}

/** The shape factor ratio applied when a square or circular plate's ultimate pressure is carried to a footing of another shape. */
export interface ShapeCorrection {
  /** s_footing / s_plate, the multiplier on q_ult. */
  factor: number;
  plateFactor: number;
  footingFactor: number;
  formula: string;
  source: string;
}

/**
 * Shape factor of the bearing-capacity term that governs each soil: clay s_c = 1 + 0.2·B/L (Skempton 1951),
 * sand s_γ = 1 − 0.4·B/L (De Beer 1970, Vesić 1973). A square or circular plate has B/L = 1. The factor on
 * the plate's q_ult is s(footing)/s(plate): for a strip from a square plate 1/1.2 on clay, 1/0.6 on sand.
 */
export function shapeCorrection(soil: 'cohesionless' | 'cohesive', footingBOverL: number, plateBOverL = 1): ShapeCorrection {
  const f = requireInRange(footingBOverL, 0, 1, 'footingBOverL');
  const p = requireInRange(plateBOverL, 0, 1, 'plateBOverL');
  if (soil === 'cohesive') {
    const s = (r: number) => 1 + 0.2 * r;
    return { factor: s(f) / s(p), plateFactor: s(p), footingFactor: s(f), formula: 's_c = 1 + 0.2·B/L; q_u,f × s_c,f/s_c,p', source: 'Skempton (1951) N_c of clays, shape factor 1 + 0.2·B/L' };
  }
  const s = (r: number) => 1 - 0.4 * r;
  return { factor: s(f) / s(p), plateFactor: s(p), footingFactor: s(f), formula: 's_γ = 1 − 0.4·B/L; q_u,f × s_γ,f/s_γ,p', source: 'De Beer (1970); Vesić (1973) shape factor of the Nγ term, 1 − 0.4·B/L' };
}

/** S_f/S_p for a scaling choice. */
export function settlementRatio(scaling: SettlementScaling, plateWidthM: number, footingWidthM: number): number {
  switch (scaling.kind) {
    case 'terzaghiPeckSand':
      return terzaghiPeckSandRatio(plateWidthM, footingWidthM);
    case 'dasSand':
      return dasSandRatio(plateWidthM, footingWidthM);
    case 'clayLinear':
      return clayLinearRatio(plateWidthM, footingWidthM);
    case 'bond':
      return bondRatio(plateWidthM, footingWidthM, scaling.exponentN);
    default:
      throw new InterpretationInputError('scaling.kind', `unknown scaling "${(scaling as { kind: string }).kind}"`);
  }
}

/** Footing settlement at the same pressure as the plate: S_f = S_p · ratio (reference §B.3). */
export function footingSettlement(plateSettlementMm: number, plateWidthM: number, footingWidthM: number, scaling: SettlementScaling): ScaledSettlement {
  const ratio = settlementRatio(scaling, plateWidthM, footingWidthM);
  return { ratio, settlementMm: requirePositive(plateSettlementMm, 'plateSettlementMm') * ratio, ...SCALINGS[scaling.kind] };
}

/** Plate settlement that corresponds to a footing settlement: S_p = S_f / ratio (reference §B.4). */
export function plateSettlementForFooting(footingSettlementMm: number, plateWidthM: number, footingWidthM: number, scaling: SettlementScaling): ScaledSettlement {
  const ratio = settlementRatio(scaling, plateWidthM, footingWidthM);
  return { ratio, settlementMm: requirePositive(footingSettlementMm, 'footingSettlementMm') / ratio, ...SCALINGS[scaling.kind] };
}

/**
 * Ultimate pressure of the footing from the plate's (reference §B.3; Das, Punmia, Ranjan & Rao):
 * sand (surface, c = 0, q = ½γBNγ) q_u,f = q_u,p·B_f/B_p; clay (c·N_c independent of B) q_u,f = q_u,p.
 * A c–φ soil has no single-plate scaling (use two plate sizes): throws for `mixed`.
 */
export function footingUltimatePressure(
  qUltPlateKpa: number,
  plateWidthM: number,
  footingWidthM: number,
  soil: ScalingSoil,
  /** Footing width over length for the shape factor (1 square or circle, 0 strip); absent = same shape as the plate, no factor. */
  footingBOverL?: number,
): { qUltKpa: number; formula: string; source: string; shape: ShapeCorrection | null } {
  const [bp, bf] = widths(plateWidthM, footingWidthM);
  const qp = requirePositive(qUltPlateKpa, 'qUltPlateKpa');
  const source = 'Das, Principles of Foundation Engineering; Punmia; Ranjan & Rao';
  if (soil === 'mixed') throw new InterpretationInputError('soil', 'a c–φ soil has no single-plate scaling of the ultimate pressure: test two plate sizes (Housel)');
  const shape = footingBOverL === undefined ? null : shapeCorrection(soil, footingBOverL);
  const factor = shape?.factor ?? 1;
  const withShape = (formula: string) => (shape ? `${formula}·s_f/s_p (shape factor ${shape.factor.toFixed(3)})` : formula);
  const sources = shape ? `${source}; ${shape.source}` : source;
  if (soil === 'cohesionless') return { qUltKpa: ((qp * bf) / bp) * factor, formula: withShape('q_u,f = q_u,p·B_f/B_p'), source: sources, shape };
  return { qUltKpa: qp * factor, formula: withShape('q_u,f = q_u,p'), source: sources, shape };
}

/** Input of {@link scalingWarnings}. */
export interface ScalingContext {
  soil: ScalingSoil;
  plateWidthM: number;
  footingWidthM: number;
  /** The settlement scaling in use, if any. */
  scaling?: SettlementScaling;
  /** True when an ultimate pressure is being scaled. */
  scalesUltimate?: boolean;
  /** Depth of the water table below the test level, m; null or absent when unknown. */
  waterTableBelowTestM?: number | null;
}

/**
 * The cautions of reference §B.3 that apply to a scaling, as structured warnings: sand-ratio limit,
 * depth of influence, scale effect on q_u for sand, water table, clay long-term settlement, c–φ soils,
 * and a footing narrower than the plate.
 */
export function scalingWarnings(context: ScalingContext): ScalingWarning[] {
  const [bp, bf] = widths(context.plateWidthM, context.footingWidthM);
  const warnings: ScalingWarning[] = [];
  const warn = (code: string, message: string, severity: ScalingWarning['severity'] = 'warning') => warnings.push({ code, severity, message });
  const kind = context.scaling?.kind;

  if (bf <= bp) warn('footing_not_wider', 'The footing is not wider than the plate; the scaling formulas are meant for B_f > B_p.');
  if (bf > bp) {
    warn(
      'depth_of_influence',
      `The plate stresses the soil to about ${(2 * bp).toFixed(2)} m (2 B_p), the footing to about ${(2 * bf).toFixed(2)} m (2 B_f): a weaker layer in between is invisible to the plate.`,
    );
  }
  if (kind === 'terzaghiPeckSand' || kind === 'dasSand') {
    warn('sand_ratio_limit', 'The sand ratio tends to 4 for wide footings; field data on loose sand show larger ratios, so the formula can be unconservative there.');
  }
  if (context.soil === 'cohesionless' && context.scalesUltimate) {
    warn('sand_ultimate_scale_effect', 'Scaling q_u in proportion to width overestimates large footings: Nγ decreases with size (scale effect).');
  }
  if (context.soil === 'cohesive') {
    warn('clay_long_term', 'On clay the plate gives immediate and short-term settlement only; long-term consolidation needs an oedometer-based calculation.');
    if (kind === 'terzaghiPeckSand' || kind === 'dasSand') warn('sand_rule_on_clay', 'A sand scaling rule is applied to a cohesive soil.');
  }
  if (context.soil === 'cohesionless' && kind === 'clayLinear') warn('clay_rule_on_sand', 'The clay (linear) scaling rule is applied to a cohesionless soil.');
  if (context.soil === 'mixed') warn('mixed_soil', 'A c–φ soil has no single-plate scaling: use two plate sizes (Housel) or the intercept of q_u against B.');
  const wt = context.waterTableBelowTestM;
  if (wt !== undefined && wt !== null && wt < bf) {
    warn('water_table', `The water table is ${wt} m below test level, within the footing width: sands lose about half of q_u when submerged; test at, or correct to, the design water level.`);
  }
  return warnings;
}
