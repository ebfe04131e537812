import type { RunView } from '@shared/schemas/runs';
import { useMemo, useRef, useState } from 'react';
import type uPlot from 'uplot';
import { axisSize, ChartLegend, signedValues, spanAtLeast } from '../../../components/chart-kit';
import { LiveChart } from '../../../components/live-chart';
import type { LiveStore } from '../live-store';

const INK = '#0a0a0a';
const GRID = '#d4d4d4';
/** Signed tick labels on an axis wide enough for them. */
const axis = (label: string): uPlot.Axis => ({
  label,
  stroke: INK,
  grid: { stroke: GRID, width: 1 },
  ticks: { stroke: GRID },
  values: signedValues,
  size: axisSize,
});
/** The smallest settlement span a plot shows, mm: noise of a few micrometres stays a flat line. */
export const MIN_SETTLEMENT_SPAN_MM = 0.5;
/** Settlement grows downwards, as on a hand-drawn curve; at least {@link MIN_SETTLEMENT_SPAN_MM} tall. */
const SETTLEMENT_SCALE: uPlot.Scale = { dir: -1, range: spanAtLeast(MIN_SETTLEMENT_SPAN_MM) };

/** How settlement–time is drawn: against time, its square root (for consolidation-type curves) or its logarithm. */
export type TimeAxis = 'linear' | 'sqrt' | 'log';
const TIME_AXIS_WORDS: Record<TimeAxis, { choice: string; axis: string }> = {
  linear: { choice: 'Time', axis: 'minutes since the hold started' },
  sqrt: { choice: '√time', axis: '√(minutes since the hold started)' },
  log: { choice: 'Log time', axis: 'minutes since the hold started (log scale)' },
};

/**
 * Mean settlement against minutes since the current hold started (or the stage started, while
 * pumping), from the store's columns. The x column is filled into one preallocated array.
 */
export function SettlementTimeChart({ store, timeAxis = 'linear' }: { store: LiveStore; timeAxis?: TimeAxis }) {
  const xs = useRef(new Float64Array(store.series.capacity));
  const options = useMemo<Omit<uPlot.Options, 'width' | 'height'>>(
    () => ({
      scales: { x: timeAxis === 'log' ? { time: false, distr: 3, log: 10 } : { time: false }, y: SETTLEMENT_SCALE },
      axes: [axis(TIME_AXIS_WORDS[timeAxis].axis), axis('mean settlement, mm')],
      series: [{ label: 'min' }, { label: 'Mean settlement (mm)', stroke: INK, width: 2, points: { show: false } }],
      legend: { show: false },
    }),
    [timeAxis],
  );
  // √t and log t: x is transformed here; a log axis cannot show t = 0, so it starts with the first later reading.
  const toX = timeAxis === 'sqrt' ? Math.sqrt : (min: number) => min;
  const origin = () => {
    const view = store.getSnapshot().view;
    const stage = view?.stageStartedAtMs ?? 0;
    const hold = view?.holdStartedAtMs ?? null;
    // A hold start from before this stage belongs to the previous stage: count from the stage start until the new hold begins.
    return hold !== null && hold >= stage ? hold : stage;
  };
  return (
    <LiveChart
      label="Mean settlement against time in the current stage"
      options={options}
      version={() => `${store.seriesVersion}@${origin()}`}
      read={() => {
        const start = origin();
        const from = store.series.lowerBound(0, timeAxis === 'log' ? start + 1 : start);
        const t = store.series.column(0);
        const n = t.length - from;
        const x = xs.current;
        for (let i = 0; i < n; i++) x[i] = toX((t[from + i] - start) / 60_000);
        return [x.subarray(0, n), store.series.column(1).subarray(from)];
      }}
    />
  );
}

/** Pressure against settlement: one point where each stage ended, plus where the run stands now. */
export function LoadSettlementChart({ store, maxPressureKpa }: { store: LiveStore; maxPressureKpa: number }) {
  const options = useMemo<Omit<uPlot.Options, 'width' | 'height'>>(
    () => ({
      // Unloading runs the pressure back down, so x is not sorted: fix the x range rather than take it from the ends.
      scales: {
        x: { time: false, range: () => [0, Math.max(1, maxPressureKpa) * 1.05] },
        // From zero settlement to a little past the deepest point: a single early point should not fill the plot.
        y: SETTLEMENT_SCALE,
      },
      axes: [axis('plate pressure, kPa'), axis('mean settlement, mm')],
      // Stage ends in the order they were held: loading up to the peak, then the unloading branch back from it.
      series: [{ label: 'kPa' }, { label: 'Mean settlement (mm)', stroke: INK, width: 2, points: { show: true, size: 8, fill: INK } }],
      legend: { show: false },
    }),
    [maxPressureKpa],
  );
  return (
    <LiveChart
      label="Load–settlement curve so far"
      options={options}
      version={() => store.getSnapshot().viewReceivedAtMs ?? 0}
      read={() => {
        const points = store.curve();
        const live = store.getSnapshot().view;
        const current = points.find((p) => p.stageIndex === live?.stageIndex);
        const pressure = points.map((p) => p.pressureKpa);
        const settlement = points.map((p) => p.settlementMm);
        // While pumping the current stage has no point yet: show where the plate stands now.
        if (!current && live?.live.pressureKpa != null && live.live.meanSettlementMm != null) {
          pressure.push(live.live.pressureKpa);
          settlement.push(live.live.meanSettlementMm);
        }
        return [pressure, settlement];
      }}
    />
  );
}

/** Both live plots of a run. Loaded lazily by the console page, so uPlot downloads only where it is drawn. */
export function RunCharts({ store, view }: { store: LiveStore; view: RunView }) {
  const maxKpa = useMemo(() => Math.max(0, ...view.stages.map((s) => s.targetKpa)), [view.stages]);
  const [timeAxis, setTimeAxis] = useState<TimeAxis>('linear');
  return (
    <section aria-labelledby="plots-heading" className="flex flex-col gap-2">
      <h2 id="plots-heading" className="text-xl font-bold">
        Plots
      </h2>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h3 className="font-semibold">Settlement against time, this stage</h3>
        <fieldset className="flex flex-wrap items-center gap-3">
          <legend className="sr-only">Time axis</legend>
          {(Object.keys(TIME_AXIS_WORDS) as TimeAxis[]).map((mode) => (
            <label key={mode} className="inline-flex min-h-touch items-center gap-1">
              <input type="radio" name="time-axis" className="size-5" checked={timeAxis === mode} onChange={() => setTimeAxis(mode)} />
              {TIME_AXIS_WORDS[mode].choice}
            </label>
          ))}
        </fieldset>
      </div>
      {/* A new axis kind is a new chart: uPlot reads its scales once. */}
      <SettlementTimeChart key={timeAxis} store={store} timeAxis={timeAxis} />
      <ChartLegend items={[{ label: 'Mean settlement of the gauges, mm (downwards)', color: INK }]} />
      <h3 className="font-semibold">Load–settlement curve so far</h3>
      <LoadSettlementChart store={store} maxPressureKpa={maxKpa} />
      <ChartLegend items={[{ label: 'Where each stage’s hold ended, and where the plate stands now', color: INK, points: true }]} />
    </section>
  );
}
