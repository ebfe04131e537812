import type { Clock } from '../../../devices/port/clock';

/** A clock that moves only when told: `advance(ms)` runs the timers that fall due, in order. */
export class ManualClock implements Clock {
  private time = 0;
  private timers: { at: number; fn: () => void; id: number }[] = [];
  private nextId = 0;
  /** Delays asked for, in order, for checking retry schedules. */
  readonly requested: number[] = [];

  now(): number {
    return this.time;
  }

  after(ms: number, fn: () => void): () => void {
    const id = this.nextId++;
    this.requested.push(ms);
    this.timers.push({ at: this.time + ms, fn, id });
    return () => {
      this.timers = this.timers.filter((t) => t.id !== id);
    };
  }

  advance(ms: number): void {
    const end = this.time + ms;
    for (;;) {
      const due = this.timers.filter((t) => t.at <= end).sort((a, b) => a.at - b.at || a.id - b.id)[0];
      if (!due) break;
      this.timers = this.timers.filter((t) => t !== due);
      this.time = due.at;
      due.fn();
    }
    this.time = end;
  }
}
