import { useMemo } from 'react';
import type uPlot from 'uplot';
import { axisSize, ChartLegend, type LegendItem, signedValues } from '../../../components/chart-kit';
import { LiveChart } from '../../../components/live-chart';
import type { PlotData } from '../utils/plot-data';

/** Colour-blind-safe line colours (the Okabe–Ito palette, black first), one per legend label. */
const STROKES = ['#000000', '#0072B2', '#D55E00', '#009E73', '#CC79A7', '#E69F00', '#56B4E9'];

/** Options of {@link XyChart}. */
export interface XyChartProps {
  /** Accessible name, e.g. "Load–settlement curve, arithmetic axes". */
  label: string;
  data: PlotData;
  xLabel: string;
  yLabel: string;
  /** Settlement grows downwards, as load–settlement and time–settlement plots are drawn. Default true. */
  settlementDown?: boolean;
  /** Logarithmic x and/or y axis (base 10), ticks in the data's own units: x and y must then be above zero. */
  log?: { x?: boolean; y?: boolean };
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

/** A colour per distinct label: lines of the same kind (every unloading branch) share theirs and one legend line. */
export function seriesColours(data: PlotData): { colours: string[]; legend: LegendItem[] } {
  const labels = [...new Set(data.series.map((s) => s.label))];
  const colourOf = (label: string) => STROKES[labels.indexOf(label) % STROKES.length];
  const legend = labels.map((label) => {
    const fitted = data.series.find((s) => s.label === label)?.fitted === true;
    return { label: fitted ? `${label} (fitted)` : label, color: colourOf(label), ...(fitted ? { dashed: true } : {}) };
  });
  return { colours: data.series.map((s) => colourOf(s.label)), legend };
}

const logScale = { distr: 3, log: 10 } as const;

/** A static x–y plot of measured points and fitted lines, with our own legend; drawn again whenever `data` changes. */
export function XyChart({ label, data, xLabel, yLabel, settlementDown = true, log = {}, height = 280 }: XyChartProps) {
  const key = chartKey(data);
  const { colours, legend } = useMemo(() => seriesColours(data), [data]);
  const options = useMemo<Omit<uPlot.Options, 'width' | 'height'>>(
    () => ({
      legend: { show: false },
      scales: { x: { time: false, ...(log.x ? logScale : {}) }, y: { ...(log.y ? logScale : {}), ...(settlementDown ? { dir: -1 } : {}) } },
      axes: [
        { label: xLabel, values: signedValues, size: axisSize },
        { label: yLabel, values: signedValues, size: axisSize },
      ],
      series: [
        { label: xLabel },
        ...data.series.map((s, i) => ({
          label: s.label,
          stroke: colours[i],
          width: 2,
          spanGaps: true,
          ...(s.fitted ? { dash: [6, 4], points: { show: false } } : { points: { show: true, size: 7 } }),
        })),
      ],
    }),
    [data, colours, xLabel, yLabel, settlementDown, log.x, log.y],
  );
  const columns = useMemo(() => [data.x, ...data.series.map((s) => s.values)] as uPlot.AlignedData, [data]);
  if (data.x.length === 0) return <p className="text-neutral-800">{label}: nothing to plot.</p>;
  return (
    <figure className="flex flex-col gap-2">
      <LiveChart key={key} label={label} options={options} version={() => key} read={() => columns} height={height} />
      <ChartLegend items={legend} />
    </figure>
  );
}
