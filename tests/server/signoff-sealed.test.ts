/**
 * A signed revision is a sealed snapshot: after signing, the rig, a calibration, the site plan change (they
 * are shared with other work, so they are allowed), the project's code, address and organisation are
 * refused, and a second signature is refused. The signed PDF stays byte-identical, verify finds the
 * snapshot intact, and reports today's drift apart.
 */
import { createHash } from 'node:crypto';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Instrument } from '../../server/models/instrument';
import { Run } from '../../server/models/run';
import { SignedReport } from '../../server/models/signoff';
import { DEMO_PASSWORD } from '../../server/seed/demo';
import { type Client, signedIn, startTestApp, type TestApp } from '../support/api';
import { binaryBody } from '../support/pdf';
import { recordedRun } from '../support/stored-run';

let t: TestApp;
let engineer: Client;
let admin: Client;
let runId: number;
const sha256 = (b: Buffer | string) => createHash('sha256').update(b).digest('hex');

beforeAll(async () => {
  t = await startTestApp({ loginAttempts: 10_000 });
  [engineer, admin] = await Promise.all([signedIn(t.app, 'engineer'), signedIn(t.app, 'admin')]);
  runId = await recordedRun(t.sequelize, engineer, 'Run sealed at signing');
}, 120_000);
afterAll(() => t?.stop());

const pdf = async () => {
  const res = await binaryBody(admin.get(`/api/runs/${runId}/report.pdf`));
  expect(res.status).toBe(200);
  return res.body as Buffer;
};

describe('sealed snapshot of a signed revision', () => {
  it('refuses corrections and interpretation changes while the run is in review', async () => {
    expect((await engineer.post(`/api/runs/${runId}/interpretations`, { chosenMethod: 'hyperbolic', reason: 'Fits the curve.' })).status).toBe(201);
    expect((await engineer.post(`/api/runs/${runId}/signoff/submit`)).status).toBe(200);
    const correction = await engineer.post(`/api/runs/${runId}/corrections`, { seq: 4, action: 'mark-faulty', reason: 'gauge knocked' });
    expect(correction.status).toBe(409);
    expect(correction.body.error.code).toBe('run_in_review');
  });

  it('keeps the signed PDF byte-identical and the snapshot intact through later changes, and refuses a second signature', async () => {
    const signed = await admin.post(`/api/runs/${runId}/signoff/sign`, { password: DEMO_PASSWORD, meaning: 'approved' });
    expect(signed.status).toBe(200);
    const sealed = (await SignedReport.findOne({ where: { runId } }))!;
    const before = await pdf();
    expect(sha256(before)).toBe(sealed.pdfHash);
    const snapshot = JSON.parse(sealed.snapshot);
    expect(snapshot.instruments.map((i: { calibrationId: number | null }) => i.calibrationId)).toContainEqual(expect.any(Number));
    expect((await admin.get(`/api/runs/${runId}/verify`)).body.live).toMatchObject({ matches: true, changed: [] });

    // The rig (renamed, a gauge turned round) and a new calibration of the pressure transducer: shared, so allowed.
    const rigId = (await Run.findByPk(runId))!.rigId;
    const rig = (await admin.get(`/api/rigs/${rigId}`)).body;
    rig.channels[0].gauge.direction = -1;
    expect((await admin.patch(`/api/rigs/${rigId}`, { ...rig, name: 'Renamed rig' })).status).toBe(200);
    const transducer = (await admin.get(`/api/instruments/${await Instrument.findOne({ where: { serialNumber: 'PT-5520' } }).then((i) => i!.id)}`)).body;
    const recal = await admin.post(`/api/instruments/${transducer.id}/calibrations`, { calibratedOn: '2099-01-02', dueOn: '2100-01-02', method: transducer.current.method });
    expect(recal.status).toBe(201);
    // A new site plan for the location: allowed, the sealed report keeps the one it printed.
    const png = await sharp({ create: { width: 200, height: 120, channels: 3, background: { r: 200, g: 30, b: 30 } } }).png().toBuffer();
    expect((await admin.agent.post('/api/locations/1/site-plan').set('x-csrf-token', admin.token).attach('file', png, 'plan.png')).status).toBe(200);
    // What the report prints of the project, and who may read it: refused with the reason.
    const projectId = (await admin.get('/api/locations/1')).body.projectId;
    for (const change of [{ code: 'CHANGED-1' }, { address: '9 Elsewhere Road' }, { organizationId: 2 }]) {
      const res = await admin.patch(`/api/projects/${projectId}`, change);
      expect(res.status).toBe(409);
      expect(res.body.error).toMatchObject({ code: 'run_signed', message: expect.stringMatching(/signed and locked/) });
    }

    const again = await engineer.post(`/api/runs/${runId}/signoff/sign`, { password: DEMO_PASSWORD, meaning: 'reviewed' });
    expect(again.status).toBe(409);

    const after = await pdf();
    expect(after.equals(before)).toBe(true);
    const verified = (await admin.get(`/api/runs/${runId}/verify`)).body;
    expect(verified).toMatchObject({ matches: true, recordedHash: sealed.snapshotHash, currentHash: sealed.snapshotHash });
    expect(verified.signatures).toEqual([expect.objectContaining({ matches: true, pdfMatches: true })]);
    expect(verified.live.matches).toBe(false);
    expect(verified.live.changed).toEqual(expect.arrayContaining(['instruments', 'rigName', 'sitePlan']));
    expect(verified.live.message).toMatch(/^Changed since signing.*open a revision/);
    expect((await admin.get(`/api/runs/${runId}/signoff`)).body.signatures).toHaveLength(1);
  });
});
