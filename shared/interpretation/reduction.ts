import type { Branch } from '../plans/stages';
import type { CurvePoint } from './curve';
import { InterpretationInputError, requireFinite, requirePositive } from './input-checks';
import { leastSquares } from './regression';
import type { TimeSettlement } from './time-settlement';

/** One timed reading within a stage. */
export interface TimedReading {
  /** Minutes since the start of the stage. */
  tMin: number;
  pressureKpa: number;
  /** Settlement per gauge, mm, already zero- and reset-corrected. */
  gauges: number[];
}

/** The readings of one stage of a run. */
export interface StageReadings {
  index: number;
  branch: Branch;
  targetKpa: number;
  readings: TimedReading[];
}

/** Which reading of a stage stands for the stage on the load–settlement curve. */
export type ReductionRule =
  /** The last reading of the hold. */
  | { kind: 'endOfHold' }
  /** The state at a fixed time into the stage (e.g. DIN 18134: about 2 min), interpolated linearly in time. */
  | { kind: 'atTime'; minutes: number };

/** A stage reduced to one point of the load–settlement curve. */
export interface StagePoint extends CurvePoint {
  index: number;
  branch: Branch;
  gaugesMm: number[];
  /** Minutes since the start of the stage at which the point was taken. */
  tMin: number;
  /** True when an `atTime` rule asked for a time after the stage's last reading (the last reading is used). */
  cutShort: boolean;
}

/** Tilt of the plate. */
export interface Tilt {
  radians: number;
  degrees: number;
  /** Slope written as 1 in N (N = 1/tan θ); null when the plate is level. */
  oneIn: number | null;
}

/** A gauge's position on the plate (mm, origin at the plate centre) and its settlement (mm). */
export interface GaugeAtPosition {
  xMm: number;
  yMm: number;
  settlementMm: number;
}

/** Least-squares plane s = c0 + cx·x + cy·y through the gauges. */
export interface PlaneFit {
  /** Settlement of the plane at the origin (the plate centre), mm. */
  centreMm: number;
  /** Gradients ∂s/∂x and ∂s/∂y, mm/mm. */
  gradientX: number;
  gradientY: number;
  /** Steepest tilt of the plane, θ = atan √(cx² + cy²). */
  tilt: Tilt;
  /** Gauge minus plane, mm: non-zero with four or more gauges (plate dishing or a faulty gauge). */
  residualsMm: number[];
}

/**
 * Mean settlement of the gauges, s = Σ s_i / n. With two diametrically opposite gauges this is the centre
 * settlement of a rigid tilting plate (reference §B.1 [calc]).
 */
export function meanSettlement(gaugesMm: readonly number[], field = 'gauges'): number {
  if (gaugesMm.length === 0) throw new InterpretationInputError(field, 'needs at least one gauge');
  for (const [i, s] of gaugesMm.entries()) requireFinite(s, `${field}[${i}]`);
  return gaugesMm.reduce((a, b) => a + b, 0) / gaugesMm.length;
}

function tiltFromSlope(slope: number): Tilt {
  const radians = Math.atan(Math.abs(slope));
  return { radians, degrees: (radians * 180) / Math.PI, oneIn: slope === 0 ? null : 1 / Math.abs(slope) };
}

/** Tilt between two gauges a distance L apart: θ = atan(|s1 − s2| / L) (reference §B.1 [calc]). */
export function tiltBetweenGauges(s1Mm: number, s2Mm: number, separationMm: number): Tilt {
  requireFinite(s1Mm, 's1Mm');
  requireFinite(s2Mm, 's2Mm');
  return tiltFromSlope((s1Mm - s2Mm) / requirePositive(separationMm, 'separationMm'));
}

/**
 * Plane fit through three or more gauges, s = c0 + cx·x + cy·y by least squares; tilt = atan √(cx² + cy²)
 * (reference §B.1 [calc]). Throws when the gauges are fewer than three or stand on one line.
 */
