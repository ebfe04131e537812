/**
 * Review and sign-off (target S7): re-authentication at signing, a second person signing, one
 * signature per revision, the SHA-256 of the sealed snapshot recorded and verified for every signature,
 * live drift reported apart, the lock on a run in review or signed, a reopened revision with its reason,
 * and the audit trail.
 */
import { createHash } from 'node:crypto';
import canonicalize from 'canonicalize';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEntry } from '../../server/models/audit-entry';
import { Interpretation } from '../../server/models/interpretation';
import { Run } from '../../server/models/run';
import { SignedReport } from '../../server/models/signoff';
import { TestLocation } from '../../server/models/test-location';
import { TestPlan } from '../../server/models/test-plan';
import { canonicalJson } from '../../server/services/canonical-json';
import { loadReportData, sealedContent } from '../../server/services/report-data';
import { loadRunRecord } from '../../server/services/run-record';
import { DEMO_PASSWORD } from '../../server/seed/demo';
import { type Client, signedIn, startTestApp, type TestApp } from '../support/api';
import { earlierCanonicalJson } from './canonical-json-earlier';

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

    // The engineer who submitted may not sign their own submission.
    const own = await engineer.post(`/api/runs/${runId}/signoff/sign`, { password: DEMO_PASSWORD, meaning: 'reviewed' });
    expect(own.status).toBe(403);
    expect(own.body.error.code).toBe('signer_is_submitter');

    const signed = await admin.post(`/api/runs/${runId}/signoff/sign`, { password: DEMO_PASSWORD, meaning: 'reviewed' });
    expect(signed.status).toBe(200);
    expect(signed.body.state).toBe('signed');
    const [sig] = signed.body.signatures;
    expect(sig).toMatchObject({ revision: 1, interpretationVersion: 1, meaning: 'reviewed' });
    expect(Math.abs(Date.parse(sig.signedAt) - Date.now())).toBeLessThan(60_000);
    expect(sig.signedAt).toMatch(/Z$/);

    // The hash is of the sealed snapshot as stored, which holds the record as exported and the interpretation as saved.
    const sealed = (await SignedReport.findByPk(sig.id))!;
    expect(sig.dataHash).toBe(createHash('sha256').update(sealed.snapshot).digest('hex'));
    const snapshot = JSON.parse(sealed.snapshot);
    expect(canonicalJson(snapshot)).toBe(sealed.snapshot);
    // The RFC 8785 package writes byte for byte what signatures before it were hashed over, for today's data as for the sealed text.
    const live = sealedContent(await loadReportData(runId, t.config.dataDir), 1);
    expect(canonicalJson(live)).toBe(earlierCanonicalJson(live));
    expect(earlierCanonicalJson(snapshot)).toBe(sealed.snapshot);
    const record = await loadRunRecord(runId);
    expect(canonicalJson(record)).toBe(earlierCanonicalJson(record));
    expect(snapshot.record).toEqual((await engineer.get(`/api/runs/${runId}/record`)).body);
    const v1 = (await Interpretation.findOne({ where: { runId, version: 1 } }))!;
    expect(snapshot.interpretation).toMatchObject({ version: 1, options: v1.options, chosenMethod: v1.chosenMethod, reason: v1.reason });
    expect(snapshot.analysis).toEqual(v1.result);
    expect(snapshot.project).toMatchObject({ code: expect.any(String), name: expect.any(String) });
    expect(sealed.pdfHash).toBe(createHash('sha256').update(sealed.pdf).digest('hex'));

    const verified = await operator.get(`/api/runs/${runId}/verify`);
    expect(verified.status).toBe(200);
    expect(verified.body).toMatchObject({ matches: true, recordedHash: sig.dataHash, currentHash: sig.dataHash, revision: 1, live: { matches: true, changed: [] } });
    expect(verified.body.signatures).toEqual([expect.objectContaining({ signatureId: sig.id, matches: true, pdfMatches: true })]);
  });

  it('locks the signed run: a new interpretation version is refused with 409', async () => {
    const res = await engineer.post(`/api/runs/${runId}/interpretations`, { chosenMethod: 'logLogIntersection', reason: 'try another' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('run_signed');
    expect(await Interpretation.count({ where: { runId } })).toBe(1);
  });

  it('lets anyone re-compute the signature’s hash from the signed-data export: RFC 8785 canonical form, SHA-256', async () => {
    // The recipe in DEVELOPERS.md ("Checking a signature's hash"), with nothing of the server's own code.
    const res = await engineer.get(`/api/reports/${runId}/signed-data.json`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^application\/json/);
    expect(res.headers['content-disposition']).toContain(`run-${runId}-signed-data-rev1.json`);
    const exported = res.text;
    const recompute = (text: string) => createHash('sha256').update(canonicalize(JSON.parse(text)) as string, 'utf8').digest('hex');
    const [sig] = (await engineer.get(`/api/runs/${runId}/signoff`)).body.signatures;
    expect(recompute(exported)).toBe(sig.dataHash);
    // Re-formatted on the way (indented, keys in another order), it still gives the signed hash…
    const reordered = JSON.stringify(Object.fromEntries(Object.entries(JSON.parse(exported)).reverse()), null, 2);
    expect(reordered).not.toBe(exported);
    expect(recompute(reordered)).toBe(sig.dataHash);
    // …and one changed figure does not.
    expect(recompute(exported.replace(/"revision":1/, '"revision":2'))).not.toBe(sig.dataHash);
  });

  it('has no signed-data export for a run not signed (404)', async () => {
    const res = await engineer.post('/api/imports', { locationId: 1, format: 'json', content: sandJson });
    expect(res.status).toBe(201);
    expect((await engineer.get(`/api/reports/${res.body.runId}/signed-data.json`)).status).toBe(404);
  });

  it('refuses a second signature on a signed revision; reports drift of live data apart from the sealed snapshot', async () => {
    for (const who of [admin, engineer]) {
      const again = await who.post(`/api/runs/${runId}/signoff/sign`, { password: DEMO_PASSWORD, meaning: 'approved' });
      expect(again.status).toBe(409);
      expect(again.body.error.message).toMatch(/already signed/);
    }
    expect((await engineer.get(`/api/runs/${runId}/signoff`)).body.signatures).toHaveLength(1);

    // Live data changed behind the application's back: the signature still matches its snapshot; the drift is reported.
    const v1 = (await Interpretation.findOne({ where: { runId, version: 1 } }))!;
    const honest = v1.reason;
    await Interpretation.update({ reason: 'altered directly in the database' }, { where: { id: v1.id } });
    const drifted = (await engineer.get(`/api/runs/${runId}/verify`)).body;
    expect(drifted).toMatchObject({ matches: true, live: { matches: false, changed: ['interpretation'] } });
    expect(drifted.live.message).toMatch(/open a revision/);
    await Interpretation.update({ reason: honest }, { where: { id: v1.id } });
    expect((await engineer.get(`/api/runs/${runId}/verify`)).body.live.matches).toBe(true);

    // The sealed snapshot itself altered in storage: the signature no longer matches.
    const sealed = (await SignedReport.findOne({ where: { runId } }))!;
    const original = sealed.snapshot;
    await SignedReport.update({ snapshot: original.replace(honest, 'rewritten') }, { where: { signatureId: sealed.signatureId } });
    const tampered = (await engineer.get(`/api/runs/${runId}/verify`)).body;
    expect(tampered.matches).toBe(false);
    expect(tampered.signatures[0]).toMatchObject({ matches: false, recordedHash: sealed.snapshotHash });
    await SignedReport.update({ snapshot: original }, { where: { signatureId: sealed.signatureId } });
    expect((await engineer.get(`/api/runs/${runId}/verify`)).body.matches).toBe(true);
  });

  it('reopens as revision 2 with a reason, keeping the earlier signatures, and accepts changes again', async () => {
    const noReason = await engineer.post(`/api/runs/${runId}/signoff/reopen`, { reason: ' ' });
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.field).toBe('reason');
    const reopened = await engineer.post(`/api/runs/${runId}/signoff/reopen`, { reason: 'Client sent the corrected footing width.' });
    expect(reopened.status).toBe(200);
    expect(reopened.body).toMatchObject({ state: 'draft', revision: 2, revisions: [{ revision: 2, reason: 'Client sent the corrected footing width.' }] });
    expect(reopened.body.signatures).toHaveLength(1);
    expect((await engineer.post(`/api/runs/${runId}/signoff/reopen`, { reason: 'again' })).status).toBe(409);

    const v2 = await engineer.post(`/api/runs/${runId}/interpretations`, {
      chosenMethod: 'hyperbolic',
      options: { footingWidthM: 2 },
      reason: 'Corrected footing width.',
    });
    expect(v2.status).toBe(201);
    expect(v2.body.version).toBe(2);
    await engineer.post(`/api/runs/${runId}/signoff/submit`);
    const signed = await admin.post(`/api/runs/${runId}/signoff/sign`, { password: DEMO_PASSWORD, meaning: 'approved' });
    expect(signed.body.signatures.at(-1)).toMatchObject({ revision: 2, interpretationVersion: 2 });
    expect(signed.body.signatures.at(-1).dataHash).not.toBe(signed.body.signatures[0].dataHash);
    // Verify checks both revisions' signatures.
    const verified = (await engineer.get(`/api/runs/${runId}/verify`)).body;
    expect(verified.signatures.map((c: { revision: number; matches: boolean }) => [c.revision, c.matches])).toEqual([[1, true], [2, true]]);
  });

  it('refuses changes to the plan, test location and the project fields a signed report shows', async () => {
    const run = (await Run.findByPk(runId))!;
    const plan = (await TestPlan.findByPk(run.planId))!;
    const location = (await TestLocation.findByPk(plan.locationId))!;
    const planEdit = await engineer.patch(`/api/plans/${plan.id}`, { ...plan.toInput(), name: 'Renamed after signing' });
    expect(planEdit.status).toBe(409);
    expect(planEdit.body.error.code).toBe('run_signed');
    expect((await engineer.delete(`/api/plans/${plan.id}`)).status).toBe(409);
    expect((await engineer.patch(`/api/locations/${location.id}`, { testDepthM: 2.5 })).status).toBe(409);
    for (const change of [{ name: 'Renamed project' }, { code: 'NEW-1' }, { address: '1 Other Street' }, { organizationId: 2 }]) {
      const res = await engineer.patch(`/api/projects/${location.projectId}`, change);
      expect(res.status).toBe(409);
      expect(res.body.error.message).toMatch(/signed/);
    }
    // Fields no record carries stay editable.
    expect((await engineer.patch(`/api/projects/${location.projectId}`, { notes: 'Invoice sent.' })).status).toBe(200);
    expect((await engineer.get(`/api/runs/${runId}/verify`)).body.matches).toBe(true);
  });

  it('audits every step, the refused password included', async () => {
    const entries = await AuditEntry.findAll({ where: { entity: 'signoff', entityId: String(runId) }, order: [['id', 'ASC']] });
    expect(entries.map((e) => e.action)).toEqual(['submitted', 'sign-refused', 'sign-refused', 'signed', 'reopened', 'submitted', 'signed']);
    expect(entries.find((e) => e.action === 'reopened')!.reason).toBe('Client sent the corrected footing width.');
    expect(JSON.stringify(entries.find((e) => e.action === 'signed')!.changes)).toContain('dataHash');
  });
});

