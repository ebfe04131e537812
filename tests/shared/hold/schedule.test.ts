import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { lateReadings, nextReadingDue, readingTimes } from '@shared/hold/schedule';
import { findProfile } from '@shared/procedures/profiles';
import type { ReadingSchedule } from '@shared/schemas/plans';

// IS 1888 family: 1, 2.25, 4, 6.25, 9, 16, 25 min, then hourly (seen-2nd, reference §A.3).
const IS_SCHEDULE = findProfile('bearing-granular')!.defaults.readingSchedule;
const EVERY_MINUTE: ReadingSchedule = { kind: 'interval', everyMin: 1 };

describe('readingTimes', () => {
  it('lists the IS 1888 times then every hour, starting with the reading at the target (reference §A.3, §C13)', () => {
    expect(readingTimes(IS_SCHEDULE, 180)).toEqual([0, 1, 2.25, 4, 6.25, 9, 16, 25, 60, 120, 180]);
  });

  it('makes √t run 1, 1.5, 2, 2.5, 3, 4, 5 over the listed times (reference §A.3, calc)', () => {
    expect(readingTimes(IS_SCHEDULE, 25).slice(1).map(Math.sqrt)).toEqual([1, 1.5, 2, 2.5, 3, 4, 5]);
  });

  it('spaces an interval schedule evenly', () => {
    expect(readingTimes({ kind: 'interval', everyMin: 2 }, 7)).toEqual([0, 2, 4, 6]);
  });

  it('continues a list with multiples of its step after the last listed time', () => {
    expect(readingTimes({ kind: 'list', minutes: [1, 2, 4, 8, 15, 30], thenEveryMin: 20 }, 80)).toEqual([0, 1, 2, 4, 8, 15, 30, 40, 60, 80]);
  });

  it('throws naming the field for a bad schedule', () => {
    expect(() => readingTimes({ kind: 'list', minutes: [1, 4, 2], thenEveryMin: 60 }, 10)).toThrow(/^schedule\.minutes\[2\]:/);
    expect(() => readingTimes({ kind: 'interval', everyMin: 0 }, 10)).toThrow(/^schedule\.everyMin:/);
    expect(() => readingTimes({ kind: 'interval', everyMin: 1e-4 }, 1e6)).toThrow(/^untilMin:/);
  });
});

describe('nextReadingDue', () => {
  it('gives the next time and the minutes to it', () => {
    expect(nextReadingDue(IS_SCHEDULE, 5)).toEqual({ atMin: 6.25, inMin: 1.25 });
    expect(nextReadingDue(IS_SCHEDULE, 9)).toEqual({ atMin: 9, inMin: 0 });
    expect(nextReadingDue(IS_SCHEDULE, 30)).toEqual({ atMin: 60, inMin: 30 });
    expect(nextReadingDue(EVERY_MINUTE, 3.4)).toEqual({ atMin: 4, inMin: expect.closeTo(0.6, 12) });
  });

  it('property: agrees with readingTimes', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 500, noNaN: true }), (elapsed) => {
        const due = nextReadingDue(IS_SCHEDULE, elapsed);
        return due.atMin === readingTimes(IS_SCHEDULE, elapsed + 61).find((t) => t >= elapsed - 1e-6);
      }),
    );
  });
});

describe('lateReadings', () => {
  it('flags late and missing manual readings and spares those within the grace period', () => {
    const flags = lateReadings(IS_SCHEDULE, [0, 1.05, 2.9, 6.3, 8.8], 10, 0.25);
    expect(flags).toEqual([
      { dueAtMin: 2.25, status: 'late', takenAtMin: 2.9, lateByMin: expect.closeTo(0.65, 12) },
      { dueAtMin: 4, status: 'missing', takenAtMin: null, lateByMin: 6 },
    ]);
  });

  it('does not flag a reading still within its grace period', () => {
    expect(lateReadings(EVERY_MINUTE, [0, 1, 2], 3.1, 0.25)).toEqual([]);
    expect(lateReadings(EVERY_MINUTE, [0, 1, 2], 3.3, 0.25)).toEqual([
      { dueAtMin: 3, status: 'missing', takenAtMin: null, lateByMin: expect.closeTo(0.3, 12) },
    ]);
  });

  it('counts a reading taken early, within the grace, for the time it was meant for', () => {
    expect(lateReadings(EVERY_MINUTE, [0, 1, 1.8], 2.1, 0.25)).toEqual([]);
  });

  it('property: every scheduled time past its grace is either taken on time or flagged once', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: 0, max: 30, noNaN: true }), { maxLength: 40 }), fc.double({ min: 0, max: 30, noNaN: true }), (taken, now) => {
        const grace = 0.2;
        const flags = lateReadings(EVERY_MINUTE, taken, now, grace);
        const flagged = flags.map((f) => f.dueAtMin);
        const due = readingTimes(EVERY_MINUTE, now).filter((t) => now > t + grace + 1e-6);
        const onTime = due.filter((t) => taken.some((x) => Math.abs(x - t) <= grace + 1e-6 && x <= now));
        return new Set(flagged).size === flagged.length && due.every((t) => onTime.includes(t) || flagged.includes(t));
      }),
    );
  });
});