export function planeFitTilt(gauges: readonly GaugeAtPosition[], field = 'gauges'): PlaneFit {
  if (gauges.length < 3) throw new InterpretationInputError(field, `a plane needs at least three gauges (got ${gauges.length})`);
  gauges.forEach((g, i) => {
    requireFinite(g.xMm, `${field}[${i}].xMm`);
    requireFinite(g.yMm, `${field}[${i}].yMm`);
    requireFinite(g.settlementMm, `${field}[${i}].settlementMm`);
  });
  const [c0, cx, cy] = leastSquares(
    gauges.map((g) => [1, g.xMm, g.yMm]),
    gauges.map((g) => g.settlementMm),
    field,
  );
  return {
    centreMm: c0,
    gradientX: cx,
    gradientY: cy,
    tilt: tiltFromSlope(Math.hypot(cx, cy)),
    residualsMm: gauges.map((g) => g.settlementMm - (c0 + cx * g.xMm + cy * g.yMm)),
  };
}

function checkReadings(stage: StageReadings, field: string): void {
  if (stage.readings.length === 0) throw new InterpretationInputError(`${field}.readings`, 'the stage has no readings');
  const gaugeCount = stage.readings[0].gauges.length;
  stage.readings.forEach((r, i) => {
    const at = `${field}.readings[${i}]`;
    requireFinite(r.tMin, `${at}.tMin`);
    requireFinite(r.pressureKpa, `${at}.pressureKpa`);
    if (r.gauges.length !== gaugeCount) throw new InterpretationInputError(`${at}.gauges`, `has ${r.gauges.length} gauges, the stage's first reading ${gaugeCount}`);
    for (const [g, s] of r.gauges.entries()) requireFinite(s, `${at}.gauges[${g}]`);
    if (i > 0 && r.tMin < stage.readings[i - 1].tMin) throw new InterpretationInputError(`${at}.tMin`, 'readings must be in time order');
  });
}

/** The reading at `tMin`, interpolated linearly between the two readings around it. */
function readingAt(readings: readonly TimedReading[], tMin: number, field: string): TimedReading {
  if (tMin < readings[0].tMin) throw new InterpretationInputError(field, `the stage's first reading is at ${readings[0].tMin} min, after ${tMin} min`);
  const after = readings.findIndex((r) => r.tMin >= tMin);
  const r1 = readings[after];
  if (after === 0 || r1.tMin === tMin) return r1;
  const r0 = readings[after - 1];
  const w = (tMin - r0.tMin) / (r1.tMin - r0.tMin);
  const lerp = (a: number, b: number) => a + w * (b - a);
  return { tMin, pressureKpa: lerp(r0.pressureKpa, r1.pressureKpa), gauges: r0.gauges.map((s, g) => lerp(s, r1.gauges[g])) };
}

/**
 * Reduces timed readings to one load–settlement point per stage: the end-of-hold reading, or the
 * state at a fixed time into the stage (linear interpolation in time). Settlement = mean of the gauges
 * (reference §B.1; reading practice per §A.3: end of hold for maintained-load tests, ≈ 2 min for DIN 18134).
 */
export function reduceStages(stages: readonly StageReadings[], rule: ReductionRule = { kind: 'endOfHold' }): StagePoint[] {
  if (rule.kind === 'atTime') requireFinite(rule.minutes, 'rule.minutes');
  return stages.map((stage, k) => {
    const field = `stages[${k}]`;
    checkReadings(stage, field);
    const last = stage.readings[stage.readings.length - 1];
    const cutShort = rule.kind === 'atTime' && rule.minutes > last.tMin;
    const reading = rule.kind === 'endOfHold' || cutShort ? last : readingAt(stage.readings, rule.minutes, 'rule.minutes');
    return {
      index: stage.index,
      branch: stage.branch,
      pressureKpa: reading.pressureKpa,
      settlementMm: meanSettlement(reading.gauges, `${field}.gauges`),
      gaugesMm: reading.gauges,
      tMin: reading.tMin,
      cutShort,
    };
  });
}

/** Mean settlement against time for one stage, the input of the time–settlement methods (reference §B.8). */
export function stageSettlementSeries(stage: StageReadings, field = 'stage'): TimeSettlement[] {
  checkReadings(stage, field);
  return stage.readings.map((r) => ({ tMin: r.tMin, settlementMm: meanSettlement(r.gauges) }));
}
