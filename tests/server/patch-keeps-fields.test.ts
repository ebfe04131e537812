/**
 * Every write keeps what it was not told to change. Generated from the route table: for every PATCH
 * route, each field of its body schema is sent alone (with values made from the schema itself), and
 * every other field of the resource must read back unchanged; a refused value (400) must change nothing.
 * A new PATCH route fails here until it has a fixture below saying which record to change and how to
 * read it back.
 */
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { z } from 'zod';
import { type Client, signedIn, startTestApp, type TestApp } from '../support/api';

let t: TestApp;
let admin: Client;

type Dto = Record<string, unknown>;

interface Fixture {
  /** The id of a record the admin may change (no signed run depends on it). */
  id(): Promise<number>;
  read(id: number): Promise<Dto>;
  /** Fields the server derives from a written one: they may change with it. */
  derived?: Record<string, string[]>;
  /** Values to try first where the schema alone cannot tell a valid one (a reference to a record of a kind). */
  values?: Record<string, () => Promise<unknown[]>>;
  /** Fields that cannot change alone, with why: each must still be refused without changing anything. */
  notAlone?: Record<string, string>;
}

const item = async (url: string, id: number) => {
  const res = await admin.get(url);
  expect(res.status).toBe(200);
  return (res.body.items as Dto[]).find((x) => x.id === id)!;
};
const one = async (url: string) => {
  const res = await admin.get(url);
  expect(res.status).toBe(200);
  return res.body as Dto;
};

let photoLocation = 0;
const FIXTURES: Record<string, Fixture> = {
  '/api/projects/:id': {
    id: async () => ((await admin.get('/api/projects')).body.items as Dto[]).find((p) => p.code !== undefined)!.id as number,
    read: (id) => one(`/api/projects/${id}`),
    derived: { organizationId: ['organizationName'] },
  },
  '/api/locations/:id': {
    // A fresh location: no run, so nothing signed depends on it.
    id: async () => {
      const res = await admin.post('/api/projects/1/locations', { pitId: 'PATCH-1', testDepthM: 1, latitude: 51.5, longitude: -0.1, waterTableDepthM: 3, soilDescription: 'Sand', notes: 'Kept' });
      expect(res.status).toBe(201);
      return res.body.id;
    },
    read: (id) => one(`/api/locations/${id}`),
  },
  '/api/users/:id': {
    id: async () => ((await admin.get('/api/users')).body.items as Dto[]).find((u) => u.role === 'operator')!.id as number,
    read: (id) => item('/api/users', id),
  },
  '/api/organizations/:id': {
    id: async () => ((await admin.get('/api/organizations')).body.items as Dto[])[0].id as number,
    read: (id) => item('/api/organizations', id),
  },
  '/api/photos/:id': {
    id: async () => {
      photoLocation = ((await one('/api/projects/1/locations')).items as Dto[])[0].id as number;
      const data = await sharp({ create: { width: 64, height: 48, channels: 3, background: { r: 40, g: 90, b: 140 } } }).jpeg().toBuffer();
      const res = await admin.upload(`/api/locations/${photoLocation}/photos`, { data, name: 'p.jpg' }, { kind: 'site', caption: 'Kept caption' });
      expect(res.status).toBe(201);
      return res.body.id;
    },
    read: (id) => item(`/api/locations/${photoLocation}/photos`, id),
  },
  '/api/rigs/:id': {
    id: async () => {
      const gauge = { key: 'g1', role: 'gauge', label: 'G1', profileId: 'manual', gauge: { xMm: 0, yMm: 0, direction: 1, travelMm: 50 } };
      const res = await admin.post('/api/rigs', { name: 'Patch rig', mode: 'manual', channels: [gauge], notes: 'Kept' });
      expect(res.status).toBe(201);
      return res.body.id;
    },
    read: (id) => one(`/api/rigs/${id}`),
    values: { jackInstrumentId: async () => ((await admin.get('/api/instruments')).body.items as Dto[]).filter((i) => i.kind === 'jack').map((i) => i.id) },
    notAlone: { mode: 'a serial rig needs a port on every channel' },
  },
  '/api/instruments/:id': {
    id: async () => ((await admin.get('/api/instruments')).body.items as Dto[])[0].id as number,
    read: (id) => one(`/api/instruments/${id}`),
  },
  '/api/plans/:id': {
    id: async () => ((await one('/api/locations/1/plans')).items as Dto[])[0].id as number,
    read: async (id) => (await one(`/api/plans/${id}`)).plan as Dto,
  },
};

