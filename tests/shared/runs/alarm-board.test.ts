import { describe, expect, it } from 'vitest';
import { loadDriftAlarm, signalLostAlarm } from '../../../shared/hold/alarms';
import { reconcileAlarms } from '../../../shared/runs/alarm-board';

const drift = (actual: number) => loadDriftAlarm({ targetKpa: 100, actualKpa: actual });
const lost = (last: number | null, now: number) => signalLostAlarm({ channel: 'g1', lastSampleAtMs: last, nowMs: now });

describe('alarm board', () => {
  it('raises a newly active rule once, keeps its figures fresh, and clears it when the rule goes quiet', () => {
    let { records, changes } = reconcileAlarms({}, [drift(95)], 1000);
    expect(changes.map((c) => `${c.action}:${c.key}`)).toEqual(['raise:load-drift']);
    ({ records, changes } = reconcileAlarms(records, [drift(94)], 2000));
    expect(changes).toEqual([]);
    expect(records['load-drift'].alarm.value).toBeCloseTo(-6, 9);
    ({ records, changes } = reconcileAlarms(records, [drift(99.5)], 3000));
    expect(changes.map((c) => c.action)).toEqual(['clear']);
    expect(records['load-drift'].state).toBe('cleared');
    ({ changes } = reconcileAlarms(records, [drift(90)], 4000));
    expect(changes.map((c) => c.action)).toEqual(['raise']); // a cleared alarm can come back
  });

  it('brings a shelved alarm back when its shelf expires, and clears alarms whose rule disappeared', () => {
    const raised = reconcileAlarms({}, [lost(0, 5000), drift(90)], 5000).records;
    const shelved = { ...raised, 'signal-lost:g1': { ...raised['signal-lost:g1'], state: 'shelved' as const, shelvedUntilMs: 6000 } };
    const { records, changes } = reconcileAlarms(shelved, [lost(0, 7000)], 7000);
    expect(changes.map((c) => `${c.action}:${c.key}`).sort()).toEqual(['clear:load-drift', 'unshelve-expired:signal-lost:g1']);
    expect(records['signal-lost:g1'].state).toBe('unacknowledged');
  });
});
