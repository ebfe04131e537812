/**
 * Delivery and the client portal: a signed report e-mailed through nodemailer to the local SMTP catcher,
 * captured with its attachments and listed in the admin's mailbox; the finish notice to engineers; and
 * client scoping (target S2) of the report list, the PDF and the readings CSV.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RunningServer } from '../../server/main';
import { DEMO_PASSWORD } from '../../server/seed/demo';
import { notifyRunFinished } from '../../server/services/mail';
import { demoEmail } from '../support/api';
import { httpSignIn, startLiveServer } from '../support/live-server';

const sandJson = readFileSync(path.join(import.meta.dirname, '../fixtures/records/sand-bearing-450-square.json'), 'utf8');

/** A signed-in HTTP session against the live server. */
class Session {
  constructor(
    private readonly base: string,
    private readonly auth: { cookie: string; csrfToken: string },
  ) {}
  static async open(base: string, email: string) {
    return new Session(base, await httpSignIn(base, email));
  }
  get(url: string) {
    return fetch(`${this.base}${url}`, { headers: { cookie: this.auth.cookie } });
  }
  post(url: string, body: object = {}) {
    return fetch(`${this.base}${url}`, {
      method: 'POST',
      headers: { cookie: this.auth.cookie, 'x-csrf-token': this.auth.csrfToken, 'content-type': 'application/json' },
      body: JSON.stringify(body),
    });
  }
}

let server: RunningServer;
let engineer: Session;
let admin: Session;
let client: Session;
/** Signed runs at a location of the client's own organisation and of another organisation; an unsigned own run. */
const runs = { own: 0, other: 0, ownUnsigned: 0 };
let ownContacts: string[];

async function locationOf(projectCode: string): Promise<number> {
  const projects = (await (await engineer.get('/api/projects')).json()).items as { id: number; code: string }[];
  const project = projects.find((p) => p.code === projectCode)!;
  const locations = (await (await engineer.get(`/api/projects/${project.id}/locations`)).json()).items as { id: number }[];
  return locations[0].id;
}

async function importRun(locationId: number, sign: boolean): Promise<number> {
  const imported = await engineer.post('/api/imports', { locationId, format: 'json', content: sandJson });
  expect(imported.status).toBe(201);
  const { runId } = await imported.json();
  if (!sign) return runId;
  expect((await engineer.post(`/api/runs/${runId}/interpretations`, { chosenMethod: 'hyperbolic', reason: 'Smooth curve.' })).status).toBe(201);
  expect((await engineer.post(`/api/runs/${runId}/signoff/submit`)).status).toBe(200);
  // Signed by someone other than the submitter.
  expect((await admin.post(`/api/runs/${runId}/signoff/sign`, { password: DEMO_PASSWORD, meaning: 'approved' })).status).toBe(200);
  return runId;
}

beforeAll(async () => {
  server = await startLiveServer({ loginAttempts: 10_000 });
  engineer = await Session.open(server.url, demoEmail('engineer'));
  admin = await Session.open(server.url, demoEmail('admin'));
  client = await Session.open(server.url, demoEmail('client'));
  runs.own = await importRun(await locationOf('KQ-DC2'), true);
  runs.other = await importRun(await locationOf('FM-AR7'), true);
  runs.ownUnsigned = await importRun(await locationOf('KQ-DC2'), false);
  const orgs = (await (await admin.get('/api/organizations')).json()).items as { name: string; contactEmails: string[] }[];
  ownContacts = orgs.find((o) => o.name === 'Harrowgate Freight Ltd')!.contactEmails;
}, 180_000);
afterAll(() => server?.close());

