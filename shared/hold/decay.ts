import { trailingRate } from './rate';
import { countUpTo, type TimePoint } from './series';
import { fitSlope } from './slope-fit';

/** An exponential fit |y(t)| = y0·e^(−t/τ) and when it reaches a threshold. */
export interface DecayFit {
  /** τ of the fit, minutes; null when the values are not falling. */
  timeConstantMin: number | null;
  /** Time at which the fitted value reaches the threshold, minutes since the target was reached; null when it never will. */
  crossingMin: number | null;
  /** Values that entered the fit. */
  samples: number;
}

/**
 * Fits ln|y| against t by least squares (zeros are left out) and solves for the time the fitted |y| falls
 * to `threshold`. Null with fewer than two usable values.
 */
export function exponentialDecay(times: readonly number[], values: readonly number[], threshold: number): DecayFit | null {
  const t: number[] = [];
  const logY: number[] = [];
  times.forEach((x, i) => {
    if (values[i] === 0) return;
    t.push(x);
    logY.push(Math.log(Math.abs(values[i])));
  });
  const fit = fitSlope(
    t.length,
    (i) => t[i],
    (i) => logY[i],
  );
  if (!fit) return null;
  if (fit.slope >= 0) return { timeConstantMin: null, crossingMin: null, samples: t.length };
  return { timeConstantMin: -1 / fit.slope, crossingMin: (Math.log(threshold) - fit.intercept) / fit.slope, samples: t.length };
}

/** Window rates sampled at this many window end times (spread over the last two windows). */
const DECAY_SAMPLES = 5;

/**
 * Decay of the {@link trailingRate} over `windowMin`, sampled at up to five window end times spread over
 * the last two windows. For an exponential approach s = s_end − Δ·e^(−t/τ) every window slope is
 * proportional to e^(−T/τ) (T = window end), so the fit is exact and the crossing is the time at which the
 * windowed rate reaches `thresholdMmPerMin` [calc]. Null until the end times span half a window.
 */
export function rateDecay(series: readonly TimePoint[], windowMin: number, untilMin: number, thresholdMmPerMin: number): DecayFit | null {
  const end = countUpTo(series, untilMin);
  if (end < 2) return null;
  const last = series[end - 1].tMin;
  const earliest = Math.max(series[0].tMin + windowMin, last - 2 * windowMin);
  if (last - earliest < windowMin / 2) return null;

  const times: number[] = [];
  const rates: number[] = [];
  for (let k = 0; k < DECAY_SAMPLES; k++) {
    const rate = trailingRate(series, { windowMin, untilMin: earliest + ((last - earliest) * k) / (DECAY_SAMPLES - 1) });
    // Sparse readings map several end times onto one reading: keep each window once.
    if (rate.slopeMmPerMin === null || times.at(-1) === rate.toMin) continue;
    times.push(rate.toMin);
    rates.push(rate.slopeMmPerMin);
  }
  return exponentialDecay(times, rates, thresholdMmPerMin);
}
