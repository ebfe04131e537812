import createDebug from 'debug';
import type { Clock } from '../port/clock';

const debug = createDebug('settlescope:devices:poll');

export type ReplyOutcome<T> = { kind: 'reply'; value: T } | { kind: 'timeout' } | { kind: 'cancelled' };

/** One outstanding request: the reply, a timeout or a cancellation settles it, whichever comes first. */
export class ReplyWaiter<T> {
  private settle?: (outcome: ReplyOutcome<T>) => void;

  constructor(private readonly clock: Clock) {}

  get pending(): boolean {
    return this.settle !== undefined;
  }

  /** Starts waiting (cancelling any earlier wait) and resolves with what happened first. */
  wait(timeoutMs: number): Promise<ReplyOutcome<T>> {
    this.cancel();
    return new Promise((resolve) => {
      const finish = (outcome: ReplyOutcome<T>) => {
        if (this.settle !== finish) return;
        this.settle = undefined;
        cancelTimer();
        resolve(outcome);
      };
      const cancelTimer = this.clock.after(timeoutMs, () => finish({ kind: 'timeout' }));
      this.settle = finish;
    });
  }

  /** Hands over a reply; false when nothing was waiting for one. */
  deliver(value: T): boolean {
    if (!this.settle) return false;
    this.settle({ kind: 'reply', value });
    return true;
  }

  cancel(): void {
    this.settle?.({ kind: 'cancelled' });
  }
}

/**
 * Calls `poll` every `intervalMs`, measured start to start; a poll that runs long delays the next
 * one rather than overlapping it.
 */
export class PollLoop {
  private cancelNext?: () => void;
  private running = false;

  constructor(
    private readonly clock: Clock,
    private readonly intervalMs: number,
    private readonly poll: () => Promise<void>,
  ) {}

  start(): void {
    if (this.running) return;
    this.running = true;
    this.schedule(0);
  }

  stop(): void {
    this.running = false;
    this.cancelNext?.();
    this.cancelNext = undefined;
  }

  private schedule(delayMs: number): void {
    this.cancelNext = this.clock.after(delayMs, async () => {
      const started = this.clock.now();
      await this.poll().catch((error: Error) => debug('poll failed: %s', error.message));
      if (this.running) this.schedule(Math.max(0, this.intervalMs - (this.clock.now() - started)));
    });
  }
}
