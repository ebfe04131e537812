/**
 * Review and sign-off (QUALITY.md S7): re-authentication at signing, the SHA-256 of the canonical run data
 * recorded and verified, the lock on a signed run, a reopened revision with its reason, and the audit trail.
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEntry } from '../../server/models/audit-entry';
import { Interpretation } from '../../server/models/interpretation';
import { Run } from '../../server/models/run';
import { TestLocation } from '../../server/models/test-location';
import { TestPlan } from '../../server/models/test-plan';
import { canonicalJson } from '../../server/services/canonical-json';
import { DEMO_PASSWORD } from '../../server/seed/demo';
import { type Client, signedIn, startTestApp, type TestApp } from '../support/api';

const sandJson = readFileSync(path.join(import.meta.dirname, '../fixtures/records/sand-bearing-450-square.json'), 'utf8');

let t: TestApp;
let engineer: Client;
let admin: Client;
let operator: Client;
let runId: number;

beforeAll(async () => {
  t = await startTestApp({ loginAttempts: 10_000 });
  engineer = await signedIn(t.app, 'engineer');
  admin = await signedIn(t.app, 'admin');
  operator = await signedIn(t.app, 'operator');
  const res = await engineer.post('/api/imports', { locationId: 1, format: 'json', content: sandJson });
  expect(res.status).toBe(201);
  runId = res.body.runId;
}, 120_000);
afterAll(() => t?.stop());

describe('canonical JSON', () => {
  it('sorts keys at every depth and drops undefined, so equal data hash equally', () => {
    expect(canonicalJson({ b: 1, a: { d: [1, { z: 2, y: undefined, x: 'é' }], c: null } })).toBe('{"a":{"c":null,"d":[1,{"x":"é","z":2}]},"b":1}');
    expect(canonicalJson({ a: 1, b: 2 })).toBe(canonicalJson({ b: 2, a: 1 }));
  });
  it('hashes as SHA-256 (FIPS 180-4 test vector for "abc")', () => {
    // FIPS 180-4 / NIST example: SHA-256("abc") = ba7816bf…f20015ad.
    expect(createHash('sha256').update('abc').digest('hex')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  });
});

describe('sign-off of a run', () => {
  it('starts as a draft of revision 1 and refuses to sign before review', async () => {
    const view = await operator.get(`/api/runs/${runId}/signoff`);
    expect(view.status).toBe(200);
    expect(view.body).toMatchObject({ state: 'draft', revision: 1, signatures: [] });
    const early = await engineer.post(`/api/runs/${runId}/signoff/sign`, { password: DEMO_PASSWORD, meaning: 'approved' });
    expect(early.status).toBe(409);
    const nothing = await engineer.post(`/api/runs/${runId}/signoff/submit`);
    expect(nothing.status).toBe(409);
    expect(nothing.body.error.message).toMatch(/interpretation/);
  });

  it('submits the newest interpretation version, refuses a wrong password, and signs with a hash of the data', async () => {
    const saved = await engineer.post(`/api/runs/${runId}/interpretations`, { chosenMethod: 'hyperbolic', reason: 'Smooth curve; hyperbola fits.' });
    expect(saved.status).toBe(201);
    const submitted = await engineer.post(`/api/runs/${runId}/signoff/submit`);
    expect(submitted.status).toBe(200);
    expect(submitted.body).toMatchObject({ state: 'in-review', interpretationVersion: 1, submittedBy: { name: expect.stringContaining('Ilse') } });

    const wrong = await engineer.post(`/api/runs/${runId}/signoff/sign`, { password: 'not-my-password', meaning: 'approved' });
    expect(wrong.status).toBe(403);
    expect(wrong.body.error).toMatchObject({ code: 'reauthentication_failed', field: 'password' });
    const noMeaning = await engineer.post(`/api/runs/${runId}/signoff/sign`, { password: DEMO_PASSWORD });
    expect(noMeaning.status).toBe(400);
    expect(noMeaning.body.error.field).toBe('meaning');
    expect((await operator.post(`/api/runs/${runId}/signoff/sign`, { password: DEMO_PASSWORD, meaning: 'approved' })).status).toBe(403);

    const signed = await engineer.post(`/api/runs/${runId}/signoff/sign`, { password: DEMO_PASSWORD, meaning: 'reviewed' });
    expect(signed.status).toBe(200);
    expect(signed.body.state).toBe('signed');
    const [sig] = signed.body.signatures;
    expect(sig).toMatchObject({ revision: 1, interpretationVersion: 1, meaning: 'reviewed', signerName: expect.stringContaining('Ilse') });
    expect(Math.abs(Date.parse(sig.signedAt) - Date.now())).toBeLessThan(60_000);
    expect(sig.signedAt).toMatch(/Z$/);

    // The hash recomputed independently here: record as exported + interpretation version as saved.
    const record = (await engineer.get(`/api/runs/${runId}/record`)).body;
    const v1 = (await Interpretation.findOne({ where: { runId, version: 1 } }))!;
    const content = { record, interpretation: { version: 1, options: v1.options, result: v1.result, chosenMethod: v1.chosenMethod, reason: v1.reason } };
    expect(sig.dataHash).toBe(createHash('sha256').update(canonicalJson(content)).digest('hex'));

    const verified = await operator.get(`/api/runs/${runId}/verify`);
    expect(verified.status).toBe(200);
    expect(verified.body).toMatchObject({ matches: true, recordedHash: sig.dataHash, currentHash: sig.dataHash, revision: 1 });
  });

  it('locks the signed run: a new interpretation version is refused with 409', async () => {
    const res = await engineer.post(`/api/runs/${runId}/interpretations`, { chosenMethod: 'logLogIntersection', reason: 'try another' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('run_signed');
    expect(await Interpretation.count({ where: { runId } })).toBe(1);
  });

  it('takes a countersignature on the same revision, and detects data changed behind its back', async () => {
    const approved = await admin.post(`/api/runs/${runId}/signoff/sign`, { password: DEMO_PASSWORD, meaning: 'approved' });
    expect(approved.status).toBe(200);
    expect(approved.body.signatures.map((s: { meaning: string }) => s.meaning)).toEqual(['reviewed', 'approved']);
    expect(approved.body.signatures[1].dataHash).toBe(approved.body.signatures[0].dataHash);

    const v1 = (await Interpretation.findOne({ where: { runId, version: 1 } }))!;
    const honest = v1.reason;
    await Interpretation.update({ reason: 'altered directly in the database' }, { where: { id: v1.id } });
    const tampered = await engineer.get(`/api/runs/${runId}/verify`);
    expect(tampered.body.matches).toBe(false);
    await Interpretation.update({ reason: honest }, { where: { id: v1.id } });
    expect((await engineer.get(`/api/runs/${runId}/verify`)).body.matches).toBe(true);
  });

  it('reopens as revision 2 with a reason, keeping the earlier signatures, and accepts changes again', async () => {
    const noReason = await engineer.post(`/api/runs/${runId}/signoff/reopen`, { reason: ' ' });
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.field).toBe('reason');
    const reopened = await engineer.post(`/api/runs/${runId}/signoff/reopen`, { reason: 'Client sent the corrected footing width.' });
    expect(reopened.status).toBe(200);
    expect(reopened.body).toMatchObject({ state: 'draft', revision: 2, revisions: [{ revision: 2, reason: 'Client sent the corrected footing width.' }] });
    expect(reopened.body.signatures).toHaveLength(2);
    expect((await engineer.post(`/api/runs/${runId}/signoff/reopen`, { reason: 'again' })).status).toBe(409);

    const v2 = await engineer.post(`/api/runs/${runId}/interpretations`, {
      chosenMethod: 'hyperbolic',
      options: { footingWidthM: 2 },
      reason: 'Corrected footing width.',
    });
    expect(v2.status).toBe(201);
    expect(v2.body.version).toBe(2);
    await engineer.post(`/api/runs/${runId}/signoff/submit`);
    const signed = await engineer.post(`/api/runs/${runId}/signoff/sign`, { password: DEMO_PASSWORD, meaning: 'approved' });
    expect(signed.body.signatures.at(-1)).toMatchObject({ revision: 2, interpretationVersion: 2 });
    expect(signed.body.signatures.at(-1).dataHash).not.toBe(signed.body.signatures[0].dataHash);
  });

  it('refuses changes to the plan, test location and project name a signed run is built from', async () => {
    const run = (await Run.findByPk(runId))!;
    const plan = (await TestPlan.findByPk(run.planId))!;
    const location = (await TestLocation.findByPk(plan.locationId))!;
    const planEdit = await engineer.patch(`/api/plans/${plan.id}`, { ...plan.toInput(), name: 'Renamed after signing' });
    expect(planEdit.status).toBe(409);
    expect(planEdit.body.error.code).toBe('run_signed');
    expect((await engineer.delete(`/api/plans/${plan.id}`)).status).toBe(409);
    expect((await engineer.patch(`/api/locations/${location.id}`, { testDepthM: 2.5 })).status).toBe(409);
    expect((await engineer.patch(`/api/projects/${location.projectId}`, { name: 'Renamed project' })).status).toBe(409);
    // Fields no record carries stay editable.
    expect((await engineer.patch(`/api/projects/${location.projectId}`, { notes: 'Invoice sent.' })).status).toBe(200);
    expect((await engineer.get(`/api/runs/${runId}/verify`)).body.matches).toBe(true);
  });

  it('audits every step, the refused password included', async () => {
    const entries = await AuditEntry.findAll({ where: { entity: 'signoff', entityId: String(runId) }, order: [['id', 'ASC']] });
    expect(entries.map((e) => e.action)).toEqual(['submitted', 'sign-refused', 'signed', 'signed', 'reopened', 'submitted', 'signed']);
    expect(entries.find((e) => e.action === 'reopened')!.reason).toBe('Client sent the corrected footing width.');
    expect(JSON.stringify(entries.find((e) => e.action === 'signed')!.changes)).toContain('dataHash');
  });
});
