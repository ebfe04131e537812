/**
 * QUALITY R6 by property-based fuzzing: random bodies, path parameters and query strings on every
 * route of the route table (as an admin, the most powerful role), random record imports, and random
 * socket payloads. Whatever arrives: never a 5xx, a JSON error body on every refusal, and nothing
 * half-saved (row counts of the main tables are unchanged by refused requests).
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import fc from 'fast-check';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RunningServer } from '../../server/main';
import { Client, demoEmail } from '../support/api';
import { connectSocket, httpSignIn, startLiveServer } from '../support/live-server';

let server: RunningServer;
let admin: Client;
beforeAll(async () => {
  server = await startLiveServer({ loginAttempts: 10_000 });
  admin = await new Client(server.url).signIn(demoEmail('admin'));
}, 120_000);
afterAll(() => server?.close());

const TABLES = ['organizations', 'users', 'projects', 'test_locations', 'test_plans', 'instruments', 'calibrations', 'rigs', 'runs', 'run_events', 'run_records', 'interpretations', 'audit_log'];

async function rowCounts(): Promise<Record<string, number>> {
  const sql = `SELECT ${TABLES.map((t) => `(SELECT COUNT(*) FROM ${t}) AS ${t}`).join(', ')}`;
  const [row] = (await server.sequelize.query(sql, { type: QueryTypes.SELECT })) as Record<string, number>[];
  return Object.fromEntries(TABLES.map((t) => [t, Number(row[t])]));
}

/** Problems with one response: a 5xx, or a refusal without `{error: {code, message}}`. */
function badAnswer(res: { status: number; body: unknown }): string | null {
  if (res.status >= 500) return `status ${res.status}`;
  if (res.status >= 400) {
    const error = (res.body as { error?: { code?: unknown; message?: unknown } } | null)?.error;
    if (typeof error?.code !== 'string' || typeof error.message !== 'string') return `status ${res.status} without a JSON error body: ${JSON.stringify(res.body)}`;
  }
  return null;
}

// ------------------------------------------------------------------ generators

const FIELD_NAMES = ['name', 'code', 'email', 'password', 'currentPassword', 'newPassword', 'role', 'organizationId', 'projectId', 'planId', 'rigId', 'locationId', 'version', 'command', 'type', 'format', 'content', 'channels', 'plate', 'loading', 'holdRule', 'serial', 'kind', 'active'];
const POLLUTING = ['__proto__', 'constructor', 'prototype'];
/** Keys that break careless `String(x)` / `x.toString()` on a parsed body. */
const SHADOWING = ['toString', 'valueOf', 'hasOwnProperty', 'toJSON'];

/** Values of every JSON type, including the awkward ones. */
const anyValue = fc.oneof(
  fc.anything({ maxDepth: 3 }),
  fc.constantFrom(null, true, false, 0, -1, 1e308, -0, '', ' ', '0', 'null', '[]', '{}', '\u0000', '<script>', "' OR 1=1 --"),
  fc.string({ unit: 'grapheme', maxLength: 300 }),
  fc.array(fc.array(fc.integer(), { maxLength: 4 }), { maxLength: 4 }),
);

/** A JSON text sent as the body, raw, so keys like "__proto__" stay own keys on the wire; `fields` are the route's own. */
const rawBody = (fields: string[]) => {
  const field = fc.constantFrom(...fields);
  return fc.oneof(
    fc.dictionary(fc.oneof(field, fc.constantFrom(...POLLUTING)), anyValue, { maxKeys: 6 }).map((o) => JSON.stringify(o)),
    fc.dictionary(field, fc.dictionary(fc.constantFrom(...SHADOWING), anyValue, { minKeys: 1, maxKeys: 2 }), { minKeys: 1, maxKeys: 3 }).map((o) => JSON.stringify(o)),
    fc.object({ maxDepth: 3 }).map((o) => JSON.stringify(o)),
    anyValue.map((v) => JSON.stringify(v) ?? 'null'),
    fc.constantFrom(...POLLUTING).chain((k) => anyValue.map((v) => `{"${k}":{"role":"admin","isAdmin":true,"polluted":${JSON.stringify(v) ?? 1}}}`)),
    fc.constant(`{"constructor":{"prototype":{"polluted":true}},"name":"x"}`),
    fc.integer({ min: 1, max: 4000 }).map((n) => `${'['.repeat(n)}${']'.repeat(n)}`),
    field.map((k) => JSON.stringify({ [k]: 'x'.repeat(1_000_000) })),
    fc.string({ maxLength: 200 }), // mostly not JSON at all
  );
};

