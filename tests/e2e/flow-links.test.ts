/**
 * From a plan to the client's download by links and buttons only: after signing in, no page is opened by
 * its address. The operator finds the plan among the next runs on Home, runs it on the simulated rig to
 * the end, the engineer finds it in the queue to interpret, interprets, goes on to review and signs, and
 * the client finds the report under Reports. Any step that would need a typed address fails the test
 * (every page after sign-in is reached by a click, and the test asserts where each click lands).
 * Screenshots in .artifacts/e2e/flow-links/ (git-ignored).
 */
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROOT_DIR } from '../../server/config';
import type { RunningServer } from '../../server/main';
import type { SimulatorProcess } from '../../server/ops/simulated-rig';
import { DEMO_PASSWORD } from '../../server/seed/demo';
import { Client, demoEmail } from '../support/api';
import { launchChromium, screenshotter, signInPage, watchForErrors } from '../support/browser';
import { startLiveServer } from '../support/live-server';
import { simPlan, simulatedRig } from '../support/sim-run';

let server: RunningServer;
let browser: Browser;
let sim: SimulatorProcess;
let rigName: string;
beforeAll(async () => {
  server = await startLiveServer({ clientDir: path.join(ROOT_DIR, 'dist', 'client') });
  browser = await launchChromium();
  const started = await simulatedRig('dense-sand', 60, 'Flow rig (simulated)', server.url); // the demo's automatic operator works the pump
  sim = started.sim;
  rigName = started.rig.name;
}, 120_000);
afterAll(async () => {
  await browser?.close();
  await server?.close();
  await sim?.stop();
});

const until = (fn: () => Promise<boolean>, timeout = 60_000) => expect.poll(fn, { timeout, interval: 250 }).toBe(true);

/** A page that may only move by clicks: every address it shows after sign-in must come from one. */
async function signedInPage(
  role: 'operator' | 'engineer' | 'admin' | 'client',
  viewport = { width: 1024, height: 768 },
): Promise<{ page: Page; errors: string[] }> {
  const page = await browser.newPage({ viewport });
  const errors = watchForErrors(page);
  await signInPage(page, server.url, demoEmail(role));
  return { page, errors };
}

