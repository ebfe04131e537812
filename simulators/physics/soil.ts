/*
 * Soil under a loaded plate, as pure functions of (state, pressure, time step). Published models
 * that give believable shapes (reference §G); parameters live in ./scenarios. This is a demo and test
 * rig, not a design tool.
 *
 * Settlement = Σ relaxation modes + creep. Each mode k carries a share w_k of the equilibrium
 * settlement and relaxes towards it at rate λ_k, so any load history (pumping, leakage, top-ups,
 * unloading) is followed by superposition without storing the history:
 *   granular: an immediate share plus one exponential, s_end − (s_end − s_0)·e^(−t/τ);
 *   clay:     an immediate share plus the Terzaghi series 1 − Σ 2/M²·e^(−M²·Tv), M = π(2m+1)/2.
 */

const SECONDS_PER_YEAR = 365.25 * 86_400;
const LN10 = Math.LN10;

/** Hyperbolic load–settlement envelope q = s/(a + b·s) (Kondner 1963) with a failure ratio (Duncan & Chang 1970). */
export interface Envelope {
  /** Initial stiffness 1/a, kPa per mm. */
  initialStiffnessKpaPerMm: number;
  /** Asymptote q_ult = 1/b, kPa. */
  qUltKpa: number;
  /** R_f = q_f/q_ult: beyond R_f·q_ult the plate keeps sinking at a rate that does not decay. */
  failureRatio: number;
}

/** Time model of a granular soil: most settlement within minutes. */
export interface GranularTime {
  kind: 'granular';
  /** Share of each settlement change that appears at once (0–1). */
  immediateFraction: number;
  /** Time constant τ of the exponential approach, minutes (1–5 min is common practice). */
  tauMin: number;
}

/** Time model of a clay: Terzaghi one-dimensional consolidation after an immediate share. */
export interface ClayTime {
  kind: 'clay';
  /** Undrained (immediate) share of each settlement change (0–1). */
  immediateFraction: number;
  /** Coefficient of consolidation c_v, m²/year. */
  cvM2PerYear: number;
  /** Drainage length H_dr of the stressed zone, m (≈ plate width). */
  drainagePathM: number;
}

export type TimeModel = GranularTime | ClayTime;

/** Creep per log cycle of time (reference §B.8), growing as q nears q_ult. */
export interface Creep {
  /** Creep per log cycle at q = q_ult/2, mm; it scales with x/(1 − x), x = q/q_ult. */
  mmPerLogCycleAtHalf: number;
  /** Reference time t_ref of α·log10(1 + t/t_ref), minutes. */
  tRefMin: number;
}

export interface SoilModel {
  envelope: Envelope;
  time: TimeModel;
  creep: Creep;
  /** Rebound on full release as a fraction of the settlement at the largest pressure so far. */
  reboundFraction: number;
  /** Settlement rate at q = R_f·q_ult, mm/min; it rises with the excess pressure and does not decay. */
  failureRateMmPerMin: number;
}

export interface SoilState {
  /** Largest pressure reached on the virgin (first-loading) curve, kPa. */
  qMaxKpa: number;
  /** Settlement carried by each relaxation mode, mm (same order as `relaxationModes`). */
  modeMm: readonly number[];
  /** Irrecoverable creep and failure settlement, mm. */
  creepMm: number;
  /** Seconds since the virgin pressure last rose by more than a top-up would. */
  creepClockS: number;
  /** The virgin pressure when the creep clock last restarted, kPa. */
  creepStageKpa: number;
}

export interface RelaxationMode {
  weight: number;
  /** Per second; Infinity for the immediate share. */
  rate: number;
}

/** Top-ups back to the same target must not restart the creep clock; a new increment does. */
const NEW_STAGE_RISE = 1.02;
/** Creep acts only while the plate is near its largest pressure (not after unloading). */
const CREEP_LOAD_SHARE = 0.9;
/** The hyperbola is infinite at q_ult; equilibrium is capped just below it and failure does the rest. */
const MAX_LOAD_RATIO = 0.995;
/** Exponent of the unload–reload curve: > 1 puts the rebound at low pressure. */
const REBOUND_SHAPE = 1.5;
/** Terzaghi modes kept; the tail (≈ 0.3 % of the weight) joins the immediate share. */
const CLAY_MODES = 60;

