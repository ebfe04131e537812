/**
 * From a finished run to the client's inbox in real browsers alone. The run is a stored one with a note
 * about the weather (running a test and taking notes on the console are the console tests' part): the
 * operator finds it finished on its console; the engineer replays the run, adds a pit photo
 * from the console, interprets it, submits and signs it, and e-mails the report; an admin sees the message in the
 * mailbox; the client signs in and downloads the signed PDF. Screenshots in .artifacts/e2e/signoff/.
 */
import { writeFileSync } from 'node:fs';
import path from 'node:path';
import type { Browser } from 'playwright-core';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROOT_DIR } from '../../server/config';
import type { RunningServer } from '../../server/main';
import { DEMO_PASSWORD } from '../../server/seed/demo';
import { Client, demoEmail } from '../support/api';
import { launchChromium, screenshotter, signInPage, watchForErrors } from '../support/browser';
import { startLiveServer } from '../support/live-server';
import { pdfText } from '../support/pdf';
import { simPlan } from '../support/sim-run';
import { storedBearingRun } from '../support/stored-run';

let server: RunningServer;
let browser: Browser;
let runId: number;

beforeAll(async () => {
  // One engineer drives the whole flow in the browser, so the second-signer rule (integration-tested) is off here.
  server = await startLiveServer({ clientDir: path.join(ROOT_DIR, 'dist', 'client'), secondSigner: false });
  browser = await launchChromium();
  // A short bearing test at a Harrowgate Freight pit, finished.
  const engineer = await new Client(server.url).signIn(demoEmail('engineer'));
  const pressuresKpa = [150, 300, 450, 600];
  const planId = await simPlan(engineer, 'bearing-granular', {
    name: 'Sign-off plan',
    loading: { mode: 'list', pressuresKpa },
    holdRule: { kind: 'rate', maxRateMmPerMin: 0.02, windowMin: 5, minHoldMin: 10 },
    footing: { shape: 'square', widthM: 1.5, lengthM: null, soilBehaviour: 'cohesionless' },
  });
  runId = await storedBearingRun(server.sequelize, planId, 'Sign-off', pressuresKpa, { notes: [[30, { text: 'Bright, dry, 11 °C', topic: 'weather' }]] });
}, 120_000);
afterAll(async () => {
  await browser?.close();
  await server?.close();
});

/** A small photo-like JPEG (a gradient), made with sharp. */
async function pitPhoto(): Promise<Buffer> {
  const [width, height] = [480, 360];
  const pixels = Buffer.alloc(width * height * 3);
  for (let i = 0; i < width * height; i++) pixels.set([120, (i % width) % 256, Math.floor(i / width) % 256], i * 3);
  return sharp(pixels, { raw: { width, height, channels: 3 } }).jpeg().toBuffer();
}

const until = (fn: () => Promise<boolean>, timeout = 30_000) => expect.poll(fn, { timeout, interval: 250 }).toBe(true);

