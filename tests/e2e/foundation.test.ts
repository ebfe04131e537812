/**
 * Browser end-to-end in Debian's headless Chromium against the real server and MariaDB: an engineer
 * signs in, creates a project, a test location and a test plan, sees them listed, and signs out.
 * A screenshot per step lands in .artifacts/e2e/foundation/ (git-ignored).
 */
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROOT_DIR } from '../../server/config';
import type { RunningServer } from '../../server/main';
import { launchChromium, screenshotter, signInPage, watchForErrors } from '../support/browser';
import { startLiveServer } from '../support/live-server';

let server: RunningServer;
let browser: Browser;
beforeAll(async () => {
  server = await startLiveServer({ clientDir: path.join(ROOT_DIR, 'dist', 'client') });
  browser = await launchChromium();
});
afterAll(async () => {
  await browser?.close();
  await server?.close();
});

const signIn = (page: Page, email: string) => signInPage(page, server.url, email);

describe('foundation in a real browser', () => {
  it('signs in, creates a project, a location and a plan, lists them, and signs out', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
    const errors = watchForErrors(page);
    const shot = screenshotter('foundation');

    await page.goto(`${server.url}/`);
    await page.waitForURL(/\/sign-in/);
    await shot(page, 'sign-in');
    await page.getByLabel('E-mail').fill('engineer@settlescope.example');
    await page.getByLabel('Password').fill('wrong-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect.poll(() => page.getByText('E-mail or password is not correct.').isVisible()).toBe(true);
    await signIn(page, 'engineer@settlescope.example');
    await shot(page, 'home');

    await page.goto(`${server.url}/projects/new`);
    await page.getByLabel('Project code').fill('E2E-01');
    await page.getByLabel('Project name').fill('Browser trial warehouse');
    await page.getByLabel('Client organisation').selectOption({ label: 'Harrowgate Freight Ltd' });
    await page.getByLabel('Site', { exact: true }).fill('Trial Yard, Brackwater');
    await shot(page, 'project-form');
    await page.getByRole('button', { name: 'Create project' }).click();
    await page.waitForURL(/\/projects\/\d+$/);
    await expect.poll(() => page.getByRole('heading', { name: /Browser trial warehouse/ }).isVisible()).toBe(true);
    await shot(page, 'project-created');

    await page.getByRole('link', { name: 'New location' }).click();
    await page.getByLabel('Pit id').fill('E2E-P1');
    await page.getByLabel('Test depth').fill('1.2');
    await page.getByLabel('Pit width').fill('1.5');
    await page.getByRole('button', { name: 'Create location' }).click();
    await page.waitForURL(/\/locations\/\d+$/);
    await shot(page, 'location-created');

    await page.getByRole('link', { name: 'New plan' }).click();
    await page.getByLabel('Procedure').selectOption('bearing-granular');
    await page.getByLabel('Plan name').fill('E2E bearing plan');
    await page.getByLabel('Reaction capacity').fill('300');
    // The plan checks itself: a 450 mm plate needs a 2.25 m pit, this one is 1.5 m.
    await shot(page, 'plan-form-with-checks');
    await expect.poll(() => page.getByText(/2\.25 m/).first().isVisible()).toBe(true);
    await page.getByRole('button', { name: 'Create plan' }).click();
    await page.waitForURL(/\/plans\/\d+$/);
    await expect.poll(() => page.getByText('E2E bearing plan').first().isVisible()).toBe(true);
    await shot(page, 'plan-created');

    await page.goto(`${server.url}/projects`);
    await expect.poll(() => page.getByText('E2E-01').isVisible()).toBe(true);
    await shot(page, 'projects-list');

    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(/\/sign-in/);
    await shot(page, 'signed-out');
    const me = await page.evaluate(() => fetch('/api/auth/me').then((r) => r.status));
    expect(me).toBe(401);
    expect(errors.filter((e) => !e.includes('401'))).toEqual([]);
    await page.close();
  });

  it('works at phone width', async () => {
    const page = await browser.newPage({ viewport: { width: 375, height: 740 } });
    await signIn(page, 'operator@settlescope.example');
    await page.goto(`${server.url}/projects`);
    await expect.poll(() => page.getByText('KQ-DC2').isVisible()).toBe(true);
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow).toBeLessThanOrEqual(1);
    await screenshotter('foundation')(page, 'phone-projects');
    await page.close();
  });
});
