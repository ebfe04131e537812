/**
 * Moves journaled samples into MariaDB: chunks of ≤ 5,000 rows through the mariadb driver's
 * `batch()` on a connection borrowed from Sequelize's own pool (no model instance per sample).
 * `INSERT IGNORE` on the (run_id, seq) key makes a replayed chunk harmless. While the database is
 * away, rows wait in order and the archiver retries with backoff; nothing is dropped.
 */
import createDebug from 'debug';
import type { Sequelize } from 'sequelize';
import type { SampleRow } from '../../shared/runs/samples';

const debug = createDebug('sscope:runs:archiver');

export interface ArchiverOptions {
  /** Rows per batch() call. Default 5,000. */
  chunkSize?: number;
  /** First retry delay after a failure, ms (doubles up to 5 s). Default 250. */
  retryMs?: number;
  /** Called after each chunk lands, with the run and its highest archived seq. */
  onArchived?: (runId: number, seq: number) => void;
}

interface MariadbConnection {
  batch(sql: string, values: unknown[][]): Promise<unknown>;
}

const INSERT = 'INSERT IGNORE INTO samples (run_id, seq, t_ms, channel, raw, value, status) VALUES (?, ?, ?, ?, ?, ?, ?)';

export class Archiver {
  private readonly queue: { runId: number; row: SampleRow }[] = [];
  private running: Promise<void> | null = null;
  private failures = 0;
  private stopped = false;
  /** Total rows written, and whether the last attempt failed (for health and benchmarks). */
  written = 0;
  healthy = true;

  constructor(
    readonly sequelize: Sequelize,
    private readonly options: ArchiverOptions = {},
  ) {}

  get backlog(): number {
    return this.queue.length;
  }

  /** A run's rows still waiting for the database with seq above `afterSeq`, oldest first (rows queue in seq order per run). */
  queued(runId: number, afterSeq: number): SampleRow[] {
    const rows: SampleRow[] = [];
    for (const q of this.queue) if (q.runId === runId && q.row.seq > afterSeq) rows.push(q.row);
    return rows;
  }

  enqueue(runId: number, rows: SampleRow[]): void {
    for (const row of rows) this.queue.push({ runId, row });
    this.kick();
  }

  /** Resolves when everything queued so far is in the database (or at once once stopped: nothing more will be written). */
  async drain(): Promise<void> {
    while ((this.queue.length > 0 && !this.stopped) || this.running) {
      this.kick();
      await this.running;
    }
  }

  stop(): void {
    this.stopped = true;
  }

  private kick(): void {
    if (this.running || this.stopped || this.queue.length === 0) return;
    this.running = this.loop().finally(() => {
      this.running = null;
      if (this.queue.length > 0 && !this.stopped) setImmediate(() => this.kick());
    });
  }

  private async loop(): Promise<void> {
    const chunkSize = this.options.chunkSize ?? 5000;
    while (this.queue.length > 0 && !this.stopped) {
      const chunk = this.queue.slice(0, chunkSize);
      try {
        await this.write(chunk);
        this.queue.splice(0, chunk.length);
        this.written += chunk.length;
        this.failures = 0;
        this.healthy = true;
        const last = new Map<number, number>();
        for (const { runId, row } of chunk) last.set(runId, Math.max(last.get(runId) ?? 0, row.seq));
        for (const [runId, seq] of last) this.options.onArchived?.(runId, seq);
      } catch (err) {
        this.healthy = false;
        this.failures += 1;
        const delay = Math.min(5000, (this.options.retryMs ?? 250) * 2 ** (this.failures - 1));
        debug('archive failed (%s); retrying in %d ms with %d rows waiting', (err as Error).message, delay, this.queue.length);
        await new Promise((r) => setTimeout(r, delay));
      }
    }
  }

  private async write(chunk: { runId: number; row: SampleRow }[]): Promise<void> {
    const manager = this.sequelize.connectionManager as unknown as {
      getConnection(o: { type: 'write' }): Promise<MariadbConnection>;
      releaseConnection(c: MariadbConnection): Promise<void> | void;
    };
    const conn = await manager.getConnection({ type: 'write' });
    try {
      await conn.batch(
        INSERT,
        chunk.map(({ runId, row }) => [runId, row.seq, row.tMs, row.channel, row.raw, row.value, row.status]),
      );
    } finally {
      await manager.releaseConnection(conn);
    }
  }
}