/** Pressure on the envelope at settlement s: q = s/(a + b·s). */
export function envelopePressureKpa(envelope: Envelope, settlementMm: number): number {
  const a = 1 / envelope.initialStiffnessKpaPerMm;
  const b = 1 / envelope.qUltKpa;
  return settlementMm / (a + b * settlementMm);
}

/** Settlement on the envelope at pressure q, the inverse s = a·q/(1 − b·q); Infinity at or past q_ult. */
export function envelopeSettlementMm(envelope: Envelope, qKpa: number): number {
  const a = 1 / envelope.initialStiffnessKpaPerMm;
  const b = 1 / envelope.qUltKpa;
  const rest = 1 - b * qKpa;
  return rest <= 0 ? Number.POSITIVE_INFINITY : (a * qKpa) / rest;
}

/** Pressure at which settlement runs away, R_f·q_ult, kPa. */
export function failurePressureKpa(envelope: Envelope): number {
  return envelope.failureRatio * envelope.qUltKpa;
}

/**
 * Average degree of consolidation U(Tv), Terzaghi (1925), by the two closed-form branches found in
 * soil-mechanics texts: U = √(4Tv/π) while U < 0.6 (Tv < 0.2827), else U = 1 − (8/π²)·e^(−π²Tv/4).
 */
export function consolidationDegree(timeFactor: number): number {
  if (!(timeFactor >= 0)) throw new RangeError(`"timeFactor" must be ≥ 0 (got ${timeFactor})`);
  const early = Math.sqrt((4 * timeFactor) / Math.PI);
  if (early < 0.6) return early;
  return 1 - (8 / Math.PI ** 2) * Math.exp((-(Math.PI ** 2) * timeFactor) / 4);
}

/** Time factor Tv = c_v·t/H_dr². */
export function timeFactor(time: ClayTime, elapsedS: number): number {
  return ((time.cvM2PerYear / SECONDS_PER_YEAR) * elapsedS) / time.drainagePathM ** 2;
}

/** Time for a given degree of consolidation, seconds, by inverting the branches of `consolidationDegree`. */
export function consolidationTimeS(time: ClayTime, degree: number): number {
  if (!(degree > 0 && degree < 1)) throw new RangeError(`"degree" must lie between 0 and 1 (got ${degree})`);
  const tv = degree < 0.6 ? (Math.PI / 4) * degree ** 2 : (-4 / Math.PI ** 2) * Math.log(((1 - degree) * Math.PI ** 2) / 8);
  return (tv * time.drainagePathM ** 2) / (time.cvM2PerYear / SECONDS_PER_YEAR);
}

const modeCache = new WeakMap<TimeModel, RelaxationMode[]>();

/** The relaxation modes of a time model; weights sum to 1. */
export function relaxationModes(time: TimeModel): RelaxationMode[] {
  const cached = modeCache.get(time);
  if (cached) return cached;
  const delayed = 1 - time.immediateFraction;
  const modes: RelaxationMode[] = [];
  if (time.kind === 'granular') {
    modes.push({ weight: delayed, rate: 1 / (time.tauMin * 60) });
  } else {
    const cv = time.cvM2PerYear / SECONDS_PER_YEAR;
    for (let m = 0; m < CLAY_MODES; m++) {
      const big = (Math.PI * (2 * m + 1)) / 2;
      modes.push({ weight: (delayed * 2) / big ** 2, rate: (big ** 2 * cv) / time.drainagePathM ** 2 });
    }
  }
  const tail = 1 - modes.reduce((sum, mode) => sum + mode.weight, 0);
  modes.unshift({ weight: tail, rate: Number.POSITIVE_INFINITY });
  modeCache.set(time, modes);
  return modes;
}

