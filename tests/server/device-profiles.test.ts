import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { modbusProfileSchema } from '@shared/devices/schema';
import { type ChannelReading, RigConnection } from '../../server/acquisition/rig-connection';
import { loadRigContext } from '../../server/acquisition/rig-context';
import { RigMonitor } from '../../server/acquisition/rig-monitor';
import { AuditEntry } from '../../server/models/audit-entry';
import { RigSimulator } from '../../simulators/rig-simulator';
import { type Client, type TestApp, signedIn, startTestApp } from '../support/api';

/*
 * A transducer that sends its float32 high word first, set up by the lab through the profile API
 * alone (no code change), read through a socat pseudo-terminal served by the rig simulator; and the
 * device check naming an exception reply, a reading beyond the instrument's range and a port that
 * never opened.
 */

const hasSocat = spawnSync('socat', ['-V']).status === 0;

let t: TestApp;
let admin: Client;
let engineer: Client;
beforeAll(async () => {
  t = await startTestApp();
  admin = await signedIn(t.app, 'admin');
  engineer = await signedIn(t.app, 'engineer');
});
afterAll(() => t.stop());

/** An invented transducer: float32 MPa, high word first, on input registers 10–11 of slave 5. */
const highFirst = {
  protocol: 'modbus-rtu',
  id: 'lab-float-hw',
  name: 'Lab transducer, float32 MPa, high word first',
  serial: { baudRate: 19200, dataBits: 8, parity: 'even', stopBits: 1 },
  unitId: 5,
  functionCode: 4,
  register: 10,
  format: 'float32',
  wordOrder: 'high-first',
  byteOrder: 'big',
  scale: 1,
  offset: 0,
  unit: 'MPa',
  pollIntervalMs: 50,
  timeoutMs: 300,
};
const put = (who: Client, url: string, body: object) => who.agent.put(url).set('x-csrf-token', who.token).send(body);

describe('lab device profiles', () => {
  it('are written by admins only, read by engineers, listed after the built-ins, and audited', async () => {
    expect((await engineer.post('/api/device-profiles', highFirst)).status).toBe(403);
    const created = await admin.post('/api/device-profiles', highFirst);
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    expect(created.body).toMatchObject({ ...highFirst, source: 'lab' });
    const list = (await engineer.get('/api/device-profiles')).body.items as { id: string; source: string }[];
    expect(list.at(-1)).toMatchObject({ id: 'lab-float-hw', source: 'lab' });
    expect(list.find((p) => p.id === 'modbus-ir2-float32-hw')).toMatchObject({ source: 'built-in', wordOrder: 'high-first' });
    expect((await engineer.get('/api/device-profiles/lab-float-hw')).body).toMatchObject(highFirst);
    const operator = await signedIn(t.app, 'operator');
    expect((await operator.get('/api/device-profiles')).status).toBe(403);
    const audit = await AuditEntry.findOne({ where: { entity: 'device-profile', entityId: 'lab-float-hw', action: 'created' } });
    expect(audit?.changes).toMatchObject({ wordOrder: { from: null, to: 'high-first' } });
  });

  it('refuse a built-in id, a taken id and a bad field, naming it', async () => {
    expect((await admin.post('/api/device-profiles', { ...highFirst, id: 'modbus-ir2-float32' })).body.error.field).toBe('id');
    expect((await admin.post('/api/device-profiles', highFirst)).status).toBe(409);
    expect((await admin.post('/api/device-profiles', { ...highFirst, id: 'other', byteOrder: 'middle' })).body.error.field).toBe('byteOrder');
  });

  it('are replaced whole, keeping their id; a built-in cannot be', async () => {
    const { id: _id, ...rest } = highFirst;
    const changed = await put(admin, '/api/device-profiles/lab-float-hw', { ...rest, name: 'Lab transducer (renamed)', timeoutMs: 400 });
    expect(changed.status, JSON.stringify(changed.body)).toBe(200);
    expect(changed.body).toMatchObject({ id: 'lab-float-hw', name: 'Lab transducer (renamed)', timeoutMs: 400, wordOrder: 'high-first' });
    const audit = await AuditEntry.findOne({ where: { entity: 'device-profile', entityId: 'lab-float-hw', action: 'updated' } });
    expect(audit?.changes).toEqual({ name: { from: highFirst.name, to: 'Lab transducer (renamed)' }, timeoutMs: { from: 300, to: 400 } });
    expect((await put(engineer, '/api/device-profiles/lab-float-hw', rest)).status).toBe(403);
    expect((await put(admin, '/api/device-profiles/modbus-ir2-float32', rest)).status).toBe(400);
    expect((await put(admin, '/api/device-profiles/no-such', rest)).status).toBe(404);
    await put(admin, '/api/device-profiles/lab-float-hw', rest);
  });
});

