import { useMemo } from 'react';
import type uPlot from 'uplot';
import { LiveChart } from '../../../components/live-chart';
import type { PlotData } from '../utils/plot-data';

const STROKES = ['#171717', '#1d4ed8', '#047857', '#a14d07', '#7e22ce'];

/** Options of {@link XyChart}. */
export interface XyChartProps {
  /** Accessible name, e.g. "Load–settlement curve, arithmetic axes". */
  label: string;
  data: PlotData;
  xLabel: string;
  yLabel: string;
  /** Settlement grows downwards, as load–settlement and time–settlement plots are drawn. Default true. */
  settlementDown?: boolean;
  height?: number;
}

const chartKeys = new WeakMap<PlotData, number>();
let lastKey = 0;

/** One key per data set, so that a new data set makes a new chart (the shared chart reads its options once). */
function chartKey(data: PlotData): number {
  let key = chartKeys.get(data);
  if (key === undefined) {
    key = ++lastKey;
    chartKeys.set(data, key);
  }
  return key;
}

/** A static x–y plot of measured points and fitted lines; drawn again whenever `data` changes. */
export function XyChart({ label, data, xLabel, yLabel, settlementDown = true, height = 280 }: XyChartProps) {
  const key = chartKey(data);
  const options = useMemo<Omit<uPlot.Options, 'width' | 'height'>>(
    () => ({
      scales: { x: { time: false }, y: settlementDown ? { dir: -1 } : {} },
      axes: [{ label: xLabel }, { label: yLabel }],
      series: [
        { label: xLabel },
        ...data.series.map((s, i) => ({
          label: s.label,
          stroke: STROKES[i % STROKES.length],
          width: 2,
          spanGaps: true,
          ...(s.fitted ? { dash: [6, 4], points: { show: false } } : { points: { show: true, size: 7 } }),
        })),
      ],
    }),
    [data, xLabel, yLabel, settlementDown],
  );
  const columns = useMemo(() => [data.x, ...data.series.map((s) => s.values)] as uPlot.AlignedData, [data]);
  if (data.x.length === 0) return <p className="text-neutral-800">{label}: nothing to plot.</p>;
  return <LiveChart key={key} label={label} options={options} version={() => key} read={() => columns} height={height} />;
}
