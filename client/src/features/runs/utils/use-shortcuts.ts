import { useEffect, useRef } from 'react';

const TYPING = new Set(['INPUT', 'TEXTAREA', 'SELECT']);

/** True when a key press belongs to a field being typed in, not to the page. */
function isTyping(target: EventTarget | null): boolean {
  const el = target as HTMLElement | null;
  return !!el && (TYPING.has(el.tagName) || el.isContentEditable);
}

/**
 * Single-key shortcuts for a laptop at the rig (e.g. { a: applyNext }). Keys are matched without
 * case; presses with Ctrl, Alt or Meta, and presses while typing in a field, are left alone.
 * A handler set to null is ignored (the action is unavailable now).
 */
export function useShortcuts(keys: Record<string, (() => void) | null>): void {
  const latest = useRef(keys);
  latest.current = keys;
  useEffect(() => {
    const onKey = (event: KeyboardEvent) => {
      if (event.ctrlKey || event.altKey || event.metaKey || event.repeat || isTyping(event.target)) return;
      const handler = latest.current[event.key.toLowerCase()];
      if (!handler) return;
      event.preventDefault();
      handler();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, []);
}
