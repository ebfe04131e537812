import type { ChannelLive } from '@shared/realtime/events';

/** Decimals that match each unit's usual resolution (0.001 mm, 0.0001 in, 0.01 of a pressure or force). */
const DIGITS: Record<string, number> = { mm: 3, in: 4, um: 1 };

export function formatReading(value: number | null, unit: string): string {
  return value == null || Number.isNaN(value) ? '—' : value.toFixed(DIGITS[unit] ?? 2);
}

/** A raw device value as it came: counts stay whole, fractions keep four decimals. */
export function formatRaw(raw: number | null): string {
  if (raw == null) return '—';
  return Number.isInteger(raw) ? String(raw) : raw.toFixed(4);
}

/** The reading shown while a display zero is set: how far the channel moved since it was set. */
export function movementSince(value: number | null, zero: number | undefined): number | null {
  return value == null || zero === undefined ? value : value - zero;
}

/** A sample older than this is called stale: the device may have stopped answering. */
export const STALE_AFTER_MS = 2000;

/** "0.3 s", "14 s", "3 min", or "no sample yet". */
export function formatAge(atMs: number | null, nowMs: number): string {
  if (atMs == null) return 'no sample yet';
  const seconds = Math.max(0, nowMs - atMs) / 1000;
  if (seconds < 10) return `${seconds.toFixed(1)} s`;
  if (seconds < 120) return `${Math.round(seconds)} s`;
  return `${Math.round(seconds / 60)} min`;
}

type Word = { symbol: string; word: string; bad: boolean };

export const LINK_WORDS: Record<ChannelLive['link'], Word> = {
  connecting: { symbol: '◌', word: 'Connecting', bad: false },
  open: { symbol: '●', word: 'Open', bad: false },
  error: { symbol: '✖', word: 'Error', bad: true },
  closed: { symbol: '○', word: 'Closed', bad: true },
  manual: { symbol: '✎', word: 'Typed in by hand', bad: false },
};

export const SAMPLE_WORDS: Record<ChannelLive['status'], Word> = {
  ok: { symbol: '✓', word: 'Good', bad: false },
  timeout: { symbol: '⚠', word: 'No answer (timeout)', bad: true },
  rejected: { symbol: '✖', word: 'Frame rejected', bad: true },
  disconnected: { symbol: '⚠', word: 'Disconnected', bad: true },
};
