import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { type AlarmAction, type AlarmRecord, alarmKey, reduceAlarm } from '@shared/hold/alarm-lifecycle';
import { gaugeTravelAlarm, loadDriftAlarm } from '@shared/hold/alarms';

const drift = loadDriftAlarm({ targetKpa: 100, actualKpa: 95 });

function apply(actions: AlarmAction[]): AlarmRecord {
  let record: AlarmRecord | null = null;
  for (const action of actions) {
    const result = reduceAlarm(record, action);
    if (!result.ok) throw new Error(result.error);
    record = result.record;
  }
  return record!;
}

describe('alarm lifecycle', () => {
  it('raises, is acknowledged and clears, recording who and when', () => {
    const record = apply([
      { type: 'raise', atMs: 1000, alarm: drift },
      { type: 'acknowledge', atMs: 2000, by: 'operator ana' },
      { type: 'clear', atMs: 3000 },
    ]);
    expect(record.state).toBe('cleared');
    expect(record.history.map((h) => [h.action, h.from, h.to, h.by, h.atMs])).toEqual([
      ['raise', null, 'unacknowledged', 'system', 1000],
      ['acknowledge', 'unacknowledged', 'acknowledged', 'operator ana', 2000],
      ['clear', 'acknowledged', 'cleared', 'system', 3000],
    ]);
  });

  it('comes back unacknowledged when the shelf expires, not before', () => {
    const shelved = apply([
      { type: 'raise', atMs: 0, alarm: drift },
      { type: 'shelve', atMs: 100, by: 'operator ana', untilMs: 600_100, reason: 'pump being refilled' },
    ]);
    expect(shelved).toMatchObject({ state: 'shelved', shelvedUntilMs: 600_100 });
    expect(reduceAlarm(shelved, { type: 'unshelve-expired', atMs: 600_000 })).toEqual({ ok: false, error: 'the alarm is shelved until 600100' });
    const back = reduceAlarm(shelved, { type: 'unshelve-expired', atMs: 600_100 });
    expect(back.ok && back.record).toMatchObject({ state: 'unacknowledged', shelvedUntilMs: null });
  });

  it('raises again after clearing, as a new occurrence of the same alarm', () => {
    const again = apply([
      { type: 'raise', atMs: 0, alarm: drift },
      { type: 'clear', atMs: 10 },
      { type: 'raise', atMs: 20, alarm: drift },
    ]);
    expect(again).toMatchObject({ state: 'unacknowledged', raisedAtMs: 20 });
    expect(again.history).toHaveLength(3);
  });

  it('returns an error result, not an exception, for a transition that does not apply', () => {
    const raised = apply([{ type: 'raise', atMs: 0, alarm: drift }]);
    const acknowledged = apply([
      { type: 'raise', atMs: 0, alarm: drift },
      { type: 'acknowledge', atMs: 1, by: 'ana' },
    ]);
    const cleared = apply([
      { type: 'raise', atMs: 0, alarm: drift },
      { type: 'clear', atMs: 1 },
    ]);
    expect(reduceAlarm(null, { type: 'acknowledge', atMs: 0, by: 'ana' })).toEqual({ ok: false, error: 'cannot acknowledge: no alarm has been raised' });
    expect(reduceAlarm(raised, { type: 'raise', atMs: 5, alarm: drift })).toEqual({ ok: false, error: 'cannot raise an alarm that is unacknowledged' });
    expect(reduceAlarm(acknowledged, { type: 'acknowledge', atMs: 5, by: 'ana' })).toEqual({
      ok: false,
      error: 'cannot acknowledge an alarm that is acknowledged',
    });
    expect(reduceAlarm(cleared, { type: 'clear', atMs: 5 })).toEqual({ ok: false, error: 'cannot clear an alarm that is cleared' });
    expect(reduceAlarm(cleared, { type: 'shelve', atMs: 5, by: 'ana', untilMs: 10, reason: 'x' }).ok).toBe(false);
    expect(reduceAlarm(raised, { type: 'unshelve-expired', atMs: 5 }).ok).toBe(false);
  });

  it('rejects actions that lack who, why or a sensible time', () => {
    const raised = apply([{ type: 'raise', atMs: 100, alarm: drift }]);
    expect(reduceAlarm(raised, { type: 'acknowledge', atMs: 200, by: ' ' })).toMatchObject({ ok: false, error: expect.stringMatching(/^by:/) });
    expect(reduceAlarm(raised, { type: 'shelve', atMs: 200, by: 'ana', untilMs: 300, reason: '' })).toMatchObject({
      ok: false,
      error: expect.stringMatching(/^reason:/),
    });
    expect(reduceAlarm(raised, { type: 'shelve', atMs: 200, by: 'ana', untilMs: 200, reason: 'x' })).toMatchObject({
      ok: false,
      error: 'untilMs must be after atMs',
    });
    expect(reduceAlarm(raised, { type: 'acknowledge', atMs: 50, by: 'ana' })).toMatchObject({
      ok: false,
      error: expect.stringMatching(/before the alarm's last change/),
    });
    expect(reduceAlarm(null, { type: 'raise', atMs: 0, alarm: loadDriftAlarm({ targetKpa: 100, actualKpa: 100 }) })).toEqual({
      ok: false,
      error: 'an inactive alarm cannot be raised',
    });
  });

  it('keeps one record per alarm and subject', () => {
    const g1 = gaugeTravelAlarm({ gauge: 'G1', readingMm: 24, travelMm: 25, sign: 1 });
    const g2 = gaugeTravelAlarm({ gauge: 'G2', readingMm: 24, travelMm: 25, sign: 1 });
    expect(alarmKey(g1)).toBe('gauge-travel:G1');
    const cleared = apply([
      { type: 'raise', atMs: 0, alarm: g1 },
      { type: 'clear', atMs: 1 },
    ]);
    expect(reduceAlarm(cleared, { type: 'raise', atMs: 2, alarm: g2 })).toEqual({
      ok: false,
      error: 'this record is for gauge-travel:G1, not gauge-travel:G2',
    });
  });

  it('property: never throws, and each accepted action adds one history entry leading to its state', () => {
    const action = fc.oneof(
      fc.record({ type: fc.constant('raise' as const), atMs: fc.integer({ min: 0, max: 1e6 }), alarm: fc.constant(drift) }),
      fc.record({ type: fc.constant('acknowledge' as const), atMs: fc.integer({ min: 0, max: 1e6 }), by: fc.string() }),
      fc.record({
        type: fc.constant('shelve' as const),
        atMs: fc.integer({ min: 0, max: 1e6 }),
        by: fc.string(),
        untilMs: fc.integer({ min: 0, max: 2e6 }),
        reason: fc.string(),
      }),
      fc.record({ type: fc.constant('unshelve-expired' as const), atMs: fc.integer({ min: 0, max: 2e6 }) }),
      fc.record({ type: fc.constant('clear' as const), atMs: fc.integer({ min: 0, max: 1e6 }) }),
    );
    fc.assert(
      fc.property(fc.array(action, { maxLength: 30 }), (actions) => {
        let record: AlarmRecord | null = null;
        for (const a of actions) {
          const result = reduceAlarm(record, a);
          if (!result.ok) continue;
          const added = result.record.history.length - (record?.history.length ?? 0);
          if (added !== 1 || result.record.history.at(-1)!.to !== result.record.state) return false;
          record = result.record;
        }
        return true;
      }),
    );
  });
});
