import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import type { Page } from 'playwright-core';
import { sql } from 'drizzle-orm';
import { axeViolations, startBrowserHarness, signInAs, type BrowserHarness, waitForText } from './support.ts';

let h: BrowserHarness;
beforeAll(async () => {
  h = await startBrowserHarness();
});
afterAll(() => h?.close());

const sample = (name: string) => fileURLToPath(new URL(`../../seed/price-lists/${name}`, import.meta.url));

async function importFile(page: Page, supplier: RegExp, file: string, sheet?: string) {
  await page.goto('/purchasing');
  await waitForText(page.getByRole('heading', { level: 1 }), /^Purchasing$/);
  const options = await page.getByLabel('Supplier').locator('option').allTextContents();
  await page.getByLabel('Supplier').selectOption({ label: options.find((o) => supplier.test(o))! });
  await page.getByLabel(/^File/).setInputFiles(sample(file));
  await page.getByRole('button', { name: 'Upload and read' }).click();
  await waitForText(page.getByRole('heading', { level: 1 }), new RegExp(file.replace(/\./g, '\\.')));
  if (sheet) expect(await page.getByLabel('Sheet').inputValue()).toBe(sheet);
  await page.getByRole('button', { name: 'Check every row' }).click();
  await waitForText(page.locator('main'), /2\. Check rows and changes/);
}

describe('purchasing in the browser', () => {
  it('imports both demo price lists, sees the diff, applies them; sell prices follow; reorders and receives', async () => {
    const page = await h.newPage();
    await signInAs(page, 'purchasing@stackyard.test');

    // Marram: semicolons, euros written 1.234,50; one SKU twice.
    await importFile(page, /Marram/, 'marram-wholesale-2027-03.csv');
    const main = page.locator('main');
    await waitForText(main, /Row 106, column “Artikelnummer”: Supplier SKU MW\/QRB\/HEARTH-M50 is also on row 3/);
    const changes = page.getByRole('table', { name: 'Price-list changes' });
    await waitForText(changes, /MW\/\w+\/[\w-]+/);
    expect(await changes.locator('tbody tr').count()).toBeGreaterThan(5);
    expect((await axeViolations(page)).join('\n'), 'the checked import').toBe('');
    await page.getByRole('button', { name: 'Apply price list' }).click();
    await waitForText(main, /sell prices moved/);

    // Kestrel: XLSX with a notes sheet first, a bad GTIN and a new item to create.
    await importFile(page, /Kestrel/, 'kestrel-trade-supply-2027-03.xlsx', 'Price list');
    await waitForText(main, /Row 9, column “GTIN”: GTIN \d+ has a wrong check digit/);
    await page.getByRole('tab', { name: /^Flagged/ }).click();
    await waitForText(changes, /\+18 %/);
    await page.getByRole('tab', { name: /^New/ }).click();
    await waitForText(changes, /KT-990101/);
    await changes.getByRole('button', { name: 'Create a part' }).click();
    await page.getByLabel('New SKU').fill('HLM-VENT-KIT');
    await page.getByLabel('Maker').selectOption({ index: 1 });
    await page.getByRole('button', { name: 'Create as accessory' }).click();
    await waitForText(changes, /New part HLM-VENT-KIT/);
    await page.getByRole('button', { name: 'Apply price list' }).click();
    await waitForText(main, /sell prices moved/);
    await page.getByRole('link', { name: 'See what moved' }).click();
    await waitForText(main, /Price list kestrel-trade-supply-2027-03\.xlsx applied/);
    await waitForText(main, /HLM-VENT-KIT/);

    const [kit] = (await h.t.db.execute<{ list_price_cents: string }>(sql`select list_price_cents from parts where sku = 'HLM-VENT-KIT'`)).rows;
    expect(kit!.list_price_cents).toBe('5583'); // $38.50 × 1.45 accessory markup = $55.825 → $55.83 (half a cent up)

    // Reorder → one draft per supplier → sent → the warehouse books it in.
    await page.goto('/purchasing/reorder');
    await waitForText(page.getByRole('heading', { level: 1 }), /^Reorder$/);
    await page.getByRole('button', { name: /Draft purchase orders/ }).click();
    await page.getByRole('link', { name: /^PO-/ }).first().click();
    await waitForText(page.getByRole('heading', { level: 1 }), /^Purchase order PO-/);
    await page.getByRole('button', { name: 'Mark as sent' }).click();
    await waitForText(main, /Sent/);
    const orderUrl = page.url();

    const store = await h.newPage();
    await signInAs(store, 'warehouse@stackyard.test');
    await store.goto(orderUrl);
    await waitForText(store.locator('main'), /Receive goods against this order/);
    expect(await store.locator('main').textContent()).not.toMatch(/each ·|Total \(inc GST\)/); // no costs for the warehouse
    await store.getByLabel('Receiving bin (parts with no bin here yet)').fill('DOCK-1');
    // Serialised parts (modules, controllers, inverters) take one serial per unit received.
    const serialBoxes = store.getByRole('textbox', { name: /^Serials of / });
    for (let i = 0; i < (await serialBoxes.count()); i++) {
      const box = serialBoxes.nth(i);
      const units = Number(/\(\d+ of (\d+)\)/.exec((await box.getAttribute('aria-label')) ?? (await box.evaluate((el) => el.closest('label')?.textContent ?? '')))![1]);
      await box.fill(Array.from({ length: units }, (_, k) => `PO${i}-E2E-${k + 1}`).join('\n'));
    }
    await store.getByRole('button', { name: 'Book in' }).click();
    await waitForText(store.locator('main'), /Booked in as RCV-/);
    await waitForText(store.locator('main'), /Received/);
  }, 180_000);
});