describe('a run in review', () => {
  it('refuses a new interpretation until withdrawn to draft; the submitter may sign only where the server allows it, audited', async () => {
    const res = await engineer.post('/api/imports', { locationId: 1, format: 'json', content: sandJson });
    const id = res.body.runId;
    expect((await engineer.post(`/api/runs/${id}/interpretations`, { chosenMethod: 'hyperbolic', reason: 'first' })).status).toBe(201);
    expect((await engineer.post(`/api/runs/${id}/signoff/submit`)).status).toBe(200);
    const during = await engineer.post(`/api/runs/${id}/interpretations`, { chosenMethod: 'hyperbolic', reason: 'changed while in review' });
    expect(during.status).toBe(409);
    expect(during.body.error.code).toBe('run_in_review');

    const withdrawn = await engineer.post(`/api/runs/${id}/signoff/reopen`, { reason: 'One more look at the curve.' });
    expect(withdrawn.status).toBe(200);
    expect(withdrawn.body).toMatchObject({ state: 'draft', revision: 1, submittedBy: null });
    expect((await engineer.post(`/api/runs/${id}/interpretations`, { chosenMethod: 'hyperbolic', reason: 'second' })).status).toBe(201);
    expect((await engineer.post(`/api/runs/${id}/signoff/submit`)).status).toBe(200);

    t.config.secondSigner = false;
    try {
      const own = await engineer.post(`/api/runs/${id}/signoff/sign`, { password: DEMO_PASSWORD, meaning: 'approved' });
      expect(own.status).toBe(200);
    } finally {
      t.config.secondSigner = true;
    }
    const entry = await AuditEntry.findOne({ where: { entity: 'signoff', entityId: String(id), action: 'signed-own-submission' } });
    expect(entry?.reason).toMatch(/second-signer rule turned off/);
  });
});
