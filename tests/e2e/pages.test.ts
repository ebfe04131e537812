/**
 * Pages that read live and stored data, in a real browser: the device check of a simulated rig
 * (readings through the real serial stack) and the interpretation of an imported legacy test.
 * Screenshots in .artifacts/e2e/pages/ (git-ignored).
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROOT_DIR } from '../../server/config';
import type { RunningServer } from '../../server/main';
import type { SimulatorProcess } from '../../server/ops/simulated-rig';
import { Client, demoEmail } from '../support/api';
import { launchChromium, screenshotter, signInPage, watchForErrors } from '../support/browser';
import { startLiveServer } from '../support/live-server';
import { simulatedRig } from '../support/sim-run';

let server: RunningServer;
let browser: Browser;
let sim: SimulatorProcess;
let rigId: number;
beforeAll(async () => {
  server = await startLiveServer({ clientDir: path.join(ROOT_DIR, 'dist', 'client') });
  browser = await launchChromium();
  const started = await simulatedRig('loose-sand', 1, 'Check rig (simulated)');
  sim = started.sim;
  rigId = started.rig.id;
}, 120_000);
afterAll(async () => {
  await browser?.close();
  await server?.close();
  await sim?.stop();
});

const shot = screenshotter('pages');

describe('pages over live and stored data', () => {
  it('shows a simulated rig’s channels live on the device check page', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
    const errors = watchForErrors(page);
    await signInPage(page, server.url, demoEmail('operator'));
    await page.goto(`${server.url}/rigs/${rigId}/check`);
    await expect.poll(() => page.getByRole('heading', { name: 'Gauge 1' }).isVisible(), { timeout: 20_000 }).toBe(true);
    // Frames keep arriving through the serial stack: the counter on the page rises.
    const frames = async () => Number((await page.locator('dt:text-is("Frames ok") + dd').first().textContent()) ?? 0);
    await expect.poll(frames, { timeout: 20_000 }).toBeGreaterThan(3);
    const before = await frames();
    await expect.poll(frames, { timeout: 20_000 }).toBeGreaterThan(before);
    await shot(page, 'device-check');
    expect(errors.filter((e) => !e.includes('401'))).toEqual([]);
    await page.close();
  });

  it('interprets an imported legacy test', async () => {
    const engineer = await new Client(server.url).signIn(demoEmail('engineer'));
    const content = readFileSync(path.join(ROOT_DIR, 'tests', 'fixtures', 'records', 'sand-bearing-450-square.csv'), 'utf8');
    const imported = await engineer.post('/api/imports', { locationId: 1, format: 'csv', content });
    expect(imported.status).toBe(201);
    const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
    const errors = watchForErrors(page);
    await signInPage(page, server.url, demoEmail('engineer'));
    await page.goto(`${server.url}/runs/${imported.body.runId}/interpretation`);
    await expect.poll(() => page.getByRole('heading', { name: 'Ultimate pressure, by method' }).isVisible(), { timeout: 20_000 }).toBe(true);
    await page.waitForTimeout(1000);
    await shot(page, 'interpretation-imported');
    await expect.poll(() => page.getByRole('cell', { name: /Kondner/i }).first().isVisible()).toBe(true);
    await expect.poll(() => page.getByText(/one plate at one spot/i).first().isVisible()).toBe(true);
    expect(errors.filter((e) => !e.includes('401'))).toEqual([]);
    await page.close();
  });
});
