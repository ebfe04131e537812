import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type Client, type TestApp, signedIn, startTestApp } from '../support/api';

let t: TestApp;
let engineer: Client;
beforeAll(async () => {
  t = await startTestApp();
  engineer = await signedIn(t.app, 'engineer');
});
afterAll(() => t.stop());

const gauge = { kind: 'gauge', makeModel: 'Test indicator', serialNumber: 'T-1', unit: 'mm', rangeMin: 0, rangeMax: 25, resolution: 0.001, travelMm: 25 };
const jack = { kind: 'jack', makeModel: 'Test ram 50 cm²', serialNumber: 'T-J', unit: 'kN', rangeMin: 0, rangeMax: 350, resolution: null, travelMm: null };
const line = { inputUnit: 'MPa', outputUnit: 'kN', curve: { kind: 'linear', c0: 0.35, c1: 4.92 }, range: [0, 70] };

describe('instrument register', () => {
  it('lists the demo kit with its calibration status, an overdue gauge among it', async () => {
    const res = await engineer.get('/api/instruments');
    expect(res.status).toBe(200);
    const bySerial = Object.fromEntries(res.body.items.map((i: { serialNumber: string; status: string }) => [i.serialNumber, i.status]));
    expect(bySerial['DL-0412']).toBe('overdue');
    expect(bySerial['DG-1733']).toBe('due-soon');
    expect(bySerial['DG-2107']).toBe('in-calibration');
  });

  it('registers an instrument and records calibrations; the latest is in force', async () => {
    const created = await engineer.post('/api/instruments', gauge);
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ serialNumber: 'T-1', status: 'uncalibrated', current: null });
    const id = created.body.id;
    expect((await engineer.post(`/api/instruments/${id}/calibrations`, { calibratedOn: '2020-01-10', dueOn: '2020-07-10', method: line })).status).toBe(201);
    const fresh = await engineer.post(`/api/instruments/${id}/calibrations`, { calibratedOn: '2026-06-01', dueOn: '2099-06-01', method: line });
    expect(fresh.status).toBe(201);
    const detail = await engineer.get(`/api/instruments/${id}`);
    expect(detail.body.status).toBe('in-calibration');
    expect(detail.body.current.id).toBe(fresh.body.id);
    expect(detail.body.calibrations.map((c: { calibratedOn: string }) => c.calibratedOn)).toEqual(['2026-06-01', '2020-01-10']);
  });

  it('keeps range, resolution and travel as entered, in the API and in their own columns', async () => {
    const created = await engineer.post('/api/instruments', { ...gauge, serialNumber: 'T-RT' });
    expect(created.status).toBe(201);
    const fields = { rangeMin: 0, rangeMax: 25, unit: 'mm', resolution: 0.001, travelMm: 25 };
    expect(created.body).toMatchObject(fields);
    expect((await engineer.get(`/api/instruments/${created.body.id}`)).body).toMatchObject(fields);
    const row = async () => (await t.sequelize.query('SELECT range_min, range_max, resolution, travel_mm FROM instruments WHERE id = ?', { replacements: [created.body.id], type: 'SELECT' }))[0];
    expect(await row()).toEqual({ range_min: 0, range_max: 25, resolution: 0.001, travel_mm: 25 });
    // A change of one field leaves the others as they were.
    const changed = await engineer.patch(`/api/instruments/${created.body.id}`, { ...gauge, serialNumber: 'T-RT', resolution: 0.01 });
    expect(changed.body).toMatchObject({ ...fields, resolution: 0.01 });
    expect(await row()).toEqual({ range_min: 0, range_max: 25, resolution: 0.01, travel_mm: 25 });
  });

  it("needs a jack's rated pressure and keeps it", async () => {
    const missing = await engineer.post('/api/instruments', jack);
    expect(missing.status).toBe(400);
    expect(missing.body.error.field).toBe('ratedPressureMpa');
    const created = await engineer.post('/api/instruments', { ...jack, ratedPressureMpa: 70 });
    expect(created.status).toBe(201);
    expect((await engineer.get(`/api/instruments/${created.body.id}`)).body).toMatchObject({ rangeMax: 350, ratedPressureMpa: 70 });
    const [row] = await t.sequelize.query('SELECT rated_pressure_mpa FROM instruments WHERE id = ?', { replacements: [created.body.id], type: 'SELECT' });
    expect(row).toEqual({ rated_pressure_mpa: 70 });
  });

  it('keeps the range of a 0–700 bar transducer that has no travel', async () => {
    const created = await engineer.post('/api/instruments', { kind: 'pressure', makeModel: 'Test transducer', serialNumber: 'T-P', unit: 'bar', rangeMin: 0, rangeMax: 700, resolution: 0.1, travelMm: null });
    expect((await engineer.get(`/api/instruments/${created.body.id}`)).body).toMatchObject({ rangeMin: 0, rangeMax: 700, resolution: 0.1, travelMm: null });
  });

  it('rejects bad calibrations naming the field', async () => {
    const id = (await engineer.get('/api/instruments')).body.items[0].id;
    const order = await engineer.post(`/api/instruments/${id}/calibrations`, { calibratedOn: '2026-06-01', dueOn: '2026-01-01', method: line });
    expect(order.status).toBe(400);
    expect(order.body.error.field).toBe('dueOn');
    const table = { inputUnit: 'MPa', outputUnit: 'kN', curve: { kind: 'table', points: [{ x: 0, y: 0 }, { x: 10, y: 50 }, { x: 5, y: 80 }] } };
    const bad = await engineer.post(`/api/instruments/${id}/calibrations`, { calibratedOn: '2026-01-01', dueOn: '2026-06-01', method: table });
    expect(bad.status).toBe(400);
    expect(bad.body.error.field).toBe('method.curve.points.2.x');
    const date = await engineer.post(`/api/instruments/${id}/calibrations`, { calibratedOn: '2026-13-01', dueOn: '2027-01-01', method: line });
    expect(date.body.error.field).toBe('calibratedOn');
    // Every calibration says where it is valid; a table covers its points.
    const { range: _r, ...unbounded } = line;
    const open = await engineer.post(`/api/instruments/${id}/calibrations`, { calibratedOn: '2026-01-01', dueOn: '2026-06-01', method: unbounded });
    expect(open.status).toBe(400);
    expect(open.body.error.field).toBe('method.range');
    const points = { inputUnit: 'MPa', outputUnit: 'kN', curve: { kind: 'table', points: [{ x: 0, y: 0.35 }, { x: 50, y: 246.35 }] } };
    expect((await engineer.post(`/api/instruments/${id}/calibrations`, { calibratedOn: '2026-01-01', dueOn: '2026-06-01', method: points })).status).toBe(201);
  });

  it('keeps a certificate only when its content is a PDF or an image', async () => {
    const id = (await engineer.get('/api/instruments')).body.items[0].current.id;
    const pdf = Buffer.from('%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n');
    const ok = await engineer.agent.post(`/api/calibrations/${id}/certificate`).set('x-csrf-token', engineer.token).attach('file', pdf, 'cert.pdf');
    expect(ok.status).toBe(200);
    expect(ok.body.certificateFile).toMatch(/\.pdf$/);
    const back = await engineer.get(`/api/calibrations/${id}/certificate`);
    expect(back.headers['content-type']).toBe('application/pdf');
    const exe = await engineer.agent.post(`/api/calibrations/${id}/certificate`).set('x-csrf-token', engineer.token).attach('file', Buffer.from('MZ\x90\x00fake'), 'cert.pdf');
    expect(exe.status).toBe(415);
  });

  it('lets operators read the register but not change it', async () => {
    const operator = await signedIn(t.app, 'operator');
    expect((await operator.get('/api/instruments')).status).toBe(200);
    expect((await operator.post('/api/instruments', { ...gauge, serialNumber: 'T-2' })).status).toBe(403);
  });
});