/** The top-level field names of a route's body schema (a zod object), or common ones. */
function bodyFields(schema: unknown): string[] {
  const shape = (schema as { shape?: Record<string, unknown> } | undefined)?.shape;
  return shape && Object.keys(shape).length > 0 ? Object.keys(shape) : FIELD_NAMES;
}

const JUNK_IDS = ['0', '-1', '999999', 'abc', '1.5', '1e3', '0x10', 'NaN', 'Infinity', '99999999999999999999', '%00', '..', '1;DROP TABLE runs', ' 1'];
/** Real ids reach the handlers; they are left out where an accepted call would delete records or lock the admin out. */
const pathParam = (allowRealIds: boolean) =>
  fc.oneof(fc.constantFrom(...JUNK_IDS, ...(allowRealIds ? ['1', '2', '3'] : [])), fc.string({ maxLength: 40 }).map(encodeURIComponent));

const queryString = fc.oneof(
  fc.constant(''),
  fc.dictionary(fc.oneof(fc.constantFrom('afterSeq', 'limit', 'fromMs', 'toMs', 'buckets', 'q', '__proto__', 'constructor'), fc.string({ maxLength: 10 })), fc.oneof(fc.string({ maxLength: 30 }), fc.integer().map(String)), { maxKeys: 4 }).map((q) =>
    Object.entries(q)
      .map(([k, v]) => `${encodeURIComponent(k)}=${encodeURIComponent(v)}`)
      .join('&'),
  ),
  fc.constantFrom('limit=1&limit=2', 'afterSeq[]=1', 'a[__proto__][polluted]=1', 'buckets=1e9', 'fromMs=9&toMs=1', 'afterSeq=-5'),
);

const concrete = (routePath: string, param: string) => routePath.replace(/:[A-Za-z]+/g, param);

// ------------------------------------------------------------------ routes

