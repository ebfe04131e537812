import type { Sequelize } from 'sequelize';
import { buildRollups } from '../../server/runs/samples-query';
/**
 * P3: replay of a week-long 1 Hz 6-channel run. The rows go in through the raw connector; then the
 * console's overview and 1-hour zooms are fetched over HTTP from the summary route, against fetching
 * the rows themselves (one day timed, scaled to the whole run).
 */
import type { Connection } from 'mariadb';
import { RUN_START_MS, rawBatch, syntheticRows } from './archive';
import { median, timed } from './stats';

const DAY_MS = 86_400_000;
const HOUR_MS = 3_600_000;

export interface ReplayOptions {
  baseUrl: string;
  cookie: string;
  conn: Connection;
  /** The server's Sequelize instance, for building the closed run's rollups as the run manager would. */
  sequelize: Sequelize;
  days: number;
  /** Plot width in pixels; the summary asks for this many buckets (≤ 2 points each per series). */
  widthPx: number;
}

export interface ReplayResult {
  rows: number;
  insertS: number;
  /** Time to build the per-minute rollups when the run closed, s. */
  rollupS: number;
  overviewFirstMs: number;
  overviewMedianMs: number;
  zoomMaxMs: number;
  zoomMedianMs: number;
  maxPointsPerSeries: number;
  allRowsMs: number;
  allRowsNote: string;
}

async function fillRun(conn: Connection, runId: number, rows: number): Promise<void> {
  const piece = 60_000;
  for (let first = 1; first <= rows; first += piece) await rawBatch(conn, runId, syntheticRows(Math.min(piece, rows - first + 1), first), 20_000);
}

async function summary(o: ReplayOptions, runId: number, query: string) {
  const { ms, result } = await timed(async () => {
    const res = await fetch(`${o.baseUrl}/api/runs/${runId}/samples/summary?${query}`, { headers: { cookie: o.cookie } });
    if (res.status !== 200) throw new Error(`summary → ${res.status} ${await res.text()}`);
    return (await res.json()) as { channels: { t: number[] }[] };
  });
  if (result.channels.length !== 6) throw new Error(`summary returned ${result.channels.length} series, expected 6`);
  return { ms, points: Math.max(...result.channels.map((c) => 2 * c.t.length)) };
}

export async function benchReplay(o: ReplayOptions): Promise<ReplayResult> {
  // A closed run only needs to exist for the summary route; its samples come from the raw connector.
  const [plan] = await o.conn.query('SELECT id FROM test_plans ORDER BY id LIMIT 1');
  const inserted = await o.conn.query("INSERT INTO runs (plan_id, status, state, created_at, updated_at) VALUES (?, 'completed', '{}', NOW(3), NOW(3))", [plan.id]);
  const runId = Number(inserted.insertId);
  const rows = o.days * 86_400 * 6;
  const fill = await timed(() => fillRun(o.conn, runId, rows));
  await o.conn.query('ANALYZE TABLE samples');
  // As the run manager does when a run closes: per-minute rollups for fast overviews.
  const rollup = await timed(() => buildRollups(o.sequelize, runId));

  const buckets = `buckets=${o.widthPx}`;
  const overview = [];
  for (let i = 0; i < 5; i++) overview.push(await summary(o, runId, buckets));
  const zooms = [];
  const spanMs = o.days * DAY_MS;
  for (let i = 0; i < 10; i++) {
    const from = RUN_START_MS + Math.floor(((i + 0.37) / 10) * (spanMs - HOUR_MS));
    zooms.push(await summary(o, runId, `fromMs=${from}&toMs=${from + HOUR_MS}&${buckets}`));
  }
  // Baseline: the rows themselves, as arrays (the cheapest form the connector offers), one day.
  const oneDay = await timed(() =>
    o.conn.query({ sql: 'SELECT seq, t_ms, channel, value FROM samples WHERE run_id = ? AND t_ms >= ? AND t_ms < ? ORDER BY seq', rowsAsArray: true }, [runId, RUN_START_MS, RUN_START_MS + DAY_MS]),
  );
  if ((oneDay.result as unknown[]).length !== 86_400 * 6) throw new Error(`one day returned ${(oneDay.result as unknown[]).length} rows`);
  // The stand-in run row has no real state: remove it with its rows so no page lists it later.
  await o.conn.query('DELETE FROM samples WHERE run_id = ?', [runId]);
  await o.conn.query('DELETE FROM sample_rollups WHERE run_id = ?', [runId]);
  await o.conn.query('DELETE FROM runs WHERE id = ?', [runId]);

  return {
    rows,
    insertS: fill.ms / 1000,
    rollupS: rollup.ms / 1000,
    overviewFirstMs: overview[0].ms,
    overviewMedianMs: median(overview.map((x) => x.ms)),
    zoomMaxMs: Math.max(...zooms.map((x) => x.ms)),
    zoomMedianMs: median(zooms.map((x) => x.ms)),
    maxPointsPerSeries: Math.max(...overview.map((x) => x.points), ...zooms.map((x) => x.points)),
    allRowsMs: oneDay.ms * o.days,
    allRowsNote: `one day's ${86_400 * 6} rows timed (${oneDay.ms.toFixed(0)} ms) × ${o.days}`,
  };
}
