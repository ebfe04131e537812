import type { Plate } from '@shared/domain/plate';
import type { SoilModel } from './soil';

/**
 * Named demo grounds for the rig simulator. Ranges for a 300 mm plate are common practice
 * (reference §G); the single values picked inside them are ours. Clay drainage lengths are chosen
 * (calc) so that 90 % consolidation takes 12–48 h, so a clay hold really lasts about a day.
 */
export interface SoilScenario extends SoilModel {
  id: string;
  summary: string;
  /** The plate the parameters are quoted for. */
  plate: Plate;
  /**
   * Differential settlement between two opposite plate edges as a fraction of the mean settlement
   * (0 = uniform ground); it makes the tilt grow with settlement.
   */
  nonUniformity: number;
}

const PLATE_300: Plate = { shape: 'circular', sizeMm: 300 };

const scenarioList: SoilScenario[] = [
  {
    id: 'dense-sand',
    summary: 'Dense sand: stiff, settles within minutes, far from failure at usual test pressures.',
    plate: PLATE_300,
    // q_ult 800–1200 kPa and 1/a 150–300 kPa/mm: common practice.
    envelope: { initialStiffnessKpaPerMm: 220, qUltKpa: 1000, failureRatio: 0.9 },
    // τ 1–5 min: common practice.
    time: { kind: 'granular', immediateFraction: 0.6, tauMin: 2 },
    creep: { mmPerLogCycleAtHalf: 0.02, tRefMin: 1 },
    // Rebound 10–30 % on granular soil: common practice.
    reboundFraction: 0.2,
    failureRateMmPerMin: 0.1,
    nonUniformity: 0.05,
  },
  {
    id: 'loose-sand',
    summary: 'Loose, patchy sand: soft, tilts, and fails near 270 kPa.',
    plate: PLATE_300,
    // q_ult 250–400 kPa and 1/a 40–80 kPa/mm: common practice.
    envelope: { initialStiffnessKpaPerMm: 60, qUltKpa: 320, failureRatio: 0.85 },
    time: { kind: 'granular', immediateFraction: 0.4, tauMin: 4 },
    creep: { mmPerLogCycleAtHalf: 0.06, tRefMin: 1 },
    reboundFraction: 0.12,
    failureRateMmPerMin: 0.1,
    // Patchy ground: opposite gauges differ by a quarter of the mean, enough to raise a tilt alarm.
    nonUniformity: 0.25,
  },
  {
    id: 'compacted-fill',
    summary: 'Well compacted granular fill for a repeated-load (Ev1/Ev2) test.',
    plate: PLATE_300,
    envelope: { initialStiffnessKpaPerMm: 250, qUltKpa: 1500, failureRatio: 0.9 },
    time: { kind: 'granular', immediateFraction: 0.7, tauMin: 1 },
    creep: { mmPerLogCycleAtHalf: 0.01, tRefMin: 1 },
    // Chosen so that Ev2/Ev1 comes out near 2.5–3 (Ev2/Ev1 ≈ 2–3 on compacted fill: common practice).
    reboundFraction: 0.35,
    failureRateMmPerMin: 0.1,
    nonUniformity: 0.04,
  },
  {
    id: 'stiff-clay',
    summary: 'Stiff clay: large immediate share, 90 % consolidation in about 17 h.',
    plate: PLATE_300,
    // q_ult 600–900 kPa: common practice.
    envelope: { initialStiffnessKpaPerMm: 120, qUltKpa: 750, failureRatio: 0.85 },
    // t90 = 0.848·H²/c_v = 0.848·0.09/40 year ≈ 16.7 h (calc).
    time: { kind: 'clay', immediateFraction: 0.45, cvM2PerYear: 40, drainagePathM: 0.3 },
    creep: { mmPerLogCycleAtHalf: 0.03, tRefMin: 60 },
    reboundFraction: 0.15,
    failureRateMmPerMin: 0.05,
    nonUniformity: 0.08,
  },
  {
    id: 'soft-clay',
    summary: 'Soft clay: settles for a day per increment, 90 % consolidation in about 24 h.',
    plate: PLATE_300,
    // q_ult 120–250 kPa: common practice.
    envelope: { initialStiffnessKpaPerMm: 25, qUltKpa: 180, failureRatio: 0.8 },
    // t90 = 0.848·0.09/28 year ≈ 23.9 h (calc).
    time: { kind: 'clay', immediateFraction: 0.3, cvM2PerYear: 28, drainagePathM: 0.3 },
    creep: { mmPerLogCycleAtHalf: 0.05, tRefMin: 60 },
    reboundFraction: 0.1,
    failureRateMmPerMin: 0.05,
    nonUniformity: 0.1,
  },
];

export const SCENARIOS: ReadonlyMap<string, SoilScenario> = new Map(scenarioList.map((s) => [s.id, s]));

export const SCENARIO_IDS: readonly string[] = scenarioList.map((s) => s.id);

/** The named scenario; the error lists the known names. */
export function scenarioById(id: string): SoilScenario {
  const scenario = SCENARIOS.get(id);
  if (!scenario) throw new RangeError(`unknown "scenario" "${id}"; choose one of ${SCENARIO_IDS.join(', ')}`);
  return scenario;
}
