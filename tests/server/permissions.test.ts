/**
 * target S1: every registered route × every role and signed-out, generated from the route
 * table itself, so a new route cannot skip the matrix.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { allows } from '../../server/auth/permissions';
import { ROLES, type Role } from '../../shared/schemas/users';
import { Client, type TestApp, demoEmail, startTestApp } from '../support/api';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp({ loginAttempts: 10_000 });
});
afterAll(() => t.stop());

const UNKNOWN_ID = '999999';
const concrete = (path: string) => path.replace(/:[A-Za-z]+/g, UNKNOWN_ID);

async function call(client: Client, method: string, path: string) {
  const url = concrete(path);
  // An empty body: allowed callers fail validation (400) or find nothing (404), so nothing changes.
  if (method === 'get') return client.get(url);
  if (method === 'delete') return client.delete(url);
  return client.agent[method as 'post' | 'patch' | 'put'](url).set('x-csrf-token', client.token).send({});
}

describe('permission matrix', () => {
  it('has routes to check', () => {
    expect(t.routes.length).toBeGreaterThan(10);
  });

  it.each([...ROLES, null] as (Role | null)[])('role %s gets exactly what the route table allows', async (role) => {
    const rows: string[] = [];
    const client = role ? await new Client(t.app).signIn(demoEmail(role)) : await new Client(t.app).csrf();
    for (const spec of t.routes) {
      if (spec.path === '/api/auth/logout' || spec.path === '/api/auth/login') continue; // covered in session.test.ts
      const res = await call(client, spec.method, spec.path);
      const allowed = allows(spec.access, role);
      const expected = allowed ? 'allowed' : role ? 403 : 401;
      const got = res.status === 401 || res.status === 403 ? res.status : 'allowed';
      if (got !== expected) rows.push(`${spec.method.toUpperCase()} ${spec.path} as ${role ?? 'signed-out'}: expected ${expected}, got ${res.status} ${JSON.stringify(res.body)}`);
    }
    expect(rows).toEqual([]);
  });
});