describe('replay, interpretation, sign-off and delivery in real browsers', () => {
  it('takes a run from the console to a signed report in the client’s hands', async () => {
    const shot = screenshotter('signoff');

    // The finished run's console shows its log, with the operator's note about the weather (taken while it ran).
    const rigPage = await browser.newPage({ viewport: { width: 1280, height: 800 } });
    await signInPage(rigPage, server.url, demoEmail('operator'));
    await rigPage.goto(`${server.url}/runs/${runId}`);
    await until(() => rigPage.getByRole('list', { name: 'Run log' }).getByText('Bright, dry, 11 °C').isVisible());
    await shot(rigPage, 'run-note');

    const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
    const errors = watchForErrors(page);
    await signInPage(page, server.url, demoEmail('engineer'));

    await page.goto(`${server.url}/runs/${runId}/replay`);
    await until(() => page.locator('canvas').first().isVisible());
    await shot(page, 'replay');

    // A pit photo from the console's folded panel: it goes on the run's report.
    await page.goto(`${server.url}/runs/${runId}`);
    const photos = page.getByRole('region', { name: 'Pit photos' });
    await photos.getByText('Pit photos').click();
    const add = photos.getByRole('form', { name: 'Add photos' });
    await add.getByLabel('Caption (optional)').fill('Plate and jack after the last stage');
    await add.getByLabel('Choose photos').setInputFiles({ name: 'pit.jpg', mimeType: 'image/jpeg', buffer: await pitPhoto() });
    await add.getByRole('button', { name: 'Upload 1 photo' }).click();
    await until(() => add.getByText('1 photo added.').isVisible());
    await until(() => photos.locator('img').first().evaluate((img) => (img as HTMLImageElement).naturalWidth > 0));
    await shot(page, 'console-pit-photo');

    await page.goto(`${server.url}/runs/${runId}/interpretation`);
    await until(() => page.getByRole('heading', { name: 'Ultimate pressure, by method' }).isVisible());
    const save = page.getByRole('form', { name: 'Save interpretation' });
    await save.getByLabel('Chosen ultimate method').selectOption({ index: 1 });
    await save.getByLabel('Reason').fill('Clear break in the log–log plot; the other methods bracket it.');
    await shot(page, 'interpretation');
    await save.getByRole('button', { name: 'Save interpretation' }).click();
    await until(async () => (await page.getByText('No interpretation saved yet.').count()) === 0);
    await shot(page, 'interpretation-saved');

    await page.goto(`${server.url}/runs/${runId}/signoff`);
    await until(() => page.getByRole('region', { name: 'Photos on the report' }).getByText('Plate and jack after the last stage').first().isVisible());
    await page.getByRole('button', { name: /Submit the newest interpretation/ }).click();
    const sign = page.getByRole('form', { name: 'Sign' });
    await until(() => sign.isVisible());
    await sign.getByLabel('Meaning of the signature').selectOption('approved');
    await sign.getByLabel('Your password').fill('not-my-password');
    await sign.getByRole('button', { name: 'Sign' }).click();
    await until(() => sign.getByText(/does not match/i).first().isVisible());
    await expect.poll(() => page.getByText('None yet.').isVisible()).toBe(true); // a wrong password signs nothing
    await sign.getByLabel('Your password').fill(DEMO_PASSWORD);
    await sign.getByRole('button', { name: 'Sign' }).click();
    await until(() => page.getByRole('button', { name: 'E-mail the report to the client' }).isVisible());
    await shot(page, 'signed');
    await page.getByRole('button', { name: 'E-mail the report to the client' }).click();
    await until(() => page.getByText(/sent|e-mailed/i).first().isVisible());
    expect(errors.filter((e) => !e.includes('401') && !e.includes('403'))).toEqual([]);

    const admin = await browser.newPage({ viewport: { width: 1280, height: 800 } });
    await signInPage(admin, server.url, demoEmail('admin'));
    await admin.goto(`${server.url}/mailbox`);
    await until(() => admin.getByText(/projects@harrowgate\.example/).first().isVisible());
    await shot(admin, 'mailbox');

    const client = await browser.newPage({ viewport: { width: 375, height: 740 } });
    await signInPage(client, server.url, demoEmail('client'));
    await client.goto(`${server.url}/reports`);
    const pdfLink = client.getByRole('link', { name: 'Report (PDF)' }).first();
    await until(() => pdfLink.isVisible());
    await shot(client, 'client-reports');
    const pdf = await client.request.get(new URL((await pdfLink.getAttribute('href'))!, server.url).toString());
    expect(pdf.status()).toBe(200);
    expect(pdf.headers()['content-type']).toContain('application/pdf');
    expect((await pdf.body()).subarray(0, 5).toString()).toBe('%PDF-');
    writeFileSync(path.join(ROOT_DIR, '.artifacts', 'e2e', 'signoff', 'client-report.pdf'), await pdf.body()); // to look at
    const { text } = await pdfText(await pdf.body());
    expect(text).toContain('Pit (this run): Plate and jack after the last stage');
    expect(text).toContain('Weather: Bright, dry, 11 °C');
  }, 600_000);
});
