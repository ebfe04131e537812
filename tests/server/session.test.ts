import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SESSION_COOKIE } from '../../server/auth/session';
import { DEMO_PASSWORD } from '../../server/seed/demo';
import { Client, type TestApp, demoEmail, signedIn, startTestApp } from '../support/api';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp({ loginAttempts: 5 });
});
afterAll(() => t.stop());

const sessionCookie = (res: { headers: Record<string, unknown> }) =>
  ((res.headers['set-cookie'] as string[] | undefined) ?? []).find((c) => c.startsWith(`${SESSION_COOKIE}=`));

describe('sign-in and session (target S3, S4)', () => {
  it('stores no session before sign-in, then sets an httpOnly SameSite cookie with our own name', async () => {
    const sessions = () => t.sequelize.models.Session.count();
    const stored = await sessions();
    const c = new Client(t.app);
    const pre = await c.agent.get('/api/auth/csrf');
    await c.agent.get('/api/auth/csrf');
    expect(sessionCookie(pre)).toBeUndefined();
    expect(await sessions()).toBe(stored);
    // The anonymous CSRF token rides in its own signed cookie.
    const preCookie = (pre.headers['set-cookie'] as unknown as string[]).find((h) => h.startsWith('sscope.pre='))!;
    expect(preCookie).toMatch(/HttpOnly/);
    expect(preCookie).toMatch(/SameSite=Strict/);
    c.token = pre.body.csrfToken;
    const login = await c.post('/api/auth/login', { email: demoEmail('operator'), password: DEMO_PASSWORD });
    expect(login.status).toBe(200);
    expect(login.body.user).toMatchObject({ role: 'operator', email: demoEmail('operator') });
    expect(login.body.user.passwordHash).toBeUndefined();
    const after = sessionCookie(login)!;
    expect(after).toMatch(/HttpOnly/);
    expect(after).toMatch(/SameSite=Lax/);
    expect(await sessions()).toBe(stored + 1);
    expect(login.body.csrfToken).not.toBe(pre.body.csrfToken);
    c.token = login.body.csrfToken;
    expect((await c.get('/api/auth/me')).body.user.role).toBe('operator');
  });

  it('rejects a wrong password with one message for unknown and known accounts', async () => {
    const c = await new Client(t.app).csrf();
    const wrong = await c.post('/api/auth/login', { email: demoEmail('engineer'), password: 'not-the-password' });
    const unknown = await c.post('/api/auth/login', { email: 'nobody@settlescope.example', password: 'not-the-password' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body.error.message).toBe(unknown.body.error.message);
  });

  it('limits sign-in attempts per account and address', async () => {
    const c = await new Client(t.app).csrf();
    const statuses: number[] = [];
    for (let i = 0; i < 7; i++) statuses.push((await c.post('/api/auth/login', { email: 'limit@settlescope.example', password: 'wrong-password' })).status);
    expect(statuses.slice(0, 5)).toEqual([401, 401, 401, 401, 401]);
    expect(statuses[5]).toBe(429);
    // Another account from the same address is still allowed to try.
    expect((await c.post('/api/auth/login', { email: 'other@settlescope.example', password: 'wrong-password' })).status).toBe(401);
  });

  it('ends the session at sign-out', async () => {
    const c = await signedIn(t.app, 'engineer');
    expect((await c.post('/api/auth/logout')).status).toBe(204);
    expect((await c.get('/api/auth/me')).status).toBe(401);
  });

  it('expires a session past the absolute limit', async () => {
    const c = await signedIn(t.app, 'engineer');
    expect((await c.get('/api/auth/me')).status).toBe(200);
    const saved = t.config.sessionAbsoluteMs;
    t.config.sessionAbsoluteMs = 50; // the middleware reads the live config
    try {
      await new Promise((r) => setTimeout(r, 80));
      expect((await c.get('/api/auth/me')).status).toBe(401);
    } finally {
      t.config.sessionAbsoluteMs = saved;
    }
  });

  it('changes a password only with the current one', async () => {
    const c = await signedIn(t.app, 'client');
    const bad = await c.post('/api/auth/password', { currentPassword: 'nope-nope', newPassword: 'a-new-secret-1' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.field).toBe('currentPassword');
    const short = await c.post('/api/auth/password', { currentPassword: DEMO_PASSWORD, newPassword: 'short' });
    expect(short.body.error.field).toBe('newPassword');
    expect((await c.post('/api/auth/password', { currentPassword: DEMO_PASSWORD, newPassword: 'a-new-secret-1' })).status).toBe(204);
    await expect(new Client(t.app).signIn(demoEmail('client'), 'a-new-secret-1')).resolves.toBeInstanceOf(Client);
  });
});

describe('CSRF (target S5)', () => {
  it('refuses a state-changing request without the token or with a wrong one', async () => {
    const c = await signedIn(t.app, 'engineer');
    const none = await c.agent.post('/api/organizations').send({ name: 'Forged Ltd' });
    expect(none.status).toBe(403);
    expect(none.body.error.code).toBe('csrf_invalid');
    const wrong = await c.agent.post('/api/organizations').set('x-csrf-token', 'x'.repeat(40)).send({ name: 'Forged Ltd' });
    expect(wrong.status).toBe(403);
    const orgs = (await c.get('/api/organizations')).body.items.map((o: { name: string }) => o.name);
    expect(orgs).not.toContain('Forged Ltd');
    expect((await c.post('/api/organizations', { name: 'Genuine Ltd' })).status).toBe(201);
  });

  it('refuses sign-in without the token', async () => {
    const res = await new Client(t.app).agent.post('/api/auth/login').send({ email: demoEmail('admin'), password: DEMO_PASSWORD });
    expect(res.status).toBe(403);
  });
});

describe('security headers (target S8)', () => {
  it('sends helmet headers and a content security policy', async () => {
    const res = await new Client(t.app).get('/api/health');
    expect(res.headers['content-security-policy']).toMatch(/default-src 'self'/);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-powered-by']).toBeUndefined();
    // Served over plain HTTP (no secure cookies): no HSTS, which would lock browsers out of this address.
    expect(res.headers['strict-transport-security']).toBeUndefined();
  });

  it('answers 400, not 500, for a malformed URL encoding', async () => {
    const c = await signedIn(t.app, 'engineer');
    const res = await c.get('/api/runs/%FF/verify');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/URL encoding/);
  });
});
