import { describe, expect, it } from 'vitest';
import { calibrationStatus } from '../../../shared/instruments/status';

describe('calibration status', () => {
  it.each([
    [null, 'uncalibrated'],
    ['2026-12-01', 'due-soon'], // due today: still usable
    ['2026-11-30', 'overdue'],
    ['2026-12-31', 'due-soon'], // 30 days ahead (common practice: flag a month before)
    ['2027-01-01', 'in-calibration'],
  ] as const)('due %s on 2026-12-01 → %s', (due, status) => {
    expect(calibrationStatus(due, '2026-12-01')).toBe(status);
  });
});
