/**
 * QUALITY S2: a client user (Harrowgate Freight Ltd in the demo data) calls every GET route of the
 * route table with ids of other organisations' projects, locations, plans and runs: only 403 or 404,
 * and no answer of any GET route carries another organisation's records.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type Client, type TestApp, signedIn, startTestApp } from '../support/api';

let t: TestApp;
let client: Client;
beforeAll(async () => {
  t = await startTestApp({ loginAttempts: 10_000 });
  client = await signedIn(t.app, 'client');
}, 120_000);
afterAll(() => t?.stop());

const select = <T>(sql: string, replacements: unknown[] = []) => t.sequelize.query(sql, { type: QueryTypes.SELECT, replacements }) as Promise<T[]>;

interface Ids {
  projects: number[];
  locations: number[];
  plans: number[];
  runs: number[];
}

/** Ids of the records of organisations in (own) or outside (!own) the client's organisation. */
async function idsOf(orgId: number, own: boolean): Promise<Ids> {
  const op = own ? '=' : '<>';
  const projects = (await select<{ id: number }>(`SELECT id FROM projects WHERE organization_id ${op} ?`, [orgId])).map((r) => r.id);
  const inList = (xs: number[]) => (xs.length ? xs.join(',') : '-1');
  const locations = (await select<{ id: number }>(`SELECT id FROM test_locations WHERE project_id IN (${inList(projects)})`)).map((r) => r.id);
  const plans = (await select<{ id: number }>(`SELECT id FROM test_plans WHERE location_id IN (${inList(locations)})`)).map((r) => r.id);
  const runs = (await select<{ id: number }>(`SELECT id FROM runs WHERE plan_id IN (${inList(plans)})`)).map((r) => r.id);
  return { projects, locations, plans, runs };
}

/** Which kind of id a route's `:id` stands for, from the path segment before it. */
function idsFor(routePath: string, ids: Ids): number[] {
  const kind = /^\/api\/(\w+)\/:/.exec(routePath)?.[1];
  if (kind === 'projects' || kind === 'locations' || kind === 'plans' || kind === 'runs') return ids[kind];
  return [...ids.projects, ...ids.locations, ...ids.plans, ...ids.runs];
}

describe('client scoping (S2)', () => {
  it('gives a client 403/404 for other organisations’ records and never their data', async () => {
    const me = (await client.get('/api/auth/me')).body.user as { organizationId: number; role: string };
    expect(me.role).toBe('client');
    // A completed run in another organisation's location, so run routes have a foreign id to try.
    const admin = await signedIn(t.app, 'admin');
    const foreign = await idsOf(me.organizationId, false);
    expect(foreign.projects.length).toBeGreaterThan(0);
    const csv = readFileSync(path.join(import.meta.dirname, '../fixtures/records/sand-bearing-450-square.csv'), 'utf8');
    const imported = await admin.post('/api/imports', { locationId: foreign.locations[0], format: 'csv', content: csv, planName: 'Foreign import plan' });
    expect(imported.status).toBe(201);
    const ids = await idsOf(me.organizationId, false);
    expect(ids.runs.length).toBeGreaterThan(0);

    // Strings that only the other organisations' records carry.
    const mine = await idsOf(me.organizationId, true);
    const texts = async (sql: string, list: number[]) => (list.length ? (await select<{ v: string }>(sql.replace('?', list.join(',')))).map((r) => r.v) : []);
    const ownTexts = new Set([
      ...(await texts('SELECT code AS v FROM projects WHERE id IN (?)', mine.projects)),
      ...(await texts('SELECT name AS v FROM projects WHERE id IN (?)', mine.projects)),
      ...(await texts('SELECT pit_id AS v FROM test_locations WHERE id IN (?)', mine.locations)),
      ...(await texts('SELECT name AS v FROM test_plans WHERE id IN (?)', mine.plans)),
    ]);
    const secrets = [
      ...(await texts('SELECT code AS v FROM projects WHERE id IN (?)', ids.projects)),
      ...(await texts('SELECT name AS v FROM projects WHERE id IN (?)', ids.projects)),
      ...(await texts('SELECT pit_id AS v FROM test_locations WHERE id IN (?)', ids.locations)),
      ...(await texts('SELECT name AS v FROM test_plans WHERE id IN (?)', ids.plans)),
      ...(await select<{ v: string }>('SELECT name AS v FROM organizations WHERE id <> ?', [me.organizationId])).map((r) => r.v),
    ].filter((s) => s.length >= 4 && !ownTexts.has(s));
    expect(secrets.length).toBeGreaterThan(3);

    const problems: string[] = [];
    const leaks = (body: string) => secrets.filter((s) => body.includes(s));
    let ownReadable = 0;
    for (const spec of t.routes.filter((r) => r.method === 'get')) {
      const params = spec.path.match(/:[A-Za-z]+/g) ?? [];
      if (params.length === 0) {
        const res = await client.get(spec.path);
        const found = leaks(res.text);
        if (found.length) problems.push(`GET ${spec.path} → ${res.status} shows ${found.join(', ')}`);
        continue;
      }
      for (const id of idsFor(spec.path, ids)) {
        const url = spec.path.replace(/:[A-Za-z]+/g, String(id));
        const res = await client.get(url);
        if (res.status !== 403 && res.status !== 404) problems.push(`GET ${url} → ${res.status}`);
        const found = leaks(res.text);
        if (found.length) problems.push(`GET ${url} shows ${found.join(', ')}`);
      }
      // The same route with the client's own ids: the check above is not vacuous.
      for (const id of idsFor(spec.path, mine)) if ((await client.get(spec.path.replace(/:[A-Za-z]+/g, String(id)))).status === 200) ownReadable += 1;
    }
    expect(problems).toEqual([]);
    expect(ownReadable).toBeGreaterThan(0);
  });
});
