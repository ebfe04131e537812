/** A hold met while the load-drift alarm stood is said so in the run's record, beside its stage. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { RunEvent } from '../../server/models/run-event';
import { rebuildRunRecord } from '../../server/services/run-record';
import { loadDriftAlarm } from '../../shared/hold/alarms';
import { type Client, signedIn, startTestApp, type TestApp } from '../support/api';
import { RECORDED_RUN_START_MS, recordedRun } from '../support/stored-run';

let t: TestApp;
let engineer: Client;

beforeAll(async () => {
  t = await startTestApp({ loginAttempts: 10_000 });
  engineer = await signedIn(t.app, 'engineer');
});
afterAll(() => t.stop());

describe('met under drift in the record', () => {
  it('keeps the drift in words as an alarm entry of the stage whose hold was met, and nothing for a plain hold met', async () => {
    const runId = await recordedRun(t.sequelize, engineer, 'Drifting hold rig');
    const words = loadDriftAlarm({ targetKpa: 100, actualKpa: 88.04 }).message;
    await RunEvent.bulkCreate([
      { runId, at: new Date(RECORDED_RUN_START_MS + 15_000), kind: 'hold-met', userId: null, payload: { stageIndex: 0 } },
      { runId, at: new Date(RECORDED_RUN_START_MS + 45_000), kind: 'hold-met', userId: null, payload: { stageIndex: 1, underDrift: words } },
    ]);
    const record = await rebuildRunRecord(runId);
    const alarms = (record.events ?? []).filter((e) => e.kind === 'alarm');
    expect(alarms).toEqual([{ stage: 1, tMin: 0.25, kind: 'alarm', text: 'Hold met under drift: Pressure 88.0 kPa is 12.0 kPa below the 100 kPa target: top up the pump.' }]);
  });
});
