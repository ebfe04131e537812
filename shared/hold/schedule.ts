import { InterpretationInputError, requireFinite, requireNonNegative, requirePositive } from '../interpretation/input-checks';
import type { ReadingSchedule } from '../schemas/plans';
import { TIME_EPS_MIN } from './series';

/** More scheduled readings than this in one hold means a mistaken schedule (14 days of 1-min readings is 20,160). */
const MAX_READINGS = 100_000;

function checkSchedule(schedule: ReadingSchedule): void {
  if (schedule.kind === 'interval') {
    requirePositive(schedule.everyMin, 'schedule.everyMin');
    return;
  }
  requirePositive(schedule.thenEveryMin, 'schedule.thenEveryMin');
  if (schedule.minutes.length === 0) throw new InterpretationInputError('schedule.minutes', 'needs at least one time');
  schedule.minutes.forEach((m, i) => {
    requirePositive(m, `schedule.minutes[${i}]`);
    if (i > 0 && m <= schedule.minutes[i - 1]) throw new InterpretationInputError(`schedule.minutes[${i}]`, 'times must increase');
  });
}

/**
 * The scheduled reading times of a hold, minutes since the target was reached, endlessly: 0 (the reading
 * when the target is reached), then the listed times and after the last one every multiple of
 * `thenEveryMin` (1, 2.25, 4, 6.25, 9, 16, 25, 60, 120 … for the √t schedule, reference §A.3), or every
 * `everyMin`.
 */
function* scheduledTimes(schedule: ReadingSchedule): Generator<number> {
  yield 0;
  if (schedule.kind === 'interval') {
    for (let k = 1; ; k++) yield k * schedule.everyMin;
  }
  yield* schedule.minutes;
  const last = schedule.minutes[schedule.minutes.length - 1];
  for (let k = Math.floor(last / schedule.thenEveryMin + TIME_EPS_MIN) + 1; ; k++) yield k * schedule.thenEveryMin;
}

/** Scheduled reading times from 0 up to and including `untilMin`. Throws naming the field on a bad schedule. */
export function readingTimes(schedule: ReadingSchedule, untilMin: number): number[] {
  checkSchedule(schedule);
  requireFinite(untilMin, 'untilMin');
  const times: number[] = [];
  for (const t of scheduledTimes(schedule)) {
    if (t > untilMin + TIME_EPS_MIN) break;
    if (times.length === MAX_READINGS)
      throw new InterpretationInputError('untilMin', `the schedule has more than ${MAX_READINGS} readings up to ${untilMin} min`);
    times.push(t);
  }
  return times;
}

/** The next reading due at or after `elapsedMin`, and the minutes until it (0 = due now). */
export function nextReadingDue(schedule: ReadingSchedule, elapsedMin: number): { atMin: number; inMin: number } {
  checkSchedule(schedule);
  requireNonNegative(elapsedMin, 'elapsedMin');
  for (const t of scheduledTimes(schedule)) {
    if (t >= elapsedMin - TIME_EPS_MIN) return { atMin: t, inMin: Math.max(0, t - elapsedMin) };
  }
  throw new Error('unreachable: the schedule is endless');
}

/** A scheduled reading that was taken late or not at all. */
export interface ReadingFlag {
  dueAtMin: number;
  status: 'late' | 'missing';
  /** When the reading was taken, minutes; null when missing. */
  takenAtMin: number | null;
  /** How late it was taken, or how overdue it is now, minutes. */
  lateByMin: number;
}

/**
 * Flags late and missing manual readings. Each scheduled time t_i owns the readings taken in
 * [t_i − grace, t_(i+1) − grace); the first of them counts. Taken within t_i ± grace it is on time,
 * later it is late; with none, the reading is missing once `nowMin` is past t_i + grace.
 * Readings still within their grace period are not flagged.
 */
export function lateReadings(schedule: ReadingSchedule, takenAtMin: readonly number[], nowMin: number, graceMin: number): ReadingFlag[] {
  requireNonNegative(graceMin, 'graceMin');
  for (const [i, t] of takenAtMin.entries()) requireFinite(t, `takenAtMin[${i}]`);
  // Times due up to now + grace own the readings taken early, up to their grace, before they fall due.
  const due = readingTimes(schedule, nowMin + graceMin);
  const taken = takenAtMin.filter((t) => t <= nowMin + TIME_EPS_MIN).sort((a, b) => a - b);
  const flags: ReadingFlag[] = [];
  let next = 0;
  due.forEach((t, i) => {
    const slotEnd = i + 1 < due.length ? due[i + 1] - graceMin : Number.POSITIVE_INFINITY;
    while (next < taken.length && taken[next] < t - graceMin - TIME_EPS_MIN) next++;
    const reading = next < taken.length && taken[next] < slotEnd - TIME_EPS_MIN ? taken[next] : null;
    if (reading !== null) {
      next++;
      if (reading > t + graceMin + TIME_EPS_MIN) flags.push({ dueAtMin: t, status: 'late', takenAtMin: reading, lateByMin: reading - t });
    } else if (nowMin > t + graceMin + TIME_EPS_MIN) {
      flags.push({ dueAtMin: t, status: 'missing', takenAtMin: null, lateByMin: nowMin - t });
    }
  });
  return flags;
}
