import { useEffect, useState } from 'react';

/** The wall clock, ticking every `intervalMs` (default 1 s): for ages and countdowns. */
export function useNow(intervalMs = 1000): number {
  const [now, setNow] = useState(Date.now);
  useEffect(() => {
    const timer = setInterval(() => setNow(Date.now()), intervalMs);
    return () => clearInterval(timer);
  }, [intervalMs]);
  return now;
}
