import type { Plate } from '../domain/plate';
import { InterpretationInputError, requireInRange, requirePositive } from './input-checks';

/** Influence factor of a rigid circular plate, π/4 (Boussinesq; EN 1997-2 Annex K.2). */
export const RIGID_CIRCLE_INFLUENCE = Math.PI / 4;
/** Default influence factor of a rigid square plate (some texts 0.88; the equal-area circle gives 0.886). */
export const RIGID_SQUARE_INFLUENCE = 0.82;
/** Poisson's ratio implied by DIN 18134's factor 1.5 = π(1 − ν²)/2: ν = √(1 − 3/π) ≈ 0.2123. */
export const DIN_IMPLIED_POISSON = Math.sqrt(1 - 3 / Math.PI);

/** Input of {@link elasticModulusFromSettlement}. */
export interface ElasticSettlementInput {
  /** Pressure increment Δq, kPa. */
  deltaPressureKpa: number;
  /** Settlement increment Δs over the same step, mm. */
  deltaSettlementMm: number;
  /** Plate width or diameter B, mm. */
  widthMm: number;
  /** Poisson's ratio ν (0.5 undrained fine soil, 0.3 coarse soil). */
  poisson: number;
  /** Influence factor I_s. */
  influenceFactor: number;
}

/** Young's modulus from a plate, with the terms used. */
export interface ElasticModulus {
  eMpa: number;
  influenceFactor: number;
  formula: string;
  source: string;
}

/**
 * Young's modulus from s = q·B·(1 − ν²)·I_s/E (elastic half-space; Das, Bowles; reference §B.7):
 * E = Δq·B·(1 − ν²)·I_s/Δs, in MPa (kPa·mm/mm ÷ 1000).
 */
export function elasticModulusFromSettlement(input: ElasticSettlementInput): ElasticModulus {
  const dq = requirePositive(input.deltaPressureKpa, 'deltaPressureKpa');
  const ds = requirePositive(input.deltaSettlementMm, 'deltaSettlementMm');
  const b = requirePositive(input.widthMm, 'widthMm');
  const nu = requireInRange(input.poisson, 0, 0.5, 'poisson');
  const i = requirePositive(input.influenceFactor, 'influenceFactor');
  return {
    eMpa: (dq * b * (1 - nu * nu) * i) / ds / 1000,
    influenceFactor: i,
    formula: 'E = Δq·B·(1 − ν²)·I_s/Δs',
    source: 'Elastic half-space settlement (Das, Principles of Foundation Engineering; Bowles 1996)',
  };
}

/** Input of {@link rigidPlateModulus}. */
export interface RigidPlateInput {
  plate: Plate;
  deltaPressureKpa: number;
  deltaSettlementMm: number;
  poisson: number;
  /** Influence factor for a square plate. Default 0.82. */
  squareInfluenceFactor?: number;
}

/**
 * Young's modulus from a rigid plate: circular E = (π/4)(1 − ν²)·Δq·D/Δs (EN 1997-2 Annex K.2 E_PLT,
 * secant, Δs includes creep); square the same with I_s = 0.82 by default (reference §B.7, check C9).
 */
export function rigidPlateModulus(input: RigidPlateInput): ElasticModulus {
  const { shape, sizeMm } = input.plate;
  if (shape !== 'circular' && shape !== 'square') throw new InterpretationInputError('plate.shape', 'must be "circular" or "square"');
  const circular = shape === 'circular';
  const result = elasticModulusFromSettlement({
    deltaPressureKpa: input.deltaPressureKpa,
    deltaSettlementMm: input.deltaSettlementMm,
    widthMm: sizeMm,
    poisson: input.poisson,
    influenceFactor: circular ? RIGID_CIRCLE_INFLUENCE : (input.squareInfluenceFactor ?? RIGID_SQUARE_INFLUENCE),
  });
  return circular ? { ...result, formula: 'E = (π/4)·(1 − ν²)·Δq·D/Δs', source: 'EN 1997-2:2007 Annex K.2 (E_PLT); Boussinesq rigid circular plate' } : result;
}

/** Young's modulus equivalent to a DIN deformation modulus: E = Ev·(π/3)(1 − ν²) (reference §B.7 [calc]). */
export function elasticModulusFromEv(evMnM2: number, poisson: number): number {
  return requirePositive(evMnM2, 'evMnM2') * (Math.PI / 3) * (1 - requireInRange(poisson, 0, 0.5, 'poisson') ** 2);
}
