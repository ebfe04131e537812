/**
 * The list of runs says where each run's report stands — interpreted or not, draft, in review or
 * signed — so Home can show the engineer's queues and staff Reports can list drafts and reports in review;
 * the plans no run has used yet are an operator's next runs.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../server/seed/demo';
import { type Client, signedIn, startTestApp, type TestApp } from '../support/api';
import { simPlan } from '../support/sim-run';

const sandJson = readFileSync(path.join(import.meta.dirname, '../fixtures/records/sand-bearing-450-square.json'), 'utf8');

let t: TestApp;
let engineer: Client;
let admin: Client;
beforeAll(async () => {
  t = await startTestApp({ loginAttempts: 10_000 });
  engineer = await signedIn(t.app, 'engineer');
  admin = await signedIn(t.app, 'admin');
}, 120_000);
afterAll(() => t?.stop());

const review = async (runId: number) => ((await engineer.get('/api/runs')).body.items as { id: number; review: unknown }[]).find((r) => r.id === runId)?.review;

describe('where a run’s report stands, in the list of runs', () => {
  it('moves from an uninterpreted draft through interpretation and review to signed', async () => {
    const imported = await engineer.post('/api/imports', { locationId: 1, format: 'json', content: sandJson });
    expect(imported.status).toBe(201);
    const runId = imported.body.runId as number;
    expect(await review(runId)).toEqual({ state: 'draft', interpreted: false });

    expect((await engineer.post(`/api/runs/${runId}/interpretations`, { chosenMethod: 'hyperbolic', reason: 'Smooth curve.' })).status).toBe(201);
    expect(await review(runId)).toEqual({ state: 'draft', interpreted: true });

    expect((await engineer.post(`/api/runs/${runId}/signoff/submit`)).status).toBe(200);
    expect(await review(runId)).toEqual({ state: 'in-review', interpreted: true });

    expect((await admin.post(`/api/runs/${runId}/signoff/sign`, { password: DEMO_PASSWORD, meaning: 'approved' })).status).toBe(200);
    expect(await review(runId)).toEqual({ state: 'signed', interpreted: true });
  });
});

describe('plans waiting for their run', () => {
  it('lists a new plan first, never one a run has used, and only to staff', async () => {
    const planId = await simPlan(engineer, 'bearing-granular', { name: 'Next week, pit 7' });
    const ready = (await engineer.get('/api/plans/ready')).body.items as { id: number; name: string; pitId: string; projectCode: string }[];
    expect(ready[0]).toMatchObject({ id: planId, name: 'Next week, pit 7' });
    expect(ready[0].projectCode).not.toBe('');

    const imported = await engineer.post('/api/imports', { locationId: 1, format: 'json', content: sandJson });
    expect(imported.status).toBe(201);
    const used = (await engineer.get('/api/runs')).body.items.map((r: { planId: number }) => r.planId) as number[];
    const after = ((await engineer.get('/api/plans/ready')).body.items as { id: number }[]).map((p) => p.id);
    expect(after).toContain(planId);
    for (const id of used) expect(after).not.toContain(id);

    const client = await signedIn(t.app, 'client');
    expect((await client.get('/api/plans/ready')).status).toBe(403);
  });
});
