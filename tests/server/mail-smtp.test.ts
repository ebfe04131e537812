/**
 * Mail through a real SMTP server set by the environment, tested against the local catcher run as if it
 * were remote: a certificate made here (TLS from the first byte, or STARTTLS), a user and password to sign
 * in with, the settings given as environment variables. Also: the settings' own checks, and what the
 * mailbox shows of a message (read by mailparser).
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import MailComposer from 'nodemailer/lib/mail-composer';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mailConfigFromEnv } from '../../server/config';
import type { RunningServer } from '../../server/main';
import { ensureDebianPackages } from '../../server/ops/debian';
import { type MailFake, startMailFake, summarizeMessage } from '../../server/ops/mail-fake';
import { DEMO_PASSWORD } from '../../server/seed/demo';
import { configureMailer } from '../../server/services/mail';
import { Client, demoEmail } from '../support/api';
import { startLiveServer } from '../support/live-server';

const sandJson = readFileSync(path.join(import.meta.dirname, '../fixtures/records/sand-bearing-450-square.json'), 'utf8');
const USER = 'settlescope-mailer';
const PASSWORD = 'correct horse battery staple';

let dir: string;
let tls: { key: string; cert: string };
/** The catcher as a remote server: implicit TLS and AUTH; the app is started with it as its SMTP server. */
let remote: MailFake;
let server: RunningServer;
let engineer: Client;
let admin: Client;
let runId: number;

/** A self-signed certificate for 127.0.0.1 (the CA file the settings name is the certificate itself). */
async function makeCertificate(): Promise<{ key: string; cert: string }> {
  await ensureDebianPackages([{ binary: 'openssl', pkg: 'openssl' }]);
  const key = path.join(dir, 'key.pem');
  const cert = path.join(dir, 'cert.pem');
  execFileSync('openssl', [
    'req', '-x509', '-newkey', 'ec', '-pkeyopt', 'ec_paramgen_curve:prime256v1', '-nodes', '-days', '1',
    '-subj', '/CN=settlescope-test-smtp', '-addext', 'subjectAltName=IP:127.0.0.1,DNS:localhost', '-keyout', key, '-out', cert,
  ], { stdio: 'pipe' });
  return { key: readFileSync(key, 'utf8'), cert: readFileSync(cert, 'utf8') };
}

/** The environment an operator would set for the catcher at `port`. */
const envFor = (port: number, security: string, password = PASSWORD) => ({
  SSCOPE_SMTP_HOST: '127.0.0.1',
  SSCOPE_SMTP_PORT: String(port),
  SSCOPE_SMTP_SECURITY: security,
  SSCOPE_SMTP_USER: USER,
  SSCOPE_SMTP_PASSWORD: password,
  SSCOPE_SMTP_CA_FILE: path.join(dir, 'cert.pem'),
  SSCOPE_MAIL_FROM: 'lab@settlescope.test',
});

/** Points the running app's mailer at a server described by environment-style settings. */
function reconfigure(env: Record<string, string>) {
  const mail = mailConfigFromEnv(env);
  configureMailer({ ...mail.smtp!, from: mail.from });
}

type Mailbox = { items: { subject: string; from: string; to: string[]; attachments: { fileName: string }[] }[] };
const mailbox = async () => (await admin.get('/api/mailbox')).body as Mailbox;

beforeAll(async () => {
  dir = mkdtempSync(path.join(tmpdir(), 'sscope-smtp-'));
  tls = await makeCertificate();
  writeFileSync(path.join(dir, 'plain.txt'), 'not a certificate');
  remote = await startMailFake({ tls: { ...tls, implicit: true }, auth: { user: USER, password: PASSWORD } });
  server = await startLiveServer({ mail: mailConfigFromEnv(envFor(remote.port, 'tls')) });
  engineer = await new Client(server.url).signIn(demoEmail('engineer'));
  admin = await new Client(server.url).signIn(demoEmail('admin'));
  const imported = await engineer.post('/api/imports', { locationId: 1, format: 'json', content: sandJson });
  expect(imported.status).toBe(201);
  runId = imported.body.runId;
  expect((await engineer.post(`/api/runs/${runId}/interpretations`, { chosenMethod: 'hyperbolic', reason: 'Smooth curve.' })).status).toBe(201);
  expect((await engineer.post(`/api/runs/${runId}/signoff/submit`)).status).toBe(200);
  expect((await admin.post(`/api/runs/${runId}/signoff/sign`, { password: DEMO_PASSWORD, meaning: 'approved' })).status).toBe(200);
}, 180_000);
afterAll(async () => {
  await server?.close();
  await remote?.close();
  if (dir) rmSync(dir, { recursive: true, force: true });
});

