import type { CalibrationStatus } from '../schemas/instruments';

/** Days before the due date from which a calibration shows as due soon (common practice: a month). */
export const DUE_SOON_DAYS = 30;

/**
 * Calibration status on a given day (dates as YYYY-MM-DD, compared as calendar days in UTC).
 * An instrument may be used through its due date; from the next day it is overdue.
 */
export function calibrationStatus(dueOn: string | null | undefined, today: string, dueSoonDays = DUE_SOON_DAYS): CalibrationStatus {
  if (!dueOn) return 'uncalibrated';
  const days = (Date.parse(`${dueOn}T00:00:00Z`) - Date.parse(`${today}T00:00:00Z`)) / 86_400_000;
  if (days < 0) return 'overdue';
  return days <= dueSoonDays ? 'due-soon' : 'in-calibration';
}

export const todayUtc = (now = new Date()) => now.toISOString().slice(0, 10);

/** The moment a calibration stops counting (ms since the epoch): the end of its due date, UTC, as {@link calibrationStatus} has it. */
export function calibrationExpiresAtMs(dueOn: string): number {
  return Date.parse(`${dueOn}T00:00:00Z`) + 86_400_000;
}
