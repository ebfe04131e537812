/**
 * Puts a run's new samples on disk (the journal) before anything else sees them, and copes with a
 * journal that refuses them (disk full, disk gone): the rows wait in memory, bounded, and are tried
 * again every `retryMs`; beyond `maxWaiting` the oldest waiting rows are given up and counted. What
 * was already secured stays as it was. The engine raises the "readings are not being secured" alarm
 * from `failure`.
 */
import createDebug from 'debug';
import type { SampleRow } from '../../shared/runs/samples';
import type { Journal } from './journal';

const debug = createDebug('sscope:runs:securer');

/** Options of {@link SampleSecurer}. */
export interface SampleSecurerOptions {
  /** Most rows kept in memory while the journal refuses them. Default 36,000 (10 minutes at 6 channels × 10 Hz). */
  maxWaiting?: number;
  /** How often a refusing journal is tried again, ms. Default 1000 (not every 25 ms flush). */
  retryMs?: number;
  /** Monotonic clock, ms. Default performance.now. */
  now?: () => number;
}

/** Why and since when readings are not being secured. */
export interface SecuringFailure {
  /** When the journal first refused, on the securer's clock, ms. */
  sinceMs: number;
  message: string;
  /** Rows waiting in memory for the journal. */
  waiting: number;
  /** Rows given up since the failure began, because more were waiting than `maxWaiting`. */
  lost: number;
}

export class SampleSecurer {
  private waiting: SampleRow[] = [];
  private failing: { sinceMs: number; message: string; lost: number } | null = null;
  private nextTryMs = 0;
  /** Most rows kept in memory while the journal refuses them. */
  readonly maxWaiting: number;
  private readonly retryMs: number;
  private readonly now: () => number;

  constructor(
    private readonly journal: Pick<Journal, 'append'>,
    { maxWaiting = 36_000, retryMs = 1000, now = () => performance.now() }: SampleSecurerOptions = {},
  ) {
    this.maxWaiting = maxWaiting;
    this.retryMs = retryMs;
    this.now = now;
  }

  /** Null while every row reaches the disk. */
  get failure(): SecuringFailure | null {
    return this.failing && { ...this.failing, waiting: this.waiting.length };
  }

  /** Takes new rows (seq order) and returns the rows now on disk, oldest first; empty while the journal refuses. */
  secure(rows: SampleRow[]): SampleRow[] {
    for (const row of rows) this.waiting.push(row);
    if (this.waiting.length === 0) return [];
    const now = this.now();
    if (this.failing && now < this.nextTryMs) return this.bound();
    const batch = this.waiting;
    try {
      this.journal.append(batch);
    } catch (err) {
      const message = (err as Error).message;
      if (!this.failing) debug('journal refused %d rows: %s', batch.length, message);
      this.failing = { sinceMs: this.failing?.sinceMs ?? now, message, lost: this.failing?.lost ?? 0 };
      this.nextTryMs = now + this.retryMs;
      return this.bound();
    }
    if (this.failing) debug('journal takes rows again after %d ms; %d rows given up', Math.round(now - this.failing.sinceMs), this.failing.lost);
    this.waiting = [];
    this.failing = null;
    return batch;
  }

  /** Drops the oldest waiting rows beyond the bound; always returns no rows (none reached the disk). */
  private bound(): SampleRow[] {
    const excess = this.waiting.length - this.maxWaiting;
    if (excess > 0 && this.failing) {
      this.waiting = this.waiting.slice(excess);
      this.failing.lost += excess;
    }
    return [];
  }
}