describe('sending a report', () => {
  it('refuses an unsigned run (409) and callers other than engineers and admins (403)', async () => {
    const unsigned = await engineer.post(`/api/runs/${runs.ownUnsigned}/send`);
    expect(unsigned.status).toBe(409);
    expect((await unsigned.json()).error.code).toBe('run_not_signed');
    const operator = await Session.open(server.url, demoEmail('operator'));
    expect((await operator.post(`/api/runs/${runs.own}/send`)).status).toBe(403);
  });

  it('delivers the PDF and the readings CSV to the client’s contacts, and the admin’s mailbox shows it', async () => {
    const sent = await engineer.post(`/api/runs/${runs.own}/send`);
    expect(sent.status).toBe(200);
    const body = await sent.json();
    expect(body.to).toEqual(ownContacts);

    const mailbox = await admin.get('/api/mailbox');
    expect(mailbox.status).toBe(200);
    const message = (await mailbox.json()).items.find((m: { subject: string }) => m.subject === body.subject);
    expect(message).toBeDefined();
    expect(message.to).toEqual(ownContacts);
    expect(message.subject).toContain('KQ-DC2');
    expect(message.text).toContain('signed report');
    const csv = await (await engineer.get(`/api/runs/${runs.own}/record.csv`)).text();
    const [pdf, readings] = message.attachments;
    expect(pdf).toMatchObject({ fileName: `run-${runs.own}-report-rev1.pdf`, contentType: 'application/pdf' });
    expect(pdf.sizeBytes).toBeGreaterThan(10_000);
    expect(readings).toEqual({ fileName: `run-${runs.own}-readings.csv`, contentType: 'text/csv', sizeBytes: Buffer.byteLength(csv) });
    expect((await engineer.get('/api/mailbox')).status).toBe(403);
  });

  it('notifies the engineers when a run finishes', async () => {
    const to = await notifyRunFinished(runs.ownUnsigned, 'completed');
    expect(to).toEqual([demoEmail('engineer')]);
    const items = (await (await admin.get('/api/mailbox')).json()).items as { to: string[]; subject: string }[];
    expect(items.some((m) => m.subject.startsWith(`Run ${runs.ownUnsigned} completed: KQ-DC2, pit `) && m.to[0] === demoEmail('engineer'))).toBe(true);
  });
});

describe('review requests', () => {
  it('tell the other engineers and admins when a run is submitted for review', async () => {
    const saved = await engineer.post(`/api/runs/${runs.ownUnsigned}/interpretations`, { chosenMethod: 'hyperbolic', reason: 'Smooth curve.' });
    expect(saved.status).toBe(201);
    expect((await engineer.post(`/api/runs/${runs.ownUnsigned}/signoff/submit`)).status).toBe(200);
    const subject = `Run ${runs.ownUnsigned} needs review: KQ-DC2, pit `;
    type Item = { to: string[]; subject: string; text: string };
    const notice = async () => ((await (await admin.get('/api/mailbox')).json()).items as Item[]).find((m) => m.subject.startsWith(subject));
    await expect.poll(notice, { timeout: 10_000 }).toBeDefined();
    const message = (await notice())!;
    expect(message.to).toEqual([demoEmail('admin')]); // the submitter is not told of their own submission
    expect(message.text).toContain('submitted run');
  });
});

describe('client portal', () => {
  it('lists only the signed reports of the client’s own organisation', async () => {
    const res = await client.get('/api/reports');
    expect(res.status).toBe(200);
    const ids = ((await res.json()).items as { runId: number }[]).map((r) => r.runId);
    expect(ids).toContain(runs.own);
    expect(ids).not.toContain(runs.other);
    expect(ids).not.toContain(runs.ownUnsigned);
    const staff = ((await (await engineer.get('/api/reports')).json()).items as { runId: number }[]).map((r) => r.runId);
    expect(staff).toEqual(expect.arrayContaining([runs.own, runs.other]));
  });

  it('downloads its own signed report and readings', async () => {
    const pdf = await client.get(`/api/runs/${runs.own}/report.pdf`);
    expect(pdf.status).toBe(200);
    expect(pdf.headers.get('content-type')).toBe('application/pdf');
    expect(
      Buffer.from(await pdf.arrayBuffer())
        .subarray(0, 5)
        .toString(),
    ).toBe('%PDF-');
    const csv = await client.get(`/api/reports/${runs.own}/readings.csv`);
    expect(csv.status).toBe(200);
    expect(await csv.text()).toBe(await (await engineer.get(`/api/runs/${runs.own}/record.csv`)).text());
  });

  it('cannot reach another organisation’s report, or its own unsigned run, by any route', async () => {
    for (const id of [runs.other, runs.ownUnsigned]) {
      expect((await client.get(`/api/runs/${id}/report.pdf`)).status).toBe(404);
      expect((await client.get(`/api/reports/${id}/readings.csv`)).status).toBe(404);
      for (const url of [
        `/api/runs/${id}/record`,
        `/api/runs/${id}/record.csv`,
        `/api/runs/${id}/stage-points.csv`,
        `/api/runs/${id}/interpretation`,
        `/api/runs/${id}/interpretations`,
        `/api/runs/${id}/signoff`,
        `/api/runs/${id}/verify`,
      ]) {
        expect((await client.get(url)).status, url).toBe(403);
      }
      expect((await client.post(`/api/runs/${id}/send`)).status).toBe(403);
    }
    expect((await client.get('/api/mailbox')).status).toBe(403);
  });
});