describe('mail settings from the environment', () => {
  it('without SSCOPE_SMTP_HOST: the local catcher (on SSCOPE_SMTP_PORT, any free port by default)', () => {
    expect(mailConfigFromEnv({})).toEqual({ smtp: null, catcherPort: 0, from: 'reports@settlescope.local' });
    expect(mailConfigFromEnv({ SSCOPE_SMTP_PORT: '2525', SSCOPE_SMTP_HOST: '' })).toMatchObject({ smtp: null, catcherPort: 2525 });
  });

  it('with a host: STARTTLS on 587 by default, 465 for implicit TLS, 25 for none (RFC 6409, RFC 8314, RFC 5321)', () => {
    expect(mailConfigFromEnv({ SSCOPE_SMTP_HOST: 'smtp.example.org' }).smtp).toEqual({ host: 'smtp.example.org', port: 587, security: 'starttls', auth: null, ca: null });
    expect(mailConfigFromEnv({ SSCOPE_SMTP_HOST: 'smtp.example.org', SSCOPE_SMTP_SECURITY: 'tls' }).smtp?.port).toBe(465);
    expect(mailConfigFromEnv({ SSCOPE_SMTP_HOST: 'smtp.example.org', SSCOPE_SMTP_SECURITY: 'none' }).smtp?.port).toBe(25);
    const full = mailConfigFromEnv(envFor(2465, 'tls'));
    expect(full).toEqual({ smtp: { host: '127.0.0.1', port: 2465, security: 'tls', auth: { user: USER, password: PASSWORD }, ca: tls.cert }, catcherPort: 0, from: 'lab@settlescope.test' });
  });

  it('refuses a wrong setting with an error naming the variable, never the password', () => {
    const error = (env: Record<string, string>) => {
      try {
        mailConfigFromEnv(env);
      } catch (err) {
        return (err as Error).message;
      }
      throw new Error('accepted');
    };
    expect(error({ SSCOPE_SMTP_HOST: 'smtp.example.org', SSCOPE_SMTP_PORT: 'submission' })).toMatch(/SSCOPE_SMTP_PORT:/);
    expect(error({ SSCOPE_SMTP_HOST: 'smtp.example.org', SSCOPE_SMTP_PORT: '70000' })).toMatch(/SSCOPE_SMTP_PORT:/);
    expect(error({ SSCOPE_SMTP_HOST: 'smtp.example.org', SSCOPE_SMTP_SECURITY: 'ssl' })).toMatch(/SSCOPE_SMTP_SECURITY: one of tls, starttls, none/);
    const noUser = error({ SSCOPE_SMTP_HOST: 'smtp.example.org', SSCOPE_SMTP_PASSWORD: 'hunter2-secret' });
    expect(noUser).toMatch(/SSCOPE_SMTP_USER: required/);
    expect(noUser).not.toContain('hunter2-secret');
    expect(error({ SSCOPE_SMTP_USER: 'u', SSCOPE_SMTP_PASSWORD: 'p' })).toMatch(/SSCOPE_SMTP_USER: set without SSCOPE_SMTP_HOST/);
    expect(error({ SSCOPE_SMTP_HOST: 'h', SSCOPE_SMTP_CA_FILE: path.join(dir, 'missing.pem') })).toMatch(/SSCOPE_SMTP_CA_FILE: cannot read .*ENOENT/);
    expect(error({ SSCOPE_SMTP_HOST: 'h', SSCOPE_SMTP_CA_FILE: path.join(dir, 'plain.txt') })).toMatch(/SSCOPE_SMTP_CA_FILE: .* no PEM certificate/);
    expect(error({ SSCOPE_MAIL_FROM: 'reports' })).toMatch(/SSCOPE_MAIL_FROM:/);
  });
});