describe('rigs', () => {
  const channel = (key: string, over: object = {}) => ({ key, role: 'gauge', label: key, profileId: 'ascii-polled-mm', port: `/dev/tty-${key}`, gauge: { xMm: 140, yMm: 0, direction: 1, travelMm: 25 }, ...over });

  it('defines a rig from device profiles and instruments', async () => {
    const profiles = (await engineer.get('/api/device-profiles')).body.items.map((p: { id: string }) => p.id);
    expect(profiles).toContain('ascii-polled-mm');
    const res = await engineer.post('/api/rigs', { name: 'Rig A', mode: 'serial', channels: [channel('g1'), channel('g2', { gauge: { xMm: -140, yMm: 0, direction: 1, travelMm: 25 } }), channel('p1', { role: 'pressure', profileId: 'modbus-hr0-int16', gauge: null })] });
    expect(res.status).toBe(201);
    expect(res.body.channels).toHaveLength(3);
    expect((await engineer.get('/api/rigs')).body.items.map((r: { name: string }) => r.name)).toContain('Rig A');
  });

  it('rejects a rig with duplicate keys, an unplaced gauge, an unknown profile or a non-jack as jack', async () => {
    const dup = await engineer.post('/api/rigs', { name: 'Rig B', mode: 'serial', channels: [channel('g1'), channel('g1')] });
    expect(dup.body.error.field).toBe('channels.1.key');
    const unplaced = await engineer.post('/api/rigs', { name: 'Rig B', mode: 'serial', channels: [channel('g1', { gauge: null })] });
    expect(unplaced.body.error.field).toBe('channels.0.gauge');
    const profile = await engineer.post('/api/rigs', { name: 'Rig B', mode: 'serial', channels: [channel('g1', { profileId: 'no-such-profile' })] });
    expect(profile.body.error.field).toBe('channels.0.profileId');
    const gaugeId = (await engineer.get('/api/instruments')).body.items.find((i: { kind: string }) => i.kind === 'gauge').id;
    const jack = await engineer.post('/api/rigs', { name: 'Rig B', mode: 'serial', channels: [channel('g1')], jackInstrumentId: gaugeId });
    expect(jack.body.error.field).toBe('jackInstrumentId');
    expect((await engineer.get('/api/rigs')).body.items.map((r: { name: string }) => r.name)).not.toContain('Rig B');
  });
});
