/**
 * QUALITY S8: the content security policy is strict and the built app still runs under it. The
 * built client is served by the real server and loaded in headless Chromium; signing in and opening
 * the main pages must not trip a single CSP refusal.
 */
import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROOT_DIR } from '../../server/config';
import type { RunningServer } from '../../server/main';
import { demoEmail } from '../support/api';
import { launchChromium, signInPage } from '../support/browser';
import { startLiveServer } from '../support/live-server';

const CLIENT_DIR = path.join(ROOT_DIR, 'dist', 'client');
let server: RunningServer;
let browser: Browser;
beforeAll(async () => {
  if (!existsSync(path.join(CLIENT_DIR, 'index.html'))) execFileSync('npx', ['vite', 'build'], { cwd: ROOT_DIR, stdio: 'ignore' });
  server = await startLiveServer({ clientDir: CLIENT_DIR });
  browser = await launchChromium();
}, 180_000);
afterAll(async () => {
  await browser?.close();
  await server?.close();
});

/** CSP refusals, both as the browser logs them and as `securitypolicyviolation` events. */
async function watchCsp(page: Page): Promise<() => Promise<string[]>> {
  const logged: string[] = [];
  page.on('console', (m) => {
    if (/Refused to|Content Security Policy/i.test(m.text())) logged.push(m.text());
  });
  await page.addInitScript(() => {
    const seen: string[] = [];
    (window as unknown as { cspViolations: string[] }).cspViolations = seen;
    document.addEventListener('securitypolicyviolation', (e) => seen.push(`${e.violatedDirective} ${e.blockedURI} at ${e.sourceFile}:${e.lineNumber}:${e.columnNumber}`));
  });
  return async () => [...logged, ...(await page.evaluate(() => (window as unknown as { cspViolations?: string[] }).cspViolations ?? []))];
}

describe('content security policy in a real browser (S8)', () => {
  it('serves the app with a strict policy', async () => {
    const res = await fetch(`${server.url}/sign-in`);
    expect(res.headers.get('content-type')).toMatch(/text\/html/);
    const csp = res.headers.get('content-security-policy') ?? '';
    expect(csp).toMatch(/script-src 'self'(;|$)/); // no 'unsafe-inline' or 'unsafe-eval' for scripts
    expect(csp).toMatch(/object-src 'none'/);
    expect(csp).toMatch(/frame-ancestors 'none'/);
  });

  it('loads the sign-in page, signs in and opens the main pages without a CSP refusal', async () => {
    const page = await browser.newPage();
    const violations = await watchCsp(page);
    const pageErrors: string[] = [];
    page.on('pageerror', (e) => pageErrors.push(e.message));
    await page.goto(`${server.url}/sign-in`);
    await page.getByLabel('E-mail').waitFor();
    expect(await violations()).toEqual([]);
    await signInPage(page, server.url, demoEmail('engineer'));
    for (const where of ['/projects', '/runs', '/instruments']) {
      await page.goto(`${server.url}${where}`);
      await page.waitForLoadState('networkidle');
      expect({ where, violations: await violations() }).toEqual({ where, violations: [] });
    }
    expect(pageErrors).toEqual([]);
    await page.close();
  });

  it('would notice a refusal: an injected inline script is blocked and reported', async () => {
    const page = await browser.newPage();
    const violations = await watchCsp(page);
    await page.goto(`${server.url}/sign-in`);
    await page.evaluate(() => {
      const s = document.createElement('script');
      s.textContent = 'window.injected = true';
      document.body.append(s);
    });
    await expect.poll(async () => (await violations()).length).toBeGreaterThan(0);
    expect(await page.evaluate(() => (window as unknown as { injected?: boolean }).injected)).toBeUndefined();
    await page.close();
  });
});
