// The installer's whole card flow in the browser: plan, save, order as a job, pay on the payment
// stand-in's checkout, see the job ordered, and the confirmation e-mail in the admin's outbox.
// Southerly Solar & Storage (installer2@) pays by card in the demo; Brightgum (installer@) is on
// trade account terms and is invoiced instead.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startBrowserHarness, signInAs, type BrowserHarness, waitForText } from './support.ts';
import type { TestMail } from '../support/app.ts';

let h: BrowserHarness;
let mail: TestMail;
beforeAll(async () => {
  h = await startBrowserHarness();
  h.t.pay.webhookUrl = `${h.baseUrl}/api/payments/webhook`;
  mail = await h.t.startMail();
}, 60_000);
afterAll(() => h?.close());

describe('the installer portal', () => {
  it('an installer on card terms plans, orders, pays on the checkout, and the confirmation is in the outbox', async () => {
    const page = await h.newPage();
    await signInAs(page, 'installer2@stackyard.test');
    await waitForText(page.getByRole('heading', { name: 'Needs your attention' }), /Needs your attention/);

    await page.goto('/planner?range=QRB-HEARTH&modules=2');
    await waitForText(page.locator('main'), /Stock checked just now/);
    await page.getByRole('button', { name: 'Save as draft' }).click();
    await page.getByLabel('Plan name').fill('Boatshed, 2 Pier St');
    await page.getByRole('button', { name: 'Save draft' }).click();
    await waitForText(page.getByRole('heading', { level: 1 }), /^Boatshed, 2 Pier St$/);
    await page.getByRole('link', { name: 'Order this plan' }).click();
    await page.getByLabel('Job reference').fill('SS-0400 Pier St');
    await page.getByRole('button', { name: 'Create job' }).click();
    await waitForText(page.getByRole('heading', { level: 1 }), /^SS-0400 Pier St$/);

    // A card account orders by paying: no "Place order" for the installer.
    await waitForText(page.locator('main'), /Pay by card to place this order/);
    expect(await page.getByRole('button', { name: 'Place order' }).count()).toBe(0);
    await page.getByRole('button', { name: 'Pay by card' }).click();
    await page.waitForURL(/\/checkout\/cs_test_/);
    const amount = Number((await page.locator('body').textContent())!.match(/AUD (\d+\.\d\d)/)![1]);
    expect(amount).toBeGreaterThan(1000); // a two-module stack with its accessories, inc GST
    await page.getByRole('button', { name: /^Pay AUD/ }).click();

    await page.waitForURL(/\/jobs\/[0-9a-f-]+\?paid=1$/);
    const paid = amount.toLocaleString('en-AU', { style: 'currency', currency: 'AUD' });
    await waitForText(page.locator('main'), new RegExp(`Paid by card: ${paid.replace(/[$.]/g, '\\$&')}`));
    await waitForText(page.locator('main'), /Ordered/);
    expect(await page.getByRole('button', { name: 'Pay by card' }).count()).toBe(0);
    expect(await page.getByRole('link', { name: 'Tax invoice (PDF)' }).getAttribute('href')).toMatch(/\/api\/jobs\/[0-9a-f-]+\/invoice\.pdf$/);

    // The admin reads the confirmation in the outbox, sent through the SMTP stand-in.
    await mail.settled();
    const admin = await h.newPage();
    await signInAs(admin, 'admin@stackyard.test');
    await admin.goto('/admin/outbox');
    await admin.getByLabel('Recipient').fill('installer2@');
    const row = admin.getByRole('table', { name: 'Outbox' }).getByRole('link', { name: /We have your order SS-0400 Pier St/ });
    await row.waitFor();
    await waitForText(admin.getByRole('table', { name: 'Outbox' }), /Payment received for SS-0400 Pier St/);
    await row.click();
    await waitForText(admin.getByRole('heading', { level: 1 }), /^We have your order SS-0400 Pier St$/);
    await waitForText(admin.locator('main'), /Sent/);
    const frame = admin.frameLocator('iframe[title^="HTML part"]');
    await waitForText(frame.locator('body'), /Paid by card\./);
    expect(await admin.locator('iframe').getAttribute('sandbox')).toBe('');
    await admin.getByRole('button', { name: 'Plain text' }).click();
    await waitForText(admin.locator('pre'), /Total inc GST: \$/);
  }, 120_000);
});
