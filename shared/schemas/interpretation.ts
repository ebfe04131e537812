import { z } from 'zod';
import type { UltimateChoice } from '../interpretation/ultimate-standing';

/** The ultimate pressures an engineer can carry to the footing: each method's, or the largest pressure carried (q_ult ≥ q_max). */
export const ULTIMATE_METHODS = [
  'logLogIntersection',
  'tangentIntersection',
  'hyperbolic',
  'settlementCriterion',
  'brinchHansen80',
  'brinchHansen90',
  'largestPressure',
] as const satisfies readonly UltimateChoice[];

/** What a practitioner reads for each choice (the page, the report and the command line). */
export const ULTIMATE_METHOD_NAMES: Record<UltimateChoice, string> = {
  logLogIntersection: 'Log–log two-line intersection',
  tangentIntersection: 'Tangent intersection',
  hyperbolic: 'Hyperbolic asymptote (Chin–Kondner)',
  settlementCriterion: 'Settlement criterion',
  brinchHansen80: 'Brinch Hansen 80 %',
  brinchHansen90: 'Brinch Hansen 90 %',
  largestPressure: 'Largest pressure carried (q_ult ≥ q_max)',
};

/** A number, also when it comes as text (query string, command line); other text is left for zod to reject with the field's name. */
const numeric = <T extends z.ZodNumber>(schema: T) => z.preprocess((v) => (typeof v === 'string' && v.trim() !== '' ? Number(v) : v), schema);

/**
 * The engineer's interpretation settings and design inputs, every one optional (absent: the record's own
 * value or the method's default). One schema for the API query, the saved options and `npm run analyze`.
 */
export const interpretationSettings = z.strictObject({
  /** Footing to scale to; overrides the record's footing field by field. */
  footingShape: z.enum(['square', 'circular', 'strip', 'rectangular']).optional(),
  /** Footing width, m. */
  footingWidthM: numeric(z.number().positive().max(50)).optional(),
  /** Footing length of a rectangular footing, m. */
  footingLengthM: numeric(z.number().positive().max(200)).optional(),
  soilBehaviour: z.enum(['cohesionless', 'cohesive']).optional(),
  /** Permissible footing settlement, mm. */
  permissibleSettlementMm: numeric(z.number().positive().max(500)).optional(),
  factorOfSafety: numeric(z.number().min(1).max(10)).optional(),
  /** Depth of the footing base below ground, m. */
  foundationDepthM: numeric(z.number().min(0).max(50)).optional(),
  /** Unit weight of the soil above founding level, kN/m³. */
  unitWeightKnM3: numeric(z.number().min(0).max(30)).optional(),
  /** Settlement scaling from plate to footing; default Terzaghi & Peck on sand, the linear rule on clay. */
  settlementScaling: z.enum(['terzaghiPeckSand', 'dasSand', 'clayLinear', 'bond']).optional(),
  /** Bond's exponent n (0.03 clay … 0.5 dense sand), needed with the Bond rule. */
  bondExponent: numeric(z.number().min(0).max(1)).optional(),
  /** Column load on a square footing, kN: gives the footing width for the settlement limit. */
  columnLoadKn: numeric(z.number().positive().max(100_000)).optional(),
  /** The ultimate-pressure method carried to the footing; default the lowest ultimate within the test, else q_ult ≥ q_max. */
  ultimateMethod: z.enum(ULTIMATE_METHODS).optional(),
  /** σ0max convention of Ev2 (DIN 18134). */
  evConvention: z.enum(['firstLoadingMax', 'branchMax']).optional(),
  /** The contract's required Ev2, MN/m²: gives the Ev acceptance check. */
  evRequiredMnM2: numeric(z.number().positive().max(1000)).optional(),
  /** The contract's largest Ev2/Ev1; absent = no ratio requirement. */
  evMaxRatio: numeric(z.number().min(1).max(10)).optional(),
  /** A higher ratio is accepted when Ev1 ≥ this fraction × the required Ev2 (as some contracts allow). */
  evRelaxFraction: numeric(z.number().positive().max(1)).optional(),
  /** Deformation of the unsoaked consolidometer specimen under the test pressure, mm (soaked-k correction, with the soaked one). */
  unsoakedDeformationMm: numeric(z.number().positive().max(100)).optional(),
  /** Deformation of the soaked consolidometer specimen under the test pressure, mm. */
  soakedDeformationMm: numeric(z.number().positive().max(100)).optional(),
  /** Which application of each load level gives the loading curve and k (repeated loading). */
  kApplication: numeric(z.number().int().min(1).max(20)).optional(),
});
export type InterpretationSettings = z.infer<typeof interpretationSettings>;