/**
 * Settlement the soil tends to under q, given the largest pressure so far: the virgin envelope when
 * q ≥ q_max, else the unload–reload curve s_max·(1 − ρ·(1 − q/q_max)^1.5). It loses `reboundFraction`
 * ρ on full release, most of it at low pressure, so a few per cent of leakage barely lifts the plate
 * (common practice). Reloading follows this curve, stiffer than first loading, until it rejoins the
 * virgin curve at q_max.
 */
export function equilibriumSettlementMm(soil: SoilModel, qKpa: number, qMaxKpa: number): number {
  const cap = MAX_LOAD_RATIO * soil.envelope.qUltKpa;
  const virgin = (q: number) => envelopeSettlementMm(soil.envelope, Math.min(Math.max(q, 0), cap));
  if (qKpa >= qMaxKpa) return virgin(qKpa);
  const atMax = virgin(qMaxKpa);
  return atMax * (1 - soil.reboundFraction * (1 - Math.max(qKpa, 0) / qMaxKpa) ** REBOUND_SHAPE);
}

/** Creep per log cycle at pressure q, mm: α½·x/(1 − x), x = q/q_ult. */
export function creepPerLogCycleMm(soil: SoilModel, qKpa: number): number {
  const x = Math.min(Math.max(qKpa, 0) / soil.envelope.qUltKpa, MAX_LOAD_RATIO);
  return (soil.creep.mmPerLogCycleAtHalf * x) / (1 - x);
}

/** Settlement rate from failure, mm/s: zero below R_f·q_ult, then rising with the excess and never decaying. */
export function failureRateMmPerS(soil: SoilModel, qKpa: number): number {
  const qf = failurePressureKpa(soil.envelope);
  if (qKpa <= qf) return 0;
  const excess = (qKpa - qf) / (0.05 * soil.envelope.qUltKpa);
  return (soil.failureRateMmPerMin * (1 + excess)) / 60;
}

/** The soil at rest under q (e.g. the plate and apparatus before the test). */
export function initialSoilState(soil: SoilModel, qKpa: number): SoilState {
  const settlement = equilibriumSettlementMm(soil, qKpa, qKpa);
  return {
    qMaxKpa: qKpa,
    modeMm: relaxationModes(soil.time).map((mode) => mode.weight * settlement),
    creepMm: 0,
    creepClockS: 0,
    creepStageKpa: qKpa,
  };
}

/** Total settlement of the plate centre, mm. */
export function soilSettlementMm(state: SoilState): number {
  return state.modeMm.reduce((sum, mm) => sum + mm, state.creepMm);
}

/** Advances the soil by dtS seconds under a constant pressure q (exact for constant q). */
export function stepSoil(soil: SoilModel, state: SoilState, qKpa: number, dtS: number): SoilState {
  const qMaxKpa = Math.max(state.qMaxKpa, qKpa);
  const target = equilibriumSettlementMm(soil, qKpa, qMaxKpa);
  const modes = relaxationModes(soil.time);
  const modeMm = state.modeMm.map((mm, k) => {
    const goal = modes[k].weight * target;
    return goal + (mm - goal) * Math.exp(-modes[k].rate * dtS);
  });

  const newStage = qMaxKpa > state.creepStageKpa * NEW_STAGE_RISE;
  const creepStageKpa = newStage ? qMaxKpa : state.creepStageKpa;
  const clockS = newStage ? 0 : state.creepClockS;
  const tRefS = soil.creep.tRefMin * 60;
  const creeping = qKpa >= CREEP_LOAD_SHARE * qMaxKpa;
  // ∫ α/ln10 · dt/(t_ref + t) over the step = α·log10 of the ratio of (t_ref + t) at both ends.
  const creep = creeping ? creepPerLogCycleMm(soil, qKpa) * (Math.log((tRefS + clockS + dtS) / (tRefS + clockS)) / LN10) : 0;
  const failure = failureRateMmPerS(soil, qKpa) * dtS;

  return {
    qMaxKpa,
    modeMm,
    creepMm: state.creepMm + creep + failure,
    creepClockS: clockS + dtS,
    creepStageKpa,
  };
}
