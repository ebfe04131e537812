import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { type Browser, type Page, chromium } from 'playwright-core';
import { ROOT_DIR } from '../../server/config';
import { findBinary } from '../../server/ops/debian';
import { DEMO_PASSWORD } from '../../server/seed/demo';

/** Debian's Chromium, headless, with the flags this closed network needs (no background traffic). */
export async function launchChromium(): Promise<Browser> {
  const executablePath = findBinary('chromium') ?? findBinary('chromium-browser');
  if (!executablePath) throw new Error('chromium not found: npm test installs Debian\'s "chromium" when run as root');
  return chromium.launch({
    executablePath,
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--disable-dev-shm-usage'],
  });
}

/** Saves numbered screenshots of one scenario under .artifacts/e2e/<scenario>/ (git-ignored). */
export function screenshotter(scenario: string) {
  const dir = path.join(ROOT_DIR, '.artifacts', 'e2e', scenario);
  mkdirSync(dir, { recursive: true });
  let n = 0;
  return async (page: Page, step: string) => {
    n += 1;
    await page.screenshot({ path: path.join(dir, `${String(n).padStart(2, '0')}-${step}.png`), fullPage: true });
  };
}

/** Collects page errors and failed API calls so a test can assert there were none. */
export function watchForErrors(page: Page): string[] {
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(`pageerror: ${e.message}`));
  page.on('console', (m) => {
    if (m.type() === 'error') errors.push(`console: ${m.text()}`);
  });
  page.on('response', (r) => {
    if (r.url().includes('/api/') && r.status() >= 500) errors.push(`${r.status()} ${r.url()}`);
  });
  return errors;
}

/** Signs in through the sign-in page with a demo account's password. */
export async function signInPage(page: Page, baseUrl: string, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
}
