import { InterpretationInputError, requireFinite, requireNonNegative } from './input-checks';

/** One point of a load–settlement curve: pressure on the plate (kPa) and mean settlement (mm). */
export interface CurvePoint {
  pressureKpa: number;
  settlementMm: number;
}

/**
 * Checks a load–settlement curve: at least `minPoints` points, finite settlements, pressures ≥ 0.
 * Throws naming the offending point, e.g. `points[3].settlementMm`.
 */
export function checkCurve(points: readonly CurvePoint[], field = 'points', minPoints = 1): void {
  if (!Array.isArray(points) || points.length < minPoints) {
    throw new InterpretationInputError(field, `needs at least ${minPoints} point${minPoints === 1 ? '' : 's'} (got ${points?.length ?? 0})`);
  }
  points.forEach((p, i) => {
    requireNonNegative(p.pressureKpa, `${field}[${i}].pressureKpa`);
    requireFinite(p.settlementMm, `${field}[${i}].settlementMm`);
  });
}

/** Checks a loading branch: a valid curve whose pressures rise from point to point. */
export function checkLoadingCurve(points: readonly CurvePoint[], field = 'points', minPoints = 1): void {
  checkCurve(points, field, minPoints);
  points.forEach((p, i) => {
    if (i > 0 && p.pressureKpa <= points[i - 1].pressureKpa) {
      throw new InterpretationInputError(`${field}[${i}].pressureKpa`, 'pressures must rise from point to point (pass the loading branch only)');
    }
  });
}

/**
 * Linear interpolation along a polyline taken in its own order: the y at which the line first reaches
 * `x`. Returns null when no segment spans `x` (the curve never reaches it). [calc]
 */
export function interpolateFirstCrossing(xs: readonly number[], ys: readonly number[], x: number): number | null {
  if (xs.length === 1) return xs[0] === x ? ys[0] : null;
  for (let i = 1; i < xs.length; i++) {
    const [x0, x1] = [xs[i - 1], xs[i]];
    if ((x0 - x) * (x1 - x) > 0) continue;
    if (x0 === x1) return ys[i - 1];
    return ys[i - 1] + ((x - x0) / (x1 - x0)) * (ys[i] - ys[i - 1]);
  }
  return null;
}

/** Pressure (kPa) at which the curve first reaches `settlementMm`, linear interpolation; null if never reached. */
export function pressureAtSettlement(points: readonly CurvePoint[], settlementMm: number): number | null {
  return interpolateFirstCrossing(
    points.map((p) => p.settlementMm),
    points.map((p) => p.pressureKpa),
    settlementMm,
  );
}

/** Settlement (mm) at which the curve first reaches `pressureKpa`, linear interpolation; null if never reached. */
export function settlementAtPressure(points: readonly CurvePoint[], pressureKpa: number): number | null {
  return interpolateFirstCrossing(
    points.map((p) => p.pressureKpa),
    points.map((p) => p.settlementMm),
    pressureKpa,
  );
}
