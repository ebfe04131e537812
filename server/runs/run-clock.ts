import type { PersistedRun } from '../models/run';

/** Run time for a wall-clock time: wall time for real rigs, accelerated for a simulated one. */
export const runTime = (clock: PersistedRun['clock'], wallMs: number) => clock.anchorRunMs + (wallMs - clock.anchorWallMs) * clock.speed;

export function newRunClock(speed: number, wallMs = Date.now()): PersistedRun['clock'] {
  return { speed, anchorWallMs: wallMs, anchorRunMs: wallMs };
}
