import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PROCEDURE_PROFILES } from '../../shared/procedures/profiles';
import { type Client, type TestApp, signedIn, startTestApp } from '../support/api';

let t: TestApp;
let engineer: Client;

beforeAll(async () => {
  t = await startTestApp();
  engineer = await signedIn(t.app, 'engineer');
});
afterAll(() => t.stop());

const profile = PROCEDURE_PROFILES.find((p) => p.id === 'bearing-granular')!;
const planBody = (over: object = {}) => ({
  name: 'Trial plan',
  procedureId: profile.id,
  ...profile.defaults,
  apparatusWeightKn: 0.6,
  reaction: { kind: 'kentledge', capacityKn: 100, description: '' },
  footing: null,
  ...over,
});

describe('health', () => {
  it('reports app and database', async () => {
    const res = await engineer.get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ app: 'ok', database: 'ok' });
  });
});

describe('projects, locations and plans', () => {
  it('creates, reads, updates and deletes through the API with an audit trail', async () => {
    const orgs = await engineer.get('/api/organizations');
    const organizationId = orgs.body.items[0].id;
    const created = await engineer.post('/api/projects', { code: 'T-100', name: 'Trial works', organizationId, site: 'Nowhere Lane' });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ code: 'T-100', organizationName: orgs.body.items[0].name, address: '' });
    const id = created.body.id;

    const loc = await engineer.post(`/api/projects/${id}/locations`, { pitId: 'P1', testDepthM: 1.2, pitWidthM: 1.5 });
    expect(loc.status).toBe(201);
    expect(loc.body).toMatchObject({ projectId: id, pitId: 'P1', waterTableDepthM: null });

    // 450 mm plate to 900 kPa needs 182 kN + 20 % ≈ 219 kN of reaction; 100 kN is too little and the pit is narrow.
    const plan = await engineer.post(`/api/locations/${loc.body.id}/plans`, planBody());
    expect(plan.status).toBe(201);
    expect(plan.body.plan).toMatchObject({ name: 'Trial plan', procedureId: 'bearing-granular', locationId: loc.body.id });
    const codes = plan.body.checks.map((c: { code: string }) => c.code);
    expect(codes).toContain('reaction_capacity');
    expect(codes).toContain('pit_width');

    const fixed = await engineer.patch(`/api/plans/${plan.body.plan.id}`, planBody({ reaction: { kind: 'kentledge', capacityKn: 300, description: '' } }));
    expect(fixed.status).toBe(200);
    expect(fixed.body.checks.map((c: { code: string }) => c.code)).not.toContain('reaction_capacity');

    const listed = await engineer.get(`/api/locations/${loc.body.id}/plans`);
    expect(listed.body.items).toHaveLength(1);

    const patched = await engineer.patch(`/api/projects/${id}`, { site: 'Somewhere Lane' });
    expect(patched.body.site).toBe('Somewhere Lane');

    const [audit] = (await t.sequelize.query("SELECT changes FROM audit_log WHERE entity = 'project' AND action = 'updated'", { type: 'SELECT' })) as { changes: string }[];
    const changes = typeof audit.changes === 'string' ? JSON.parse(audit.changes) : audit.changes;
    expect(changes.site).toEqual({ from: 'Nowhere Lane', to: 'Somewhere Lane' });

    const admin = await signedIn(t.app, 'admin');
    expect((await admin.delete(`/api/projects/${id}`)).status).toBe(204);
    expect((await engineer.get(`/api/projects/${id}`)).status).toBe(404);
    expect((await engineer.get(`/api/locations/${loc.body.id}`)).status).toBe(404);
  });

  it('names the field of bad input and saves nothing', async () => {
    const before = (await engineer.get('/api/projects')).body.items.length;
    const res = await engineer.post('/api/projects', { code: 'X', name: '', organizationId: 1, site: 'S' });
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: 'invalid_input', field: 'name' });
    expect(res.body.error.message).toMatch(/^name: /);

    const nested = await engineer.post('/api/locations/1/plans', planBody({ holdRule: { kind: 'rate', maxRateMmPerMin: -1, windowMin: 10, minHoldMin: 0 } }));
    expect(nested.status).toBe(400);
    expect(nested.body.error.field).toBe('holdRule.maxRateMmPerMin');

    const badOrg = await engineer.post('/api/projects', { code: 'X2', name: 'N', organizationId: 9999, site: 'S' });
    expect(badOrg.status).toBe(400);
    expect(badOrg.body.error.field).toBe('organizationId');

    const dup = await engineer.post('/api/projects', { code: 'KQ-DC2', name: 'Dup', organizationId: 1, site: 'S' });
    expect(dup.status).toBe(409);
    expect(dup.body.error.field).toBe('code');

    const notJson = await engineer.agent.post('/api/projects').set('x-csrf-token', engineer.token).set('content-type', 'application/json').send('{"code":');
    expect(notJson.status).toBe(400);
    expect((await engineer.get('/api/projects')).body.items.length).toBe(before);
  });
});

describe('client scoping', () => {
  it('shows a client only their own organisation’s projects and no plans', async () => {
    const client = await signedIn(t.app, 'client');
    const mine = await client.get('/api/projects');
    expect(mine.status).toBe(200);
    expect(mine.body.items.length).toBeGreaterThan(0);
    expect(new Set(mine.body.items.map((p: { organizationName: string }) => p.organizationName))).toEqual(new Set(['Harrowgate Freight Ltd']));
    const all = (await engineer.get('/api/projects')).body.items as { id: number; organizationName: string }[];
    const foreign = all.find((p) => p.organizationName !== 'Harrowgate Freight Ltd')!;
    expect((await client.get(`/api/projects/${foreign.id}`)).status).toBe(404);
    expect((await client.get(`/api/projects/${foreign.id}/locations`)).status).toBe(404);
  });
});
