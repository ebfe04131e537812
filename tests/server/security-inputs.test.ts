/**
 * Small guards on what comes in and goes out: the password policy (minimum length and a blocklist of
 * common and trivially guessed passwords, NIST SP 800-63B style), control characters refused in one-line
 * fields, the same "not found" whether a record is missing or another client's, and uploaded PDFs served
 * as downloads.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { weakPasswordReason } from '../../shared/schemas/users';
import { type Client, signedIn, startTestApp, type TestApp } from '../support/api';

let t: TestApp;
let admin: Client;
beforeAll(async () => {
  t = await startTestApp({ loginAttempts: 10_000 });
  admin = await signedIn(t.app, 'admin');
}, 120_000);
afterAll(() => t?.stop());

describe('password policy', () => {
  it.each(['aaaaaaaa', '12345678', 'abcdefgh', '87654321', 'password', 'Password1!', 'qwerty2024', 'letmein99', 'Settlescope1'])('refuses %s', async (password) => {
    expect(weakPasswordReason(password)).not.toBeNull();
    const res = await admin.post('/api/users', { email: `weak-${password.length}-${Date.now()}@example.test`, name: 'Weak', role: 'operator', password });
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe('password');
  });

  it.each(['granite-ledger-93', 'Plate at 1.5 m under kentledge', 'correct horse battery staple'])('accepts %s', (password) => {
    expect(weakPasswordReason(password)).toBeNull();
  });

  it('applies to a password change too', async () => {
    const res = await admin.post('/api/auth/password', { currentPassword: 'settle-demo-2026', newPassword: 'aaaaaaaaaaaa' });
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe('newPassword');
  });
});

describe('one-line fields', () => {
  it.each([
    ['CR/LF', 'KQ-1\r\nBcc: someone@example.test'],
    ['a NUL', 'KQ\u00001'],
    ['a line separator', 'KQ\u20281'],
  ])('refuse %s in a project code; notes keep their line breaks', async (_what, code) => {
    const res = await admin.patch('/api/projects/1', { code });
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe('code');
    const notes = await admin.patch('/api/projects/1', { notes: 'Line one\nLine two\tindented' });
    expect(notes.status).toBe(200);
    expect(notes.body.notes).toBe('Line one\nLine two\tindented');
  });
});

describe('what a client may not see', () => {
  it('answers the same 404 for another organisation’s location as for one that does not exist', async () => {
    const client = await signedIn(t.app, 'client');
    const own = (await client.get('/api/projects')).body.items.map((p: { id: number }) => p.id);
    const others = (await admin.get('/api/projects')).body.items.filter((p: { id: number }) => !own.includes(p.id));
    const foreignLocation = (await admin.get(`/api/projects/${others[0].id}/locations`)).body.items[0].id;
    const foreign = await client.get(`/api/locations/${foreignLocation}`);
    const missing = await client.get('/api/locations/999999');
    expect(foreign.status).toBe(404);
    expect(foreign.body).toEqual(missing.body);
  });
});

describe('uploaded PDFs', () => {
  it('serves a calibration certificate PDF as a download, never inline', async () => {
    const id = (await admin.get('/api/instruments')).body.items[0].current.id;
    // A PDF whose catalogue asks to run an action on opening: kept (it is a PDF), but only ever downloaded.
    const pdf = Buffer.from('%PDF-1.4\n1 0 obj << /Type /Catalog /OpenAction << /S /JavaScript /JS (app.alert(1)) >> >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n');
    const up = await admin.agent.post(`/api/calibrations/${id}/certificate`).set('x-csrf-token', admin.token).attach('file', pdf, 'cert.pdf');
    expect(up.status).toBe(200);
    const back = await admin.get(`/api/calibrations/${id}/certificate`);
    expect(back.headers['content-disposition']).toMatch(/^attachment;/);
    expect(back.headers['x-content-type-options']).toBe('nosniff');
  });
});
