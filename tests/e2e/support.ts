// Browser tests: the real built client served by the real app, driven in Debian's Chromium.
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { chromium, type Browser, type Locator, type Page } from 'playwright-core';
import { expect, onTestFailed } from 'vitest';
import { createTestApp, type TestApp } from '../support/app.ts';
import { seedDemo } from '../../seed/demo.ts';
import { DEMO_PASSWORD } from '../../seed/factories.ts';
import { createRequire } from 'node:module';
import { readFileSync } from 'node:fs';

/** axe-core's browser build, evaluated in the page (a script tag would be refused by our own CSP). */
const AXE_SOURCE = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');

const SCREENSHOTS = path.resolve('test-results/screenshots');

export interface BrowserHarness {
  t: TestApp;
  baseUrl: string;
  browser: Browser;
  /** A fresh browser context and page, at desk width unless a viewport is given. */
  newPage(viewport?: { width: number; height: number }): Promise<Page>;
  close(): Promise<void>;
}

export async function startBrowserHarness(): Promise<BrowserHarness> {
  const server: Server = createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const t = await createTestApp({ clientDir: 'dist/client', baseURL: baseUrl });
  await seedDemo(t.db, t.auth, t.services.partsIndex);
  server.on('request', t.app);
  const browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    // playwright gives each launch a fresh throwaway profile itself (and refuses --user-data-dir).
  });
  return {
    t,
    baseUrl,
    browser,
    async newPage(viewport = { width: 1366, height: 900 }) {
      const context = await browser.newContext({ baseURL: baseUrl, viewport, locale: 'en-AU' });
      const page = await context.newPage();
      onTestFailed(async ({ task }) => {
        mkdirSync(SCREENSHOTS, { recursive: true });
        await page.screenshot({ path: path.join(SCREENSHOTS, `${task.name.replace(/[^a-z0-9]+/gi, '-')}.png`), fullPage: true }).catch(() => {});
      });
      return page;
    },
    async close() {
      await browser.close();
      await new Promise((r) => server.close(r));
      await t.close();
    },
  };
}

export async function signInAs(page: Page, email: string, password = DEMO_PASSWORD) {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
}

/** axe-core's WCAG checks on the page as it stands: the violations, as "rule: selector" lines (none is the goal). */
export async function axeViolations(page: Page): Promise<string[]> {
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(AXE_SOURCE);
  const violations = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run(ctx: Document, opts: object): Promise<{ violations: { id: string; help: string; nodes: { target: unknown[] }[] }[] }> } }).axe;
    const result = await axe.run(document, { resultTypes: ['violations'] });
    return result.violations.map((v) => ({ id: v.id, help: v.help, targets: v.nodes.map((n) => String(n.target[0])) }));
  });
  return violations.map((v) => `${v.id} (${v.help}): ${v.targets.slice(0, 5).join(', ')}`);
}

/** Waits until the element's text matches (the app renders as answers arrive). */
export async function waitForText(locator: Locator, pattern: RegExp, timeout = 15_000) {
  await expect.poll(async () => (await locator.textContent()) ?? '', { timeout }).toMatch(pattern);
}
