/** Line plots drawn as vectors with pdfkit's path API (no raster images in the report). */
import type PDFDocument from 'pdfkit';

export type Doc = InstanceType<typeof PDFDocument>;

/** A series of [x, y] points, joined in order. */
export interface PlotSeries {
  label: string;
  points: readonly (readonly [number, number])[];
}

/** Options of {@link drawPlot}; sizes in PDF points. */
export interface PlotOptions {
  x: number;
  y: number;
  width: number;
  height: number;
  title: string;
  xLabel: string;
  yLabel: string;
  /** Draw y growing downwards (settlement plotted below the axis, as is usual). Default false. */
  yDown?: boolean;
}

/** A tick step of 1, 2 or 5 × 10ⁿ giving about `count` intervals over `span`. */
export function niceStep(span: number, count = 5): number {
  if (!(span > 0)) return 1;
  const raw = span / count;
  const magnitude = 10 ** Math.floor(Math.log10(raw));
  const f = raw / magnitude;
  return (f <= 1 ? 1 : f <= 2 ? 2 : f <= 5 ? 5 : 10) * magnitude;
}

/** The axis range [0 or below, a tick at or above the largest value] and its step. */
export function axisRange(values: readonly number[]): { min: number; max: number; step: number } {
  const lo = Math.min(0, ...values);
  const hi = Math.max(...values, lo + 1e-9);
  const step = niceStep(hi - lo);
  return { min: Math.floor(lo / step) * step, max: Math.ceil(hi / step) * step, step };
}

const GREYS = ['#1f2933', '#52606d', '#9aa5b1', '#3e4c59', '#7b8794'];
const DASHES = [0, 4, 2, 6, 1];

/** Draws axes, ticks, labels and the series; the caller keeps the page layout. */
export function drawPlot(doc: Doc, series: readonly PlotSeries[], o: PlotOptions): void {
  const all = series.flatMap((s) => s.points);
  const xs = axisRange(all.map((p) => p[0]));
  const ys = axisRange(all.map((p) => p[1]));
  const left = o.x + 42;
  // Title on the first line, the y-axis label on the second, then the frame.
  const top = o.y + 26;
  const w = o.width - 52;
  const h = o.height - 54;
  const px = (x: number) => left + ((x - xs.min) / (xs.max - xs.min)) * w;
  const py = (y: number) => (o.yDown ? top + ((y - ys.min) / (ys.max - ys.min)) * h : top + h - ((y - ys.min) / (ys.max - ys.min)) * h);

  doc.save();
  doc.font('Helvetica-Bold').fontSize(9).fillColor('#000').text(o.title, o.x, o.y, { width: o.width, lineBreak: false });
  doc.lineWidth(0.3).strokeColor('#cbd2d9');
  doc.font('Helvetica').fontSize(7);
  for (let v = xs.min; v <= xs.max + xs.step / 2; v += xs.step) {
    doc
      .moveTo(px(v), top)
      .lineTo(px(v), top + h)
      .stroke();
    doc.fillColor('#333').text(formatTick(v), px(v) - 20, top + h + 3, { width: 40, align: 'center', lineBreak: false });
  }
  for (let v = ys.min; v <= ys.max + ys.step / 2; v += ys.step) {
    doc
      .moveTo(left, py(v))
      .lineTo(left + w, py(v))
      .stroke();
    doc.fillColor('#333').text(formatTick(v), o.x, py(v) - 3, { width: 38, align: 'right', lineBreak: false });
  }
  doc.lineWidth(0.8).strokeColor('#000').rect(left, top, w, h).stroke();
  doc.fillColor('#000').text(o.xLabel, left, top + h + 14, { width: w, align: 'center', lineBreak: false });
  doc.text(o.yLabel, o.x, top - 11, { width: 160, lineBreak: false });

  series.forEach((s, i) => {
    if (s.points.length === 0) return;
    const colour = GREYS[i % GREYS.length];
    doc.lineWidth(1).strokeColor(colour);
    const dash = DASHES[i % DASHES.length];
    if (dash) doc.dash(dash, { space: 2 });
    else doc.undash();
    const [first, ...rest] = s.points;
    doc.moveTo(px(first[0]), py(first[1]));
    for (const [x, y] of rest) doc.lineTo(px(x), py(y));
    doc.stroke().undash();
    for (const [x, y] of s.points) doc.circle(px(x), py(y), 1.4).fillColor(colour).fill();
  });
  if (series.length > 1) {
    const legend = series.map((s) => s.label).join('   ');
    doc
      .font('Helvetica')
      .fontSize(6.5)
      .fillColor('#333')
      .text(legend, left + 4, top + 3, { width: w - 8, lineBreak: false });
  }
  doc.restore();
}

function formatTick(v: number): string {
  const r = Math.round(v * 1e6) / 1e6;
  return Math.abs(r) >= 1000 ? r.toFixed(0) : String(r);
}
