import { useEffect, useState } from 'react';

/** Replay speeds: run time per real time. */
export const REPLAY_SPEEDS = [1, 10, 60, 600] as const;
export type ReplaySpeed = (typeof REPLAY_SPEEDS)[number];

/** Real time between playback steps, ms: four steps a second keep the panels current without a render per sample. */
const STEP_MS = 250;

/**
 * The replay clock: a scrubbed time within [fromMs, toMs] that, while playing, moves at `speed` × real time
 * and stops at the end.
 */
export function usePlayback(fromMs: number, toMs: number) {
  const [tMs, setT] = useState(toMs);
  const [playing, setPlaying] = useState(false);
  const [speed, setSpeed] = useState<ReplaySpeed>(60);
  const clamp = (t: number) => Math.min(toMs, Math.max(fromMs, t));

  useEffect(() => {
    if (!playing) return;
    const timer = setInterval(() => {
      setT((t) => {
        const next = Math.min(toMs, t + speed * STEP_MS);
        if (next >= toMs) setPlaying(false);
        return next;
      });
    }, STEP_MS);
    return () => clearInterval(timer);
  }, [playing, speed, toMs]);

  return {
    tMs: clamp(tMs),
    playing,
    speed,
    setSpeed,
    seek: (t: number) => setT(clamp(t)),
    /** Plays from the start again when at the end. */
    toggle: () => {
      if (!playing && tMs >= toMs) setT(fromMs);
      setPlaying(!playing);
    },
  };
}
