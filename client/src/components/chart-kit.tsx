import { formatFixed } from '@shared/units/format';
import type uPlot from 'uplot';

/** Places enough to tell neighbouring ticks apart: 0 for a step of 1 or more, 1 for 0.1, 2 for 0.05… */
export function placesFor(step: number): number {
  if (!(step > 0) || !Number.isFinite(step)) return 2;
  return Math.min(6, Math.max(0, Math.ceil(-Math.log10(step) - 1e-9)));
}

/** A tick label with a true minus sign (U+2212), never "-0": readable and never clipped to a bare number. */
export function tickLabel(value: number, places: number): string {
  return formatFixed(value, places).replace(/^-/, '\u2212');
}

/** Tick labels for an axis, signed, with the places its step needs (on a log axis, the places each tick needs: 0.1, 1, 10). */
export const signedValues = (u: uPlot, splits: number[], axisIdx: number, _space: number, incr: number): string[] => {
  const scale = u.axes?.[axisIdx]?.scale ?? (axisIdx === 0 ? 'x' : 'y');
  const log = u.scales?.[scale]?.distr === 3;
  return splits.map((v) => (v == null ? '' : tickLabel(v, placesFor(log ? Math.abs(v) : incr))));
};

/** Axis width from its longest label, so a minus sign or a fourth digit is never cut off (px; ~9 px a character at 12 px). */
export const axisSize: uPlot.Axis.Size = (u, values, axisIdx) => {
  const longest = Math.max(1, ...(values ?? []).map((v) => String(v).length));
  const labelled = u.axes[axisIdx]?.label ? 22 : 0;
  return Math.ceil(longest * 9 + 18 + labelled);
};

/**
 * A range of at least `minSpan` around the data, so gauge noise of a few micrometres is not blown up to
 * fill the plot (0.5 mm is common practice for a settlement plot's smallest span). Zero stays in view.
 */
export function spanAtLeast(minSpan: number): uPlot.Range.Function {
  return (_u, min, max) => {
    const lo = Math.min(0, Number.isFinite(min) ? min : 0);
    const hi = Math.max(0, Number.isFinite(max) ? max : 0);
    const pad = (hi - lo) * 0.05;
    if (hi - lo + 2 * pad >= minSpan) return [lo - (lo < 0 ? pad : 0), hi + pad];
    // Too small a span: keep zero at the edge the data lies away from, and open the span to the minimum.
    return lo < 0 && hi <= 0 ? [-minSpan, Math.max(hi, 0)] : [lo, lo + minSpan];
  };
}

/** One line of a plot's legend: our own, in words with a sample of the line, not the charting library's. */
export interface LegendItem {
  label: string;
  color: string;
  dashed?: boolean;
  /** Points only, no line (a curve's measured points). */
  points?: boolean;
  /** A filled band (a min/max envelope). */
  band?: boolean;
}

export function ChartLegend({ items }: { items: readonly LegendItem[] }) {
  return (
    <ul aria-label="Legend" className="flex flex-wrap gap-x-4 gap-y-1 text-sm">
      {items.map((item) => (
        <li key={item.label} className="inline-flex items-center gap-2">
          <svg width="28" height="12" aria-hidden="true" focusable="false">
            {item.band && <rect x="0" y="1" width="28" height="10" fill={item.color} opacity="0.25" />}
            {item.points ? (
              <circle cx="14" cy="6" r="4" fill={item.color} />
            ) : (
              <line x1="0" y1="6" x2="28" y2="6" stroke={item.color} strokeWidth="2.5" strokeDasharray={item.dashed ? '5 3' : undefined} />
            )}
          </svg>
          <span>{item.label}</span>
        </li>
      ))}
    </ul>
  );
}