describe('every route against random input (R6)', () => {
  it('never answers 5xx, always explains a refusal, and never half-saves', async () => {
    const problems: string[] = [];
    const savedByAcceptedCalls: string[] = [];
    const routes = server.routes.filter((r) => r.path !== '/api/auth/logout'); // signing out would end the fuzzing session
    expect(routes.length).toBeGreaterThan(30);
    for (const spec of routes) {
      const before = await rowCounts();
      let accepted = 0;
      const outcome = await fc.check(
        fc.asyncProperty(pathParam(spec.method !== 'delete' && !spec.path.startsWith('/api/users')), queryString, rawBody(bodyFields(spec.body)), async (param, query, body) => {
          const url = `${concrete(spec.path, param)}${query ? `?${query}` : ''}`;
          const req = admin.agent[spec.method](url).set('x-csrf-token', admin.token);
          const res = spec.method === 'get' ? await req : await req.set('content-type', 'application/json').send(body);
          if (res.status < 300 && spec.method !== 'get') accepted += 1;
          const bad = badAnswer(res);
          if (bad) throw new Error(bad);
        }),
        { numRuns: 20, endOnFailure: true },
      );
      if (outcome.failed) problems.push(`${spec.method.toUpperCase()} ${spec.path}: ${outcome.errorInstance} with ${fc.stringify(outcome.counterexample)}`);
      const after = await rowCounts();
      // A request the server accepted may legitimately have saved something; refused ones must not.
      if (accepted === 0 && JSON.stringify(after) !== JSON.stringify(before)) problems.push(`${spec.method.toUpperCase()} ${spec.path}: rows changed by refused requests ${JSON.stringify({ before, after })}`);
      if (accepted > 0) savedByAcceptedCalls.push(`${spec.method} ${spec.path}`);
    }
    expect(problems).toEqual([]);
    // Nothing reached Object.prototype through "__proto__" / "constructor" keys.
    expect(Object.keys(Object.prototype)).toEqual([]);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
    // The fuzzing session is still the admin's.
    expect((await admin.get('/api/auth/me')).body.user.role).toBe('admin');
  }, 120_000);

  it('refuses an e-mail that is an object shadowing toString at sign-in with 400, not a crash in the rate limiter', async () => {
    // Found by the fuzzing above: the per-account limiter once called String() on the raw e-mail.
    const res = await admin.agent.post('/api/auth/login').set('x-csrf-token', admin.token).set('content-type', 'application/json').send('{"email":{"toString":1},"password":"x"}');
    expect([res.status, res.body.error?.field]).toEqual([400, 'email']);
  });

  it('answers a body over the JSON limit with 413 and a JSON error', async () => {
    const res = await admin.agent.post('/api/organizations').set('x-csrf-token', admin.token).set('content-type', 'application/json').send(JSON.stringify({ name: 'x'.repeat(3 * 1024 * 1024) }));
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('too_large');
  });
});

// ------------------------------------------------------------------ imports

const FIXTURES = path.join(import.meta.dirname, '../fixtures/records');
const fixtureCsv = readFileSync(path.join(FIXTURES, 'sand-bearing-450-square.csv'), 'utf8');
const fixtureJson = JSON.parse(readFileSync(path.join(FIXTURES, 'modulus-two-cycle-300.json'), 'utf8')) as Record<string, unknown>;

/** The fixture CSV with some lines dropped, duplicated or with one cell replaced by junk. */
const mangledCsv = fc
  .array(fc.tuple(fc.nat(), fc.constantFrom('drop', 'dup', 'cell', 'swap'), fc.nat(), fc.oneof(fc.string({ maxLength: 12 }), fc.constantFrom('', '-', 'NaN', '1e999', '12,5', '"', '\r', '-0.000'))), { minLength: 1, maxLength: 4 })
  .map((edits) => {
    const lines = fixtureCsv.split('\n');
    for (const [at, kind, col, junk] of edits) {
      const i = at % lines.length;
      if (kind === 'drop') lines.splice(i, 1);
      else if (kind === 'dup') lines.splice(i, 0, lines[i]);
      else if (kind === 'swap') [lines[i], lines[(i + 1) % lines.length]] = [lines[(i + 1) % lines.length], lines[i]];
      else {
        const cells = lines[i].split(',');
        cells[col % cells.length] = junk;
        lines[i] = cells.join(',');
      }
    }
    return lines.join('\n');
  });

/** The fixture record with one value at a random path replaced by junk. */
function replaceAt(value: unknown, steps: number[], junk: unknown): unknown {
  if (steps.length === 0 || value === null || typeof value !== 'object') return junk;
  const keys = Object.keys(value);
  if (keys.length === 0) return junk;
  const key = keys[steps[0] % keys.length];
  const copy = (Array.isArray(value) ? [...value] : { ...value }) as Record<string, unknown>;
  copy[key] = replaceAt(copy[key], steps.slice(1), junk);
  return copy;
}
const mangledJson = fc.tuple(fc.array(fc.nat(), { minLength: 1, maxLength: 6 }), anyValue).map(([steps, junk]) => JSON.stringify(replaceAt(fixtureJson, steps, junk)));

