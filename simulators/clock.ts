/** Reads a wall clock in milliseconds; injectable so tests never wait. */
export type WallClock = () => number;

/** Any source of simulated time in milliseconds. */
export interface Clock {
  now(): number;
}

export const MIN_SPEED = 1;
export const MAX_SPEED = 1000;

export interface SimClockOptions {
  /** Time-acceleration factor, ×1 to ×1000. Defaults to 1. */
  speed?: number;
  /** Wall clock in ms. Defaults to `performance.now` (monotonic). */
  wall?: WallClock;
  /** Simulated time at creation, ms. Defaults to 0. */
  startMs?: number;
}

/** Checks a time-acceleration factor; the error names the field. */
export function checkSpeed(speed: number, field = 'speed'): number {
  if (!Number.isFinite(speed) || speed < MIN_SPEED || speed > MAX_SPEED) {
    throw new RangeError(`"${field}" must be a number from ${MIN_SPEED} to ${MAX_SPEED} (got ${speed})`);
  }
  return speed;
}

/**
 * Simulated time that runs `speed` times faster than the wall clock. Changing the speed keeps the
 * simulated time continuous: it never jumps, only its rate changes. At ×1000 a 24-hour hold takes
 * 86.4 s of wall time.
 */
export class SimClock implements Clock {
  readonly #wall: WallClock;
  #speed: number;
  #wallAtAnchor: number;
  #simAtAnchor: number;

  constructor(options: SimClockOptions = {}) {
    this.#wall = options.wall ?? (() => performance.now());
    this.#speed = checkSpeed(options.speed ?? 1);
    this.#wallAtAnchor = this.#wall();
    this.#simAtAnchor = options.startMs ?? 0;
  }

  /** Simulated time, ms. */
  now(): number {
    return this.#simAtAnchor + (this.#wall() - this.#wallAtAnchor) * this.#speed;
  }

  get speed(): number {
    return this.#speed;
  }

  setSpeed(speed: number): void {
    checkSpeed(speed);
    this.#simAtAnchor = this.now();
    this.#wallAtAnchor = this.#wall();
    this.#speed = speed;
  }

  /** Wall-clock milliseconds that a span of simulated time takes at the current speed. */
  wallMsFor(simMs: number): number {
    return simMs / this.#speed;
  }
}
