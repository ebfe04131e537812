/**
 * The console in a real browser: an operator sets up and runs a test on the simulated rig (real
 * protocols over socat pseudo-terminals), sees live values, a satisfied hold and its prompt, applies
 * it, acknowledges an alarm, resets a gauge and finishes, while an engineer watches the same run live
 * in a second browser. Screenshots per step in .artifacts/e2e/console/ (git-ignored).
 */
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROOT_DIR } from '../../server/config';
import type { RunningServer } from '../../server/main';
import type { SimulatorProcess } from '../../server/ops/simulated-rig';
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
  const started = await simulatedRig('dense-sand', 60, 'Browser rig (simulated)', server.url);
  sim = started.sim;
  rigName = started.rig.name;
}, 120_000);
afterAll(async () => {
  await browser?.close();
  await server?.close();
  await sim?.stop();
});

const signIn = (page: Page, email: string) => signInPage(page, server.url, email);

const until = (fn: () => Promise<boolean>, timeout = 60_000) => expect.poll(fn, { timeout, interval: 250 }).toBe(true);

describe('the console in a real browser', () => {
  it('runs a test from plan to finish while an engineer watches', async () => {
    const engineerApi = await new Client(server.url).signIn(demoEmail('engineer'));
    const planId = await simPlan(engineerApi, 'bearing-granular', {
      name: 'Browser console plan',
      loading: { mode: 'list', pressuresKpa: [150, 300] },
      holdRule: { kind: 'rate', maxRateMmPerMin: 0.02, windowMin: 5, minHoldMin: 10 },
    });
    const shot = screenshotter('console');
    const operator = await browser.newPage({ viewport: { width: 1280, height: 800 } });
    const errors = watchForErrors(operator);
    await signIn(operator, demoEmail('operator'));

    await operator.goto(`${server.url}/runs/new?planId=${planId}`);
    await operator.getByLabel('Rig').selectOption({ label: rigName });
    await shot(operator, 'set-up');
    await operator.getByRole('button', { name: 'Set up the run' }).click();
    await operator.waitForURL(/\/runs\/\d+$/);
    const runUrl = operator.url();

    // Live values arrive through the serial stack.
    await until(() => operator.getByText('Gauge 1').first().isVisible());
    await operator.waitForTimeout(1500);
    await shot(operator, 'preparing');
    await operator.getByRole('button', { name: /Zero gauges/ }).click();
    await operator.getByRole('button', { name: /Start \(seating\)/ }).click();

    // A second person watches the same run, read-only unless they take control.
    const engineer = await browser.newPage({ viewport: { width: 1280, height: 800 } });
    await signIn(engineer, demoEmail('engineer'));
    await engineer.goto(runUrl);
    await until(() => engineer.getByRole('button', { name: /Take control/ }).isVisible());

    // Seating hold met → the prompt names the next target and the pressure to pump to.
    await until(() => operator.getByRole('button', { name: /Apply next stage/ }).first().isVisible());
    await until(() => operator.getByText(/150/).first().isVisible());
    await shot(operator, 'seating-met-prompt');
    await operator.getByRole('button', { name: /^Apply next stage/ }).first().click();

    // A pulled cable raises an alarm the operator acknowledges.
    await fetch(`${sim.controlUrl}/fault`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ kind: 'vanish', durationS: 6, device: 'gauge-1' }) });
    const ack = operator.getByRole('button', { name: /^Acknowledge/ }).first();
    await until(() => ack.isVisible(), 20_000);
    await shot(operator, 'alarm');
    await ack.click();
    await until(async () => (await operator.getByRole('button', { name: /^Acknowledge/ }).count()) === 0 || (await operator.getByText(/^Acknowledged/).count()) > 0);

    // Wait for the 150 kPa hold, then reset gauge 2 while the load is held.
    await until(() => operator.getByText(/Holding|Hold met|hold is met/i).first().isVisible(), 60_000);
    await operator.getByRole('button', { name: /Reset a gauge/ }).click();
    await operator.getByLabel('Gauge to reset').selectOption('g2');
    await operator.getByRole('button', { name: /Keep as before/ }).click();
    await fetch(`${sim.controlUrl}/gauge-reset`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ gauge: 2 }) });
    await operator.waitForTimeout(1500);
    await shot(operator, 'gauge-reset');
    await operator.getByRole('button', { name: /Confirm after reading/ }).click();

    // Through the last stage to Finish.
    await until(() => operator.getByRole('button', { name: /Apply next stage$|Apply next stage A/ }).first().isVisible(), 90_000);
    await operator.getByRole('button', { name: /^Apply next stage/ }).first().click();
    await until(() => operator.getByRole('button', { name: /^Finish/ }).isVisible(), 120_000);
    await shot(operator, 'last-hold-met');
    await shot(engineer, 'engineer-watching');
    await operator.getByRole('button', { name: /^Finish/ }).click();
    await operator.getByRole('button', { name: 'Yes, finish' }).click(); // Finish asks once more
    await until(() => operator.getByText(/Completed/i).first().isVisible());
    await shot(operator, 'completed');
    await until(() => engineer.getByText(/Completed/i).first().isVisible());

    const runId = Number(runUrl.split('/').pop());
    const events = (await engineerApi.get(`/api/runs/${runId}/events`)).body.items.map((e: { kind: string }) => e.kind);
    expect(events).toEqual(expect.arrayContaining(['gauges-zeroed', 'run-started', 'hold-met', 'stage-advanced', 'alarm-acknowledge', 'gauge-reset', 'run-completed']));
    // The finished run interprets from its own record.
    await engineer.goto(`${server.url}/runs/${runId}/interpretation`);
    await until(() => engineer.getByRole('heading', { name: 'Ultimate pressure, by method' }).isVisible());
    await until(() => engineer.getByRole('cell', { name: /Kondner/ }).first().isVisible());
    await shot(engineer, 'interpretation-of-the-run');
    expect(errors.filter((e) => !e.includes('401'))).toEqual([]);
  }, 420_000);
});