describe('a report sent through an SMTP server with TLS and sign-in', () => {
  const sendAndFind = async () => {
    // Counted by subject: staff notices about the run may land in the same mailbox meanwhile.
    const reports = async () => (await mailbox()).items.filter((m) => m.subject.startsWith('Plate load test report:'));
    const before = (await reports()).length;
    const sent = await engineer.post(`/api/runs/${runId}/send`);
    expect(sent.status, JSON.stringify(sent.body)).toBe(200);
    const after = await reports();
    expect(after.length).toBe(before + 1);
    const message = after.find((m) => m.subject === sent.body.subject);
    expect(message).toMatchObject({ from: 'lab@settlescope.test', to: sent.body.to });
    expect(message?.attachments.map((a) => a.fileName)).toEqual(sent.body.attachments);
  };

  it('arrives over implicit TLS, signed in, with the sender from SSCOPE_MAIL_FROM (the app started with these settings)', sendAndFind);

  it('arrives over STARTTLS, signed in', async () => {
    const starttls = await startMailFake({ tls: { ...tls, implicit: false }, auth: { user: USER, password: PASSWORD } });
    try {
      reconfigure(envFor(starttls.port, 'starttls'));
      await sendAndFind();
    } finally {
      await starttls.close();
      reconfigure(envFor(remote.port, 'tls'));
    }
  });

  it('a wrong password answers 502 with the reason, not an internal error', async () => {
    reconfigure(envFor(remote.port, 'tls', 'wrong password'));
    try {
      const res = await engineer.post(`/api/runs/${runId}/send`);
      expect(res.status).toBe(502);
      expect(res.body.error.code).toBe('mail_failed');
      expect(res.body.error.message).toMatch(/refused the sign-in .*SSCOPE_SMTP_PASSWORD/);
      expect(res.body.error.message).not.toContain('wrong password');
      expect(JSON.stringify(res.body)).not.toMatch(/\bat .*\.ts:\d+/); // no stack
    } finally {
      reconfigure(envFor(remote.port, 'tls'));
    }
  });

  it('a server certificate not trusted (no SSCOPE_SMTP_CA_FILE) answers 502 naming the TLS settings', async () => {
    const { SSCOPE_SMTP_CA_FILE: _ca, ...untrusted } = envFor(remote.port, 'tls');
    reconfigure(untrusted);
    try {
      const res = await engineer.post(`/api/runs/${runId}/send`);
      expect(res.status).toBe(502);
      expect(res.body.error.message).toMatch(/SSCOPE_SMTP_CA_FILE.*certificate/);
    } finally {
      reconfigure(envFor(remote.port, 'tls'));
    }
  });
});

describe('what the mailbox shows of a message', () => {
  it('the decoded subject, the plain text, and each attachment’s name, type and decoded size', async () => {
    const pdf = Buffer.alloc(3000, 7);
    const raw = await new MailComposer({
      from: 'a@settlescope.test',
      to: 'b@settlescope.test',
      subject: 'Prüfbericht: Grube 3 – Setzung',
      text: 'Résumé of the test.\nSecond line.\n',
      attachments: [
        { filename: 'bericht-ü.pdf', content: pdf, contentType: 'application/pdf' },
        { filename: 'readings.csv', content: 'a,b\n1,2\n', contentType: 'text/csv' },
      ],
    })
      .compile()
      .build();
    expect(raw.toString('latin1')).toContain('=?UTF-8?'); // the subject really went encoded
    expect(await summarizeMessage(raw)).toEqual({
      subject: 'Prüfbericht: Grube 3 – Setzung',
      text: 'Résumé of the test.\nSecond line.',
      attachments: [
        { fileName: 'bericht-ü.pdf', contentType: 'application/pdf', sizeBytes: 3000 },
        { fileName: 'readings.csv', contentType: 'text/csv', sizeBytes: 8 },
      ],
    });
  });
});