const importText = fc.oneof(
  fc.constant('csv' as const).chain((format) => fc.oneof(mangledCsv, fc.string({ maxLength: 400 }), fc.array(fc.array(fc.oneof(fc.string({ maxLength: 8 }), fc.double().map(String)), { maxLength: 6 }).map((r) => r.join(',')), { maxLength: 8 }).map((rows) => rows.join('\n'))).map((content) => ({ format, content }))),
  fc.constant('json' as const).chain((format) => fc.oneof(mangledJson, fc.json({ maxDepth: 3 }), fc.string({ maxLength: 200 })).map((content) => ({ format, content }))),
);

describe('record imports against random text (R6)', () => {
  it('refuses a bad record with 400 and its issues, never 5xx, and imports a good one whole or not at all', async () => {
    const problems: string[] = [];
    let refused = 0;
    const outcome = await fc.check(
      fc.asyncProperty(importText, async ({ format, content }) => {
        const before = await rowCounts();
        const res = await admin.post('/api/imports', { locationId: 1, format, content });
        const after = await rowCounts();
        const delta = Object.fromEntries(TABLES.map((t) => [t, after[t] - before[t]]).filter(([, d]) => d !== 0));
        if (res.status === 201) {
          // Still a readable record after the change: everything saved together, once.
          expect(delta).toEqual({ test_plans: 1, runs: 1, run_events: 1, run_records: 1, audit_log: 1 });
          return;
        }
        refused += 1;
        expect(res.status).toBe(400);
        expect(typeof res.body.error?.message).toBe('string');
        expect(delta).toEqual({});
        if (res.body.error.code === 'invalid_record' && res.body.issues) {
          expect(res.body.issues.length).toBeGreaterThan(0);
          for (const issue of res.body.issues) expect(typeof issue.message).toBe('string');
        }
      }),
      { numRuns: 60 },
    );
    if (outcome.failed) problems.push(`${outcome.errorInstance} with ${fc.stringify(outcome.counterexample)}`);
    expect(problems).toEqual([]);
    expect(refused).toBeGreaterThan(30); // the generators mostly make bad records
  }, 120_000);
});

// ------------------------------------------------------------------ sockets

describe('socket events against random payloads (R6)', () => {
  it('acknowledges every bad payload with ok:false and an error, and keeps the connection', async () => {
    const { cookie } = await httpSignIn(server.url, demoEmail('admin'));
    const socket = await connectSocket(server.url, cookie);
    try {
      for (const spec of server.socketEvents) {
        const payload = fc.oneof(
          anyValue,
          fc.dictionary(fc.constantFrom('rigId', 'runId', 'afterSeq', ...POLLUTING), anyValue, { maxKeys: 3 }),
          fc.record({ rigId: fc.integer({ min: 900_000, max: 2 ** 31 - 1 }), runId: fc.integer({ min: 900_000, max: 2 ** 31 - 1 }), afterSeq: fc.integer({ min: -5, max: 5 }) }),
        );
        const outcome = await fc.check(
          fc.asyncProperty(payload, async (input) => {
            const reply = await socket.timeout(5000).emitWithAck(spec.event, input as never);
            const valid = spec.input.safeParse(input ?? {}).success;
            if (!valid) expect(reply).toEqual({ ok: false, error: expect.stringMatching(/^invalid_input: /) });
            // A well-formed payload naming a rig or run that does not exist is refused too; leaving
            // a room one is not in is harmless and succeeds.
            else if (reply.ok) expect(spec.event).toMatch(/unwatch|leave/);
            else expect(reply.error).toMatch(/not found|not_found/i);
          }),
          { numRuns: 40 },
        );
        expect(outcome.failed ? `${spec.event}: ${outcome.errorInstance} with ${fc.stringify(outcome.counterexample)}` : null).toBeNull();
      }
      expect(socket.connected).toBe(true);
    } finally {
      socket.close();
    }
  }, 60_000);
});
