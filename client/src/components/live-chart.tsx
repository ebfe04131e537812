import { useEffect, useRef } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';

/** Options of {@link LiveChart}. */
export interface LiveChartProps {
  /** Accessible name of the plot, e.g. "Settlement against time, this stage". */
  label: string;
  /** Chart options apart from size; read once, when the chart is created. */
  options: Omit<uPlot.Options, 'width' | 'height'>;
  /** Changes whenever `read` would return new data; polled once per animation frame. */
  version: () => number | string;
  /** The columns to draw: x, then one array per series. Called only when `version` moved. */
  read: () => uPlot.AlignedData;
  /** Plot height, px. Default 260. */
  height?: number;
}

/**
 * A uPlot chart created once per mount and destroyed on unmount, redrawn at most once per
 * animation frame with setData, and only when its data version moved: never a React render per sample.
 */
export function LiveChart({ label, options, version, read, height = 260 }: LiveChartProps) {
  const box = useRef<HTMLDivElement>(null);
  // The latest callbacks, so the frame loop never needs the chart to be re-created.
  const source = useRef({ version, read });
  source.current = { version, read };
  const initial = useRef(options);

  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const chart = new uPlot({ ...initial.current, width: el.clientWidth || 600, height }, source.current.read(), el);
    let drawn = source.current.version();
    let frame = requestAnimationFrame(function draw() {
      const v = source.current.version();
      if (v !== drawn) {
        drawn = v;
        chart.setData(source.current.read());
      }
      frame = requestAnimationFrame(draw);
    });
    const resize = typeof ResizeObserver === 'undefined' ? null : new ResizeObserver(() => chart.setSize({ width: el.clientWidth, height }));
    resize?.observe(el);
    return () => {
      cancelAnimationFrame(frame);
      resize?.disconnect();
      chart.destroy();
    };
  }, [height]);

  return <div ref={box} role="img" aria-label={label} className="w-full overflow-hidden" />;
}