describe.skipIf(!hasSocat)('a lab profile read through a pseudo-terminal', () => {
  const dir = mkdtempSync(join(tmpdir(), 'settlescope-labprofile-'));
  let sim: RigSimulator;
  let transducerId: number;

  beforeAll(async () => {
    // The simulated device encodes its registers with the profile as the API stored it.
    const stored = modbusProfileSchema.parse((await engineer.get('/api/device-profiles/lab-float-hw')).body);
    sim = await RigSimulator.start({ scenario: 'compacted-fill', speed: 100, gauges: 1, dir, seed: 3, pressureProfile: stored });
    sim.rig.pumpToOil(12.5);
    // Pumped up (the jack then leaks slowly; every reading is compared with the simulator's pressure at that moment).
    await vi.waitFor(() => expect(sim.rig.snapshot().oilMpa).toBeGreaterThan(10), { timeout: 10_000, interval: 50 });
    const instrument = await engineer.post('/api/instruments', { kind: 'pressure', makeModel: 'Invented 70 MPa transducer', serialNumber: 'LP-1', unit: 'MPa', rangeMin: 0, rangeMax: 70 });
    expect(instrument.status).toBe(201);
    transducerId = instrument.body.id;
  });

  afterAll(async () => {
    await sim?.stop();
    rmSync(dir, { recursive: true, force: true });
  });

  const pressurePort = () => sim.ports.find((p) => p.kind === 'pressure')!.appPath;
  const gaugePort = () => sim.ports.find((p) => p.kind === 'gauge')!.appPath;

  async function rigWith(name: string, pressure: { profileId: string; port: string }, gauge = { profileId: 'ascii-polled-mm', port: gaugePort() }) {
    const res = await engineer.post('/api/rigs', {
      name,
      mode: 'serial',
      channels: [
        { key: 'g1', role: 'gauge', label: 'Gauge', ...gauge, gauge: { xMm: 140, yMm: 0, direction: 1, travelMm: 25 } },
        { key: 'p1', role: 'pressure', label: 'Oil pressure', instrumentId: transducerId, ...pressure },
      ],
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body.id as number;
  }

  it('reads the jack pressure (about 12.5 MPa) sent high word first as it is, good', async () => {
    const rigId = await rigWith('Lab profile rig', { profileId: 'lab-float-hw', port: pressurePort() });
    const context = await loadRigContext(rigId);
    const readings: (ChannelReading & { oilMpa: number })[] = [];
    const onReading = (r: ChannelReading) => r.key === 'p1' && readings.push({ ...r, oilMpa: sim.rig.snapshot().oilMpa });
    const connection = new RigConnection({ channels: context.rig.channels, calibrations: context.calibrations, ranges: context.ranges, onReading });
    connection.start();
    try {
      await vi.waitFor(() => expect(readings.filter((r) => r.status === 'ok').length).toBeGreaterThanOrEqual(3), { timeout: 5000, interval: 50 });
    } finally {
      await connection.stop();
    }
    expect(readings.every((r) => r.status === 'ok')).toBe(true);
    // The simulated transducer adds up to ±0.1 % of its 40 MPa full scale; the jack leaks a little between reply and our look.
    for (const r of readings) expect(Math.abs((r.value ?? Number.NaN) - r.oilMpa)).toBeLessThan(0.1);
    expect(readings[0].value).toBeGreaterThan(10); // not 2e-41, as the low-word-first reading of it was
  });

  /** The device check's view of a rig, a moment after it starts watching. */
  async function deviceCheck(rigId: number, until: (c: { status: string; problem: string | null }) => boolean) {
    const io = { sockets: { adapter: { rooms: new Map([[`rig:${rigId}`, new Set(['watcher'])]]) } }, to: () => ({ emit: () => {} }) };
    const monitor = new RigMonitor(io as never);
    await monitor.open(rigId);
    try {
      let channel: ReturnType<typeof pressureOf>;
      const pressureOf = () => monitor.snapshot(rigId)!.channels.find((c) => c.key === 'p1')!;
      await vi.waitFor(
        () => {
          channel = pressureOf();
          expect(until(channel)).toBe(true);
        },
        { timeout: 5000, interval: 50 },
      );
      return channel!;
    } finally {
      await monitor.closeAll();
    }
  }

  it('names an exception reply on the device check: a register the device does not have', async () => {
    const { id: _id, ...rest } = highFirst;
    expect((await admin.post('/api/device-profiles', { ...rest, id: 'lab-float-wrong-register', register: 40 })).status).toBe(201);
    const rigId = await rigWith('Wrong register rig', { profileId: 'lab-float-wrong-register', port: pressurePort() });
    const channel = await deviceCheck(rigId, (c) => c.status === 'rejected');
    expect(channel.value).toBeNull();
    expect(channel.problem).toMatch(/^Modbus exception 02 \(illegal data address\)/);
    expect(channel.lastRejection).toBe(channel.problem);
  });

  it('flags a reading beyond the instrument range instead of passing it as good', async () => {
    const narrow = await engineer.patch(`/api/instruments/${transducerId}`, { rangeMin: 0, rangeMax: 5 });
    expect(narrow.status, JSON.stringify(narrow.body)).toBe(200);
    try {
      const rigId = await rigWith('Over range rig', { profileId: 'lab-float-hw', port: pressurePort() });
      const channel = await deviceCheck(rigId, (c) => c.status === 'rejected');
      expect(channel.value).toBeNull();
      expect(channel.problem).toMatch(/^Outside the instrument's range: 1\d\.\d+ MPa is outside 0 – 5 MPa$/); // the jack leaks a little below 12.5 MPa
    } finally {
      await engineer.patch(`/api/instruments/${transducerId}`, { rangeMin: 0, rangeMax: 70 });
    }
  });

  it('tries a profile on a port before any rig names it: good readings, an exception named, a port that never opened', async () => {
    const profile = (await engineer.get('/api/device-profiles/lab-float-hw')).body;
    const good = await engineer.post('/api/device-profiles/preview', { profile, port: pressurePort(), durationMs: 600 });
    expect(good.status, JSON.stringify(good.body)).toBe(200);
    expect(good.body).toMatchObject({ opened: true, problem: null });
    expect(good.body.samples.length).toBeGreaterThanOrEqual(3);
    expect(good.body.samples.map((s: { seq: number }) => s.seq)).toEqual(good.body.samples.map((_: unknown, i: number) => i + 1));
    for (const s of good.body.samples) expect(Math.abs(s.value - sim.rig.snapshot().oilMpa)).toBeLessThan(0.2);

    const wrong = await engineer.post('/api/device-profiles/preview', { profile: { ...profile, register: 40 }, port: pressurePort(), durationMs: 600 });
    expect(wrong.body.samples.length).toBeGreaterThanOrEqual(1);
    for (const s of wrong.body.samples) expect(s).toMatchObject({ status: 'rejected', value: null, problem: expect.stringMatching(/^Modbus exception 02 \(illegal data address\)/) });

    const missing = await engineer.post('/api/device-profiles/preview', { profile, port: join(dir, 'no-such-tty'), durationMs: 300 });
    expect(missing.body).toMatchObject({ opened: false, samples: [], problem: expect.stringMatching(/^Port never opened: /) });

    const operator = await signedIn(t.app, 'operator');
    expect((await operator.post('/api/device-profiles/preview', { profile, port: pressurePort() })).status).toBe(403);
  });

  it('says a port that never opened is that, not a silent device', async () => {
    const rigId = await rigWith('Missing port rig', { profileId: 'lab-float-hw', port: join(dir, 'no-such-tty') });
    const channel = await deviceCheck(rigId, (c) => c.problem !== null);
    expect(channel.link).not.toBe('open');
    expect(channel.problem).toMatch(/^Port never opened: /);
  });
});
