import { useEffect, useRef } from 'react';

/** How often a standing, unacknowledged alarm sounds again, ms. */
export const ALARM_REPEAT_MS = 8_000;

type AudioContextClass = typeof AudioContext;

/** Browsers start audio only after a gesture: the context is made (or resumed) on the first touch or key. */
let sharedContext: AudioContext | null = null;
function audioContext(): AudioContext | null {
  const Ctor =
    (globalThis as { AudioContext?: AudioContextClass; webkitAudioContext?: AudioContextClass }).AudioContext ??
    (globalThis as { webkitAudioContext?: AudioContextClass }).webkitAudioContext;
  if (!Ctor) return null;
  try {
    sharedContext ??= new Ctor();
  } catch {
    return null;
  }
  return sharedContext;
}

/** Three short tones, loud enough to carry across a pit (square wave at 880 Hz). */
function beep(): void {
  const ctx = audioContext();
  if (!ctx) return;
  if (ctx.state === 'suspended') void ctx.resume().catch(() => {});
  const start = ctx.currentTime;
  for (let i = 0; i < 3; i += 1) {
    const osc = ctx.createOscillator();
    const gain = ctx.createGain();
    osc.type = 'square';
    osc.frequency.value = 880;
    gain.gain.setValueAtTime(0.2, start + i * 0.3);
    gain.gain.setValueAtTime(0, start + i * 0.3 + 0.18);
    osc.connect(gain).connect(ctx.destination);
    osc.start(start + i * 0.3);
    osc.stop(start + i * 0.3 + 0.2);
  }
}

function vibrate(): void {
  // Phones offer it; tablets and desktops mostly do not, and that is fine.
  if (typeof navigator !== 'undefined' && typeof navigator.vibrate === 'function') navigator.vibrate([300, 150, 300]);
}

/**
 * Sounds and vibrates at once when an alarm nobody has acknowledged appears, and again every
 * {@link ALARM_REPEAT_MS} while any stays unacknowledged. `keys` are the unacknowledged alarms' keys.
 */
export function useAlarmSignal(keys: readonly string[]): void {
  const heard = useRef(new Set<string>());
  const joined = keys.join('|');

  // Unlock audio on the first gesture, so the first alarm is heard even if nobody has touched the page since.
  useEffect(() => {
    const unlock = () => {
      const ctx = audioContext();
      if (ctx?.state === 'suspended') void ctx.resume().catch(() => {});
    };
    window.addEventListener('pointerdown', unlock, { once: true });
    window.addEventListener('keydown', unlock, { once: true });
    return () => {
      window.removeEventListener('pointerdown', unlock);
      window.removeEventListener('keydown', unlock);
    };
  }, []);

  useEffect(() => {
    const current = joined === '' ? [] : joined.split('|');
    const fresh = current.some((k) => !heard.current.has(k));
    heard.current = new Set(current);
    if (current.length === 0) return;
    if (fresh) {
      beep();
      vibrate();
    }
    const timer = setInterval(() => {
      beep();
      vibrate();
    }, ALARM_REPEAT_MS);
    return () => clearInterval(timer);
  }, [joined]);
}
