import { describe, expect, it } from 'vitest';
import { describeRunEvent } from '../../../shared/runs/event-text';
import { formatFixed, formatPlanned, formatQuantity, formatValue } from '../../../shared/units/format';

describe('unit-aware rounding', () => {
  it('rounds each quantity to its unit’s places (common practice for site records)', () => {
    expect(formatQuantity(7.07355302630646, 'kPa')).toBe('7.1 kPa');
    expect(formatQuantity(3.4167, 'mm')).toBe('3.42 mm');
    expect(formatQuantity(0.01234, 'mm/min')).toBe('0.012 mm/min');
    expect(formatQuantity(14.114, 'kN')).toBe('14.11 kN');
    expect(formatValue(12.345, 'min')).toBe('12.3');
    expect(formatQuantity(2.5, 'furlongs')).toBe('2.50 furlongs'); // an unknown unit gets two places
  });

  it('never prints a negative zero', () => {
    expect(formatFixed(-0.0004, 3)).toBe('0.000');
    expect(formatFixed(-0, 2)).toBe('0.00');
    expect(formatQuantity(-0.00001, 'mm/min')).toBe('0.000 mm/min');
    expect(formatFixed(-0.004, 0)).toBe('0');
    expect(formatQuantity(-0.012, 'mm/min')).toBe('-0.012 mm/min'); // a real negative keeps its sign
  });

  it('prints a dash, without a unit, when there is nothing to print', () => {
    for (const v of [null, undefined, Number.NaN, Number.POSITIVE_INFINITY]) expect(formatQuantity(v, 'kPa')).toBe('—');
  });

  it('drops trailing zeros from planned figures only', () => {
    expect(formatPlanned(300, 'kPa')).toBe('300');
    expect(formatPlanned(7.07355302630646, 'kPa')).toBe('7.1');
    expect(formatPlanned(0.02, 'mm/min')).toBe('0.02');
    expect(formatPlanned(100, 'kPa')).toBe('100');
    expect(formatValue(300, 'kPa')).toBe('300.0');
  });
});

describe('run events in words', () => {
  it('never shows a raw code, and rounds the figures it carries', () => {
    const cases: [string, Record<string, unknown>, string][] = [
      ['alarm-raise', { key: 'load-drift', message: 'Load drifting' }, 'Alarm raised: Load drifting'],
      ['alarm-clear', { key: 'signal-lost:g1' }, 'Alarm cleared: signal lost (g1)'],
      ['alarm-shelve', { key: 'plate-tilt', minutes: 30, reason: 'Re-bedding' }, 'Alarm shelved: Plate tilting for 30.0 min: Re-bedding'],
      ['run-started', { stageIndex: 0, targetKpa: 7.07355302630646 }, 'Run started: Stage 1 (seating) to 7.1 kPa'],
      [
        'stage-advanced',
        { from: 1, to: 2, targetKpa: 200, early: true, reason: 'Engineer agreed' },
        'Next stage applied early: Stage 3 to 200 kPa: Engineer agreed',
      ],
      ['target-reached', { stageIndex: 8, by: 'pressure reading' }, 'Target reached: Stage 9, from the pressure reading'],
      ['gauge-reset', { channel: 'g2', beforeMm: 23.41, afterMm: 2.0500001 }, 'Gauge reset: g2: 23.41 mm before, 2.05 mm after'],
      ['outage', { fromMs: 0, toMs: 90_000 }, 'Recording interrupted: no samples for 1.5 min'],
      ['pump-serviced', {}, 'Pump serviced'],
    ];
    for (const [kind, payload, expected] of cases) {
      const { title, detail } = describeRunEvent({ kind, payload });
      expect(detail ? `${title}: ${detail}` : title).toBe(expected);
    }
  });
});