/** Values the field's schema accepts that differ from `current`, simplest first. */
function alternatives(field: z.ZodType, current: unknown, name: string): unknown[] {
  const out: unknown[] = [];
  let s: z.ZodType = field;
  for (;;) {
    if (s instanceof z.ZodOptional || s instanceof z.ZodDefault) s = s.unwrap() as z.ZodType;
    else if (s instanceof z.ZodNullable) {
      out.push(null);
      s = s.unwrap() as z.ZodType;
    } else break;
  }
  if (s instanceof z.ZodString) {
    if (s.format === 'email') out.push(`changed.${name.toLowerCase()}@example.com`);
    out.push(`Changed ${name}`.slice(0, s.maxLength ?? 60), 'changed');
  } else if (s instanceof z.ZodNumber) {
    const lo = Math.max(s.minValue ?? -1000, -1000);
    const hi = Math.min(s.maxValue ?? 1000, 1000);
    const picks = s.isInt ? [1, 2, 3, Math.round((lo + hi) / 2)] : [(lo + hi) / 2, lo + (hi - lo) / 4, 1, 2];
    out.push(...picks);
  } else if (s instanceof z.ZodBoolean) out.push(!current);
  else if (s instanceof z.ZodEnum) out.push(...s.options);
  else if (s instanceof z.ZodArray) out.push(...alternatives(s.element as z.ZodType, undefined, name).map((v) => [v]));
  return out.filter((v) => field.safeParse(v).success && JSON.stringify(v) !== JSON.stringify(current));
}

const patchRoutes = () => t.routes.filter((r) => r.method === 'patch');

beforeAll(async () => {
  t = await startTestApp({ loginAttempts: 10_000 });
  admin = await signedIn(t.app, 'admin');
}, 120_000);
afterAll(() => t?.stop());

describe('PATCH keeps what it was not told to change', () => {
  it('every PATCH route has a fixture (a new one must be added here)', () => {
    expect(patchRoutes().length).toBeGreaterThan(3);
    expect(patchRoutes().map((r) => r.path).filter((p) => !FIXTURES[p])).toEqual([]);
  });

  it('each field sent alone changes that field and nothing else', async () => {
    const problems: string[] = [];
    let accepted = 0;
    for (const spec of patchRoutes()) {
      const fixture = FIXTURES[spec.path];
      if (!fixture) continue;
      const body = spec.body;
      if (!(body instanceof z.ZodObject)) {
        problems.push(`${spec.path}: body schema is not an object, its fields cannot be listed`);
        continue;
      }
      const id = await fixture.id();
      const url = spec.path.replace(':id', String(id));
      for (const [name, field] of Object.entries(body.shape as Record<string, z.ZodType>)) {
        let before = await fixture.read(id);
        const given = (await fixture.values?.[name]?.()) ?? [];
        const candidates = [...given.filter((v) => JSON.stringify(v) !== JSON.stringify(before[name])), ...alternatives(field, before[name], name)];
        if (candidates.length === 0) continue; // a structured field: covered by the route's own tests
        let took = false;
        for (const value of candidates) {
          const res = await admin.patch(url, { [name]: value });
          const after = await fixture.read(id);
          const mayChange = new Set(['updatedAt', ...(res.status === 200 ? [name, ...(fixture.derived?.[name] ?? [])] : [])]);
          for (const key of Object.keys(before)) {
            if (!mayChange.has(key) && JSON.stringify(after[key]) !== JSON.stringify(before[key])) {
              problems.push(`PATCH ${spec.path} {${name}: ${JSON.stringify(value)}} → ${res.status} changed ${key}: ${JSON.stringify(before[key])} → ${JSON.stringify(after[key])}`);
            }
          }
          if (res.status === 200) {
            if (name in after && JSON.stringify(after[name]) !== JSON.stringify(value)) problems.push(`PATCH ${spec.path} {${name}} answered 200 but reads back ${JSON.stringify(after[name])}`);
            took = true;
            accepted++;
            break;
          }
          if (res.status !== 400) problems.push(`PATCH ${spec.path} {${name}} answered ${res.status} ${JSON.stringify(res.body)}`);
          before = after;
        }
        // A partial-update route must take each field alone; a whole-replacement route refuses them all.
        const partial = body.safeParse({ [name]: candidates[0] }).success;
        if (partial && !took && !fixture.notAlone?.[name]) problems.push(`PATCH ${spec.path}: no single value of ${name} was accepted (tried ${JSON.stringify(candidates)})`);
      }
    }
    expect(problems).toEqual([]);
    expect(accepted).toBeGreaterThan(15);
  }, 120_000);
});
