import { useRef } from 'react';
import type uPlot from 'uplot';
import { axisSize, ChartLegend, signedValues, spanAtLeast } from '../../../components/chart-kit';
import { LiveChart } from '../../../components/live-chart';
import { formatTimeOfDay } from '../../../lib/format';
import type { EnvelopeData } from '../utils/timeline';

export interface ReplayChartProps {
  data: EnvelopeData;
  /** Changes whenever `data` does. */
  dataVersion: string | number;
  /** The scrubbed time, ms: drawn as a vertical line. */
  cursorMs: number;
  pressureUnit: string;
  /** A span the user dragged across, ms: the page fetches it at full plot resolution. */
  onZoom: (span: { fromMs: number; toMs: number }) => void;
}

/** Mean settlement (downwards) and oil pressure over the run, each as its min/max envelope per plot column, with the replay cursor. */
export function ReplayChart({ data, dataVersion, cursorMs, pressureUnit, onZoom }: ReplayChartProps) {
  const latest = useRef({ data, cursorMs, onZoom });
  latest.current = { data, cursorMs, onZoom };
  const options = useRef<Omit<uPlot.Options, 'width' | 'height'>>({
    // Settlement downwards, at least 0.5 mm tall so noise stays flat (as on the live plots).
    scales: { x: { time: true }, mm: { dir: -1, range: spanAtLeast(0.5) } },
    series: [
      // The legend's time on the 24-hour clock (uPlot's own is am/pm).
      { label: 'Time', value: (_u, v) => (v == null ? '—' : formatTimeOfDay(v * 1000, true)) },
      { label: 'Mean settlement, low (mm)', scale: 'mm', stroke: '#171717', width: 1 },
      { label: 'Mean settlement, high (mm)', scale: 'mm', stroke: '#171717', width: 1 },
      { label: `Oil pressure, low (${pressureUnit})`, scale: 'p', stroke: '#525252', width: 1, dash: [4, 4] },
      { label: `Oil pressure, high (${pressureUnit})`, scale: 'p', stroke: '#525252', width: 1, dash: [4, 4] },
    ],
    bands: [
      { series: [2, 1], fill: 'rgba(23,23,23,0.25)' },
      { series: [4, 3], fill: 'rgba(82,82,82,0.12)' },
    ],
    // Times of day on the 24-hour clock, with seconds once ticks are closer than a minute.
    axes: [
      { values: (_u, splits, _axis, _space, incr) => splits.map((v) => formatTimeOfDay(v * 1000, incr < 60)) },
      { scale: 'mm', label: 'Mean settlement (mm)', values: signedValues, size: axisSize },
      { scale: 'p', side: 1, label: `Oil pressure (${pressureUnit})`, grid: { show: false }, values: signedValues, size: axisSize },
    ],
    // Our own legend below the plot says what each line is.
    legend: { show: false },
    // Dragging selects a span to fetch in detail, rather than stretching the coarse overview.
    cursor: { drag: { x: true, y: false, setScale: false } },
    hooks: {
      setSelect: [
        (u) => {
          if (u.select.width < 2) return;
          const from = u.posToVal(u.select.left, 'x') * 1000;
          const to = u.posToVal(u.select.left + u.select.width, 'x') * 1000;
          u.setSelect({ left: 0, top: 0, width: 0, height: 0 }, false);
          latest.current.onZoom({ fromMs: from, toMs: to });
        },
      ],
      draw: [
        (u) => {
          const x = u.valToPos(latest.current.cursorMs / 1000, 'x', true);
          if (!Number.isFinite(x) || x < u.bbox.left || x > u.bbox.left + u.bbox.width) return;
          const ctx = u.ctx;
          ctx.save();
          ctx.strokeStyle = '#b91c1c';
          ctx.lineWidth = 2;
          ctx.beginPath();
          ctx.moveTo(x, u.bbox.top);
          ctx.lineTo(x, u.bbox.top + u.bbox.height);
          ctx.stroke();
          ctx.restore();
        },
      ],
    },
  });
  return (
    <div className="flex flex-col gap-1">
      <LiveChart
        label="Mean settlement and oil pressure over the run, with the replay time marked"
        options={options.current}
        version={() => `${dataVersion}|${latest.current.cursorMs}`}
        read={() => latest.current.data as uPlot.AlignedData}
      />
      <ChartLegend
        items={[
          { label: 'Mean settlement, mm (downwards): lowest to highest in each column', color: '#171717', band: true },
          { label: `Oil pressure, ${pressureUnit}: lowest to highest in each column`, color: '#525252', dashed: true, band: true },
          { label: 'Replay time', color: '#b91c1c' },
        ]}
      />
    </div>
  );
}
