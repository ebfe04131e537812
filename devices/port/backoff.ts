/** Reconnection delays. */
export interface BackoffOptions {
  /** First delay after a port is lost, ms. Defaults to 250. */
  initialMs?: number;
  /** Growth per failed attempt. Defaults to 1.5. */
  factor?: number;
  /** Longest delay, ms. Defaults to 5000, so a port that comes back is found within 5 s. */
  maxMs?: number;
}

/** Delay before the next attempt, given the previous delay (undefined for the first attempt). */
export function nextBackoffMs(previousMs: number | undefined, options: BackoffOptions = {}): number {
  const { initialMs = 250, factor = 1.5, maxMs = 5000 } = options;
  if (!(initialMs > 0) || !(factor >= 1) || !(maxMs >= initialMs)) {
    throw new RangeError('"backoff" needs initialMs > 0, factor ≥ 1 and maxMs ≥ initialMs');
  }
  return previousMs === undefined ? initialMs : Math.min(maxMs, previousMs * factor);
}
