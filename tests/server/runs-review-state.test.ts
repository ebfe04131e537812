/**
 * The list of runs says where each run's report stands — interpreted or not, draft, in review or
 * signed — so Home can show the engineer's queues and staff Reports can list drafts and reports in review.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../server/seed/demo';
import { type Client, signedIn, startTestApp, type TestApp } from '../support/api';

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
