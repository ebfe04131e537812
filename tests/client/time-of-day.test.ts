import { describe, expect, it } from 'vitest';
import { formatTimeOfDay } from '../../client/src/lib/format';

describe('time of day', () => {
  it('is on the 24-hour clock, never am/pm', () => {
    const afternoon = new Date(2026, 2, 4, 14, 5, 9).getTime();
    expect(formatTimeOfDay(afternoon)).toBe('14:05');
    expect(formatTimeOfDay(afternoon, true)).toBe('14:05:09');
    expect(formatTimeOfDay(new Date(2026, 2, 4, 0, 7, 0).getTime())).toBe('00:07');
    expect(formatTimeOfDay(Number.NaN)).toBe('—');
  });
});
