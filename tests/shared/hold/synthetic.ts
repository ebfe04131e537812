import type { TimePoint } from '@shared/hold/series';

// Repeatable noise: the simulator's seeded generator (mulberry32).
export { seededRandom } from '../../../simulators/physics/random';

/** Readings of `settlement(t)` every `stepMin` from `fromMin` to `toMin` inclusive. */
export function sampleSeries(settlement: (tMin: number) => number, toMin: number, stepMin: number, fromMin = 0): TimePoint[] {
  const points: TimePoint[] = [];
  const n = Math.round((toMin - fromMin) / stepMin);
  for (let i = 0; i <= n; i++) {
    const tMin = fromMin + i * stepMin;
    points.push({ tMin, settlementMm: settlement(tMin) });
  }
  return points;
}

/** A gauge's view of the series: ± `noiseCounts` divisions of random noise, then rounded to the resolution. */
export function quantise(series: readonly TimePoint[], resolutionMm: number, random: () => number, noiseCounts = 1): TimePoint[] {
  return series.map((p) => {
    const noise = (random() * 2 - 1) * noiseCounts * resolutionMm;
    return { tMin: p.tMin, settlementMm: Math.round((p.settlementMm + noise) / resolutionMm) * resolutionMm };
  });
}

/** The readings up to `tMin`, as the engine would have them at that moment. */
export const upTo = (series: readonly TimePoint[], tMin: number) => series.filter((p) => p.tMin <= tMin + 1e-9);

/** One reading per second, in minutes. */
export const ONE_HZ_MIN = 1 / 60;
