/** Time source of the device layer; tests inject a manual one. */
export interface Clock {
  /** Monotonic milliseconds; never goes back, even when the wall clock is set. */
  now(): number;
  /** Calls `fn` once after `ms` milliseconds; returns a function that cancels it. */
  after(ms: number, fn: () => void): () => void;
}

/** performance.now() on the epoch scale: monotonic, and close to Date.now() when the process started. */
export const systemClock: Clock = {
  now: () => performance.timeOrigin + performance.now(),
  after(ms, fn) {
    const handle = setTimeout(fn, ms);
    return () => clearTimeout(handle);
  },
};
