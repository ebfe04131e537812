/**
 * QUALITY S3 beyond tests/server/session.test.ts: the password length cap names its field, sign-in
 * spends a full hash even for an unknown e-mail, stored hashes are argon2id at the OWASP minimum,
 * and the per-account sign-in limit cannot be dodged by padding or re-casing the e-mail.
 */
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../server/seed/demo';
import { Client, type TestApp, demoEmail, signedIn, startTestApp } from '../support/api';

const LOGIN_ATTEMPTS = 4;
let t: TestApp;
beforeAll(async () => {
  t = await startTestApp({ loginAttempts: LOGIN_ATTEMPTS });
}, 120_000);
afterAll(() => t?.stop());

const TOO_LONG = 'load-test-'.repeat(13).slice(0, 129); // the policy allows up to 128 characters (shared/schemas/users.ts)

describe('password length (S3)', () => {
  it('refuses a password over 128 characters with 400 naming the field, wherever one is given', async () => {
    const admin = await signedIn(t.app, 'admin');
    const login = await (await new Client(t.app).csrf()).post('/api/auth/login', { email: demoEmail('engineer'), password: TOO_LONG });
    expect([login.status, login.body.error.field]).toEqual([400, 'password']);
    const change = await admin.post('/api/auth/password', { currentPassword: DEMO_PASSWORD, newPassword: TOO_LONG });
    expect([change.status, change.body.error.field]).toEqual([400, 'newPassword']);
    const created = await admin.post('/api/users', { email: 'longpass@settlescope.example', name: 'Long Pass', role: 'operator', password: TOO_LONG });
    expect([created.status, created.body.error.field]).toEqual([400, 'password']);
    // 128 is still allowed (OWASP ASVS 2.1.2: at least 64 permitted).
    const ok = await admin.post('/api/users', { email: 'longpass@settlescope.example', name: 'Long Pass', role: 'operator', password: TOO_LONG.slice(1) });
    expect(ok.status).toBe(201);
  });
});

describe('password storage (S3)', () => {
  it('stores argon2id hashes with m ≥ 19 MiB and t ≥ 2 (OWASP Password Storage Cheat Sheet)', async () => {
    const rows = (await t.sequelize.query('SELECT email, password_hash AS hash FROM users', { type: QueryTypes.SELECT })) as { email: string; hash: string }[];
    expect(rows.length).toBeGreaterThanOrEqual(4);
    for (const { email, hash } of rows) {
      // PHC string format: $argon2id$v=19$m=<KiB>,t=<passes>,p=<lanes>$<salt>$<hash>
      const m = /^\$argon2id\$v=19\$m=(\d+),t=(\d+),p=(\d+)\$/.exec(hash);
      expect(m, `${email}: ${hash.slice(0, 30)}`).not.toBeNull();
      expect(Number(m![1])).toBeGreaterThanOrEqual(19456);
      expect(Number(m![2])).toBeGreaterThanOrEqual(2);
    }
  });
});

describe('sign-in timing (S3)', () => {
  it('verifies against a decoy hash for an unknown e-mail, so both answers cost a hash', async () => {
    const c = await new Client(t.app).csrf();
    const timed = async (email: string) => {
      const start = performance.now();
      const res = await c.post('/api/auth/login', { email, password: 'not-the-password' });
      expect(res.status).toBe(401);
      return performance.now() - start;
    };
    await timed('warm-up@settlescope.example'); // the decoy hash is made once, on first use
    const unknown = await timed('nobody-here@settlescope.example');
    const known = await timed(demoEmail('operator'));
    // An argon2id verify at m = 19 MiB, t = 2 takes tens of ms; a bare "no such user" would take ~1 ms.
    expect(unknown).toBeGreaterThan(10);
    expect(known).toBeGreaterThan(10);
  });
});

describe('sign-in limit per account (S3)', () => {
  it('counts padded and re-cased spellings of one e-mail as the same account', async () => {
    const c = await new Client(t.app).csrf();
    const spellings = ['spray@settlescope.example', ' spray@settlescope.example', 'SPRAY@settlescope.example', 'spray@settlescope.example  ', '\tSpray@Settlescope.example'];
    const statuses: number[] = [];
    for (const email of spellings) statuses.push((await c.post('/api/auth/login', { email, password: 'wrong-password' })).status);
    expect(statuses).toEqual([...Array(LOGIN_ATTEMPTS).fill(401), 429]);
  });
});
