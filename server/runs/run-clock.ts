import { type WallClock, systemClock } from '../../devices/port/clock';
import type { PersistedRun } from '../models/run';

/** Run time for a wall-clock time: wall time for real rigs, accelerated for a simulated one. */
export const runTime = (clock: PersistedRun['clock'], wallMs: number) => clock.anchorRunMs + (wallMs - clock.anchorWallMs) * clock.speed;

export function newRunClock(speed: number, wallMs = Date.now()): PersistedRun['clock'] {
  return { speed, anchorWallMs: wallMs, anchorRunMs: wallMs };
}

/**
 * A run's clock while this process runs it: anchored on the wall clock once, at start (so a restart
 * counts the time the server was down), then moved only by monotonic time. Setting the wall clock
 * does not move it; time the machine spends asleep does not count (a hold then lasts longer, never
 * shorter, than its run time says).
 */
export class RunClock {
  private readonly baseRunMs: number;
  private readonly baseMonoMs: number;

  constructor(
    private readonly anchor: PersistedRun['clock'],
    private readonly clock: WallClock = systemClock,
  ) {
    this.baseMonoMs = clock.now();
    this.baseRunMs = runTime(anchor, clock.wall());
  }

  get speed(): number {
    return this.anchor.speed;
  }

  /** Run time of a monotonic instant of the clock (default: now). */
  at(monoMs = this.clock.now()): number {
    return this.baseRunMs + (monoMs - this.baseMonoMs) * this.anchor.speed;
  }

  /** The anchor to persist: run time now against wall time now, so the next start continues from here. */
  persisted(): PersistedRun['clock'] {
    return { speed: this.anchor.speed, anchorWallMs: this.clock.wall(), anchorRunMs: this.at() };
  }
}
