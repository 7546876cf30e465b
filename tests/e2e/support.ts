// Browser tests: the real built client served by the real app, driven in Debian's Chromium.
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { chromium, type Browser, type Page } from 'playwright-core';
import { onTestFailed } from 'vitest';
import { createTestApp, type TestApp } from '../support/app.ts';
import { seedDemo } from '../../seed/demo.ts';
import { DEMO_PASSWORD } from '../../seed/factories.ts';

const SCREENSHOTS = path.resolve('test-results/screenshots');

export interface BrowserHarness {
  t: TestApp;
  baseUrl: string;
  browser: Browser;
  newPage(): Promise<Page>;
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
    async newPage() {
      const context = await browser.newContext({ baseURL: baseUrl, viewport: { width: 1366, height: 900 }, locale: 'en-AU' });
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
