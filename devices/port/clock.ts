/** Time source of the device layer; tests inject a manual one. */
export interface Clock {
  /** Monotonic milliseconds (any origin): intervals, timeouts and sample times. Never moves with the wall clock. */
  now(): number;
  /** Calls `fn` once after `ms` milliseconds; returns a function that cancels it. */
  after(ms: number, fn: () => void): () => void;
}

/** A clock that can also tell wall time (ms since the epoch), for stamps a person reads. */
export interface WallClock extends Clock {
  wall(): number;
}

/**
 * The process's clocks: performance.now() (CLOCK_MONOTONIC: unmoved by setting the wall clock, paused
 * while the machine sleeps) and Date.now(). They are never compared with each other except in {@link wallAt}.
 */
export const systemClock: WallClock = {
  now: () => performance.now(),
  wall: () => Date.now(),
  after(ms, fn) {
    const handle = setTimeout(fn, ms);
    return () => clearTimeout(handle);
  },
};

/** Wall time of a monotonic instant: the one place monotonic times become wall times. */
export const wallAt = (clock: WallClock, monoMs: number): number => clock.wall() - (clock.now() - monoMs);