describe('from plan to the client’s report without typing an address', () => {
  it('goes plan → run → interpretation → review and signature → client’s download by links and buttons', async () => {
    const shot = screenshotter('flow-links');
    const engineerApi = await new Client(server.url).signIn(demoEmail('engineer'));
    const planName = 'Flow plan, pit by the gate';
    await simPlan(engineerApi, 'bearing-granular', {
      name: planName,
      loading: { mode: 'list', pressuresKpa: [100, 200, 300] },
      holdRule: { kind: 'fixed', durationMin: 1 },
    });

    // The operator: Home → next runs → set-up → console, through to Finish.
    const { page: operator, errors: operatorErrors } = await signedInPage('operator');
    await operator.getByRole('link', { name: `Set up the run of ${planName}` }).click();
    await operator.waitForURL(/\/runs\/new\?planId=\d+$/);
    await operator.getByLabel('Rig').selectOption({ label: rigName });
    await operator.getByRole('button', { name: 'Set up the run' }).click();
    await operator.waitForURL(/\/runs\/\d+$/);
    const runId = Number(new URL(operator.url()).pathname.split('/').pop());
    await until(() => operator.getByText('Gauge 1').first().isVisible());
    await operator.getByRole('button', { name: /Zero gauges/ }).click();
    await operator.getByRole('button', { name: 'Start (seating)' }).click();
    const next = operator.getByRole('button', { name: /^Apply next stage/ });
    const finish = operator.getByRole('button', { name: /^Finish/ });
    await until(async () => {
      if (await finish.isVisible()) return true;
      if (await next.isVisible()) await next.click({ timeout: 5_000 }).catch(() => undefined);
      return false;
    }, 240_000);
    await finish.click();
    await operator.getByRole('button', { name: 'Yes, finish' }).click();
    await until(() => operator.getByRole('navigation', { name: 'After the run' }).isVisible());
    await shot(operator, 'console-finished');
    expect(operatorErrors.filter((e) => !e.includes('401'))).toEqual([]);

    // The engineer: Home → "To interpret" → interpretation → on to review and sign-off → submit → sign.
    const { page: engineer, errors: engineerErrors } = await signedInPage('engineer');
    const queue = engineer.getByRole('region', { name: /To interpret/ });
    await until(() => queue.getByRole('link', { name: `Interpret: run ${runId}` }).isVisible());
    await shot(engineer, 'engineer-queues');
    await queue.getByRole('link', { name: `Interpret: run ${runId}` }).click();
    await engineer.waitForURL(new RegExp(`/runs/${runId}/interpretation$`));
    const save = engineer.getByRole('form', { name: 'Save interpretation' });
    await until(() => save.isVisible());
    await save.getByLabel('Chosen ultimate method').selectOption({ index: 1 });
    await save.getByLabel('Reason').fill('Smooth curve; the chosen method sits between the others.');
    await save.getByRole('button', { name: 'Save interpretation' }).click();
    await until(async () => (await engineer.getByText('No interpretation saved yet.').count()) === 0);
    await engineer.getByRole('link', { name: 'On to review and sign-off' }).click();
    await engineer.waitForURL(new RegExp(`/runs/${runId}/signoff$`));
    await engineer.getByRole('button', { name: /Submit the newest interpretation/ }).click();
    await until(() =>
      engineer
        .getByText(/Submitted for review/)
        .first()
        .isVisible(),
    );
    await shot(engineer, 'submitted');
    expect(engineerErrors.filter((e) => !e.includes('401') && !e.includes('403'))).toEqual([]);

    // Someone other than the submitter signs: the admin, from the "To sign" queue on Home.
    const { page: admin, errors: adminErrors } = await signedInPage('admin');
    const toSign = admin.getByRole('region', { name: /To sign/ });
    await until(() => toSign.getByRole('link', { name: `Sign: run ${runId}` }).isVisible());
    await toSign.getByRole('link', { name: `Sign: run ${runId}` }).click();
    await admin.waitForURL(new RegExp(`/runs/${runId}/signoff$`));
    const sign = admin.getByRole('form', { name: 'Sign' });
    await until(() => sign.isVisible());
    await sign.getByLabel('Meaning of the signature').selectOption('approved');
    await sign.getByLabel('Your password').fill(DEMO_PASSWORD);
    await sign.getByRole('button', { name: 'Sign' }).click();
    await until(() => admin.getByRole('button', { name: 'E-mail the report to the client' }).isVisible()).catch(async (err) => {
      await shot(admin, 'did-not-sign'); // what the page said, to see why
      throw err;
    });
    await shot(admin, 'signed');
    // Staff Reports lists it as signed.
    await admin.getByRole('link', { name: 'All reports' }).click();
    await admin.waitForURL(/\/reports$/);
    await admin.getByLabel('State').selectOption('signed');
    await until(() => admin.getByRole('cell', { name: String(runId), exact: true }).isVisible());
    await shot(admin, 'staff-reports');
    expect(adminErrors.filter((e) => !e.includes('401') && !e.includes('403'))).toEqual([]);

    // The client: the menu's Reports → the signed report's PDF.
    const { page: client, errors: clientErrors } = await signedInPage('client', { width: 390, height: 844 });
    await client.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Reports' }).click();
    await client.waitForURL(/\/reports$/);
    const pdfLink = client.getByRole('link', { name: 'Report (PDF)' }).first();
    await until(() => pdfLink.isVisible());
    await shot(client, 'client-reports');
    const href = (await pdfLink.getAttribute('href')) ?? '';
    expect(href).toBe(`/api/runs/${runId}/report.pdf`);
    const pdf = await client.request.get(new URL(href, server.url).toString());
    expect(pdf.status()).toBe(200);
    expect((await pdf.body()).subarray(0, 5).toString()).toBe('%PDF-');
    expect(clientErrors.filter((e) => !e.includes('401'))).toEqual([]);
  }, 420_000);
});
