import type uPlot from 'uplot';
import { describe, expect, it } from 'vitest';
import { placesFor, signedValues, spanAtLeast, tickLabel } from '../../client/src/components/chart-kit';

const range = (minSpan: number, min: number, max: number) => spanAtLeast(minSpan)({} as uPlot, min, max, 'y');

describe('plot axes', () => {
  it('labels ticks with a true minus sign and never "-0"', () => {
    expect(tickLabel(-0.25, 2)).toBe('\u22120.25');
    expect(tickLabel(-0.001, 2)).toBe('0.00');
    expect(tickLabel(1.5, 1)).toBe('1.5');
  });

  it('gives ticks the places their step needs', () => {
    expect(placesFor(1)).toBe(0);
    expect(placesFor(50)).toBe(0);
    expect(placesFor(0.1)).toBe(1);
    expect(placesFor(0.05)).toBe(2);
    expect(placesFor(0.002)).toBe(3);
  });

  it('labels a log axis tick by tick (0.1, 1, 10), a linear one by its step', () => {
    const chart = (distr: number) => ({ axes: [{ scale: 'x' }], scales: { x: { distr } } }) as unknown as uPlot;
    expect(signedValues(chart(3), [0.1, 1, 10], 0, 0, 1)).toEqual(['0.1', '1', '10']);
    expect(signedValues(chart(1), [-0.5, 0, 0.5], 0, 0, 0.5)).toEqual(['\u22120.5', '0.0', '0.5']);
  });

  it('opens a span of gauge noise to the minimum, and leaves a real settlement span alone', () => {
    // 5 µm of noise at seating: shown on a 0.5 mm span from zero, not blown up to fill the plot.
    expect(range(0.5, 0.001, 0.006)).toEqual([0, 0.5]);
    expect(range(0.5, -0.004, -0.001)).toEqual([-0.5, 0]);
    const [lo, hi] = range(0.5, 0.2, 3.4);
    expect(lo).toBe(0);
    expect(hi).toBeCloseTo(3.4 + 0.17, 9); // 5 % headroom over the 0–3.4 mm span
  });
});
