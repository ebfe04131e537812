import type { RecordAnalysis } from '@shared/interpretation/analyze-record';
import type { StagePoint } from '@shared/interpretation/reduction';
import { stageSettlementSeries } from '@shared/interpretation/reduction';
import { settlementLogTime, settlementRootTime } from '@shared/interpretation/time-settlement';
import type { AnyUltimateResult } from '@shared/interpretation/ultimate';
import { toStageReadings } from '@shared/records/readings';
import type { TestRecord } from '@shared/records/schema';

/** One plotted line: its legend label and a y value per x of the plot (null where it has none). */
export interface PlotSeries {
  label: string;
  values: (number | null)[];
  /** Drawn as a fitted line (no point markers). */
  fitted?: boolean;
}

/** Columns for one x–y plot: ascending x shared by every series. */
export interface PlotData {
  x: number[];
  series: PlotSeries[];
}

type XY = { x: number; y: number };

/**
 * Puts point lists on one ascending x axis. A branch whose pressure only rises or only falls is the same
 * polyline when sorted by x, so unloading can share the axis with loading; gaps are spanned when drawn.
 */
export function alignSeries(lines: { label: string; points: readonly XY[]; fitted?: boolean }[]): PlotData {
  const x = [...new Set(lines.flatMap((l) => l.points.map((p) => p.x)))].sort((a, b) => a - b);
  const index = new Map(x.map((v, i) => [v, i]));
  const series = lines.map((l) => {
    const values: (number | null)[] = x.map(() => null);
    for (const p of l.points) values[index.get(p.x) as number] = p.y;
    return { label: l.label, values, ...(l.fitted ? { fitted: true } : {}) };
  });
  return { x, series };
}

const method = <M extends AnyUltimateResult['method']>(analysis: RecordAnalysis, m: M) =>
  analysis.ultimate.applies ? (analysis.ultimate.result.find((r) => r.method === m) as Extract<AnyUltimateResult, { method: M }> | undefined) : undefined;

/**
 * Each unbroken run of unloading or reloading stage points, in the order the stages were held, starting
 * from the point held just before it: an unloading branch is drawn from the peak it left, a reloading
 * branch from where the unloading stopped, so no branch floats free of the curve it leaves. Each run is
 * its own line (a second cycle's unloading is not joined to the first's).
 */
export function branchRuns(points: readonly StagePoint[]): { branch: 'unloading' | 'reloading'; points: XY[] }[] {
  const runs: { branch: 'unloading' | 'reloading'; points: XY[] }[] = [];
  const xy = (p: StagePoint) => ({ x: p.pressureKpa, y: p.settlementMm });
  points.forEach((p, i) => {
    if (p.branch !== 'unloading' && p.branch !== 'reloading') return;
    const open = runs.at(-1);
    if (open && open.branch === p.branch && points[i - 1]?.branch === p.branch) open.points.push(xy(p));
    else runs.push({ branch: p.branch, points: i > 0 ? [xy(points[i - 1]), xy(p)] : [xy(p)] });
  });
  return runs;
}

/** Evenly spaced values from `from` to `to` (both included). */
const span = (from: number, to: number, n: number) => Array.from({ length: n }, (_, i) => from + ((to - from) * i) / (n - 1));

/**
 * The load–settlement curve on arithmetic axes: the first loading, unloading and reloading stage points,
 * and the hyperbola s = a·q/(1 − b·q) fitted by the hyperbolic method (s/q = a + b·s), drawn below its asymptote.
 */
export function arithmeticPlot(analysis: RecordAnalysis): PlotData {
  const points = analysis.reduction.points;
  const lines: { label: string; points: XY[]; fitted?: boolean }[] = [
    { label: 'First loading', points: analysis.firstLoading.map((p) => ({ x: p.pressureKpa, y: p.settlementMm })) },
  ];
  for (const run of branchRuns(points)) lines.push({ label: run.branch === 'unloading' ? 'Unloading' : 'Reloading', points: run.points });
  const hyperbola = method(analysis, 'hyperbolic')?.details;
  const qMax = Math.max(0, ...analysis.firstLoading.map((p) => p.pressureKpa));
  if (hyperbola && hyperbola.b !== 0 && qMax > 0) {
    const asymptote = hyperbola.b > 0 ? 1 / hyperbola.b : Number.POSITIVE_INFINITY;
    const fitted = span(0, Math.min(qMax, 0.98 * asymptote), 24).map((q) => ({ x: q, y: (hyperbola.a * q) / (1 - hyperbola.b * q) }));
    lines.push({ label: 'Hyperbola fit', points: fitted, fitted: true });
  }
  return alignSeries(lines);
}

/**
 * The first loading in kPa and mm, for log–log axes (points with q or s of zero have no place on them),
 * with the two straight lines of the log–log method (log s = intercept + slope·log q) drawn as s = 10^(…)
 * at pressures evenly spaced in log q.
 */
export function logLogPlot(analysis: RecordAnalysis): PlotData {
  const measured = analysis.firstLoading.filter((p) => p.pressureKpa > 0 && p.settlementMm > 0).map((p) => ({ x: p.pressureKpa, y: p.settlementMm }));
  const lines: { label: string; points: XY[]; fitted?: boolean }[] = [{ label: 'First loading', points: measured }];
  const details = method(analysis, 'logLogIntersection')?.details;
  if (details && measured.length >= 2) {
    const logQ = span(Math.log10(measured[0].x), Math.log10(measured[measured.length - 1].x), 12);
    for (const [label, line] of [
      ['Log–log line 1', details.firstLine],
      ['Log–log line 2', details.secondLine],
    ] as const) {
      lines.push({ label, points: logQ.map((lq) => ({ x: 10 ** lq, y: 10 ** (line.intercept + line.slope * lq) })), fitted: true });
    }
  }
  return alignSeries(lines);
}

/** A stage's mean settlement against t for a log-time axis (t > 0) and against √t, t in minutes since its target was reached. */
export function timeSettlementPlots(record: TestRecord, stageIndex: number): { logTime: PlotData; rootTime: PlotData } | null {
  const stage = toStageReadings(record).find((s) => s.index === stageIndex);
  if (!stage) return null;
  const series = stageSettlementSeries(stage);
  return {
    logTime: alignSeries([{ label: 'Settlement', points: settlementLogTime(series).map((r) => ({ x: 10 ** r.log10TMin, y: r.settlementMm })) }]),
    rootTime: alignSeries([{ label: 'Settlement', points: settlementRootTime(series).map((r) => ({ x: r.sqrtTMin, y: r.settlementMm })) }]),
  };
}
