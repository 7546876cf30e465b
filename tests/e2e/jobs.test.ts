import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { startBrowserHarness, signInAs, type BrowserHarness, waitForText } from './support.ts';

let h: BrowserHarness;
beforeAll(async () => {
  h = await startBrowserHarness();
});
afterAll(() => h?.close());

describe('jobs', () => {
  it('an installer orders a saved plan as a job, the trade desk reserves it, and both see the backorders', async () => {
    // A part the demo already has backordered: nothing of it is available.
    const [scarce] = (await h.t.db.execute<{ sku: string }>(sql`select p.sku from backorders b join parts p on p.id = b.part_id order by b.created_at limit 1`)).rows;
    expect(scarce).toBeDefined();

    const installer = await h.newPage();
    await signInAs(installer, 'installer@stackyard.test');
    await installer.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Saved plans' }).click();
    await installer.getByRole('link', { name: 'Carport, 88 Hill St' }).click();
    await installer.getByRole('link', { name: 'Order this plan' }).click();
    await waitForText(installer.getByRole('heading', { level: 1 }), /^New job$/);
    expect(await installer.getByRole('checkbox', { name: /Carport, 88 Hill St/ }).isChecked()).toBe(true);
    await installer.getByLabel('Job reference').fill('PO 5521 Hill St');
    await installer.getByRole('button', { name: '+ Add a line' }).click();
    await installer.getByLabel('SKU').fill(scarce!.sku);
    await installer.getByLabel('Qty').fill('3');
    await installer.getByRole('button', { name: 'Create job' }).click();
    await waitForText(installer.getByRole('heading', { level: 1 }), /^PO 5521 Hill St$/);
    await installer.getByRole('button', { name: 'Place order' }).click();
    await waitForText(installer.locator('main'), /Ordered/);
    // The plan's BOM lines arrived with the order, next to the extra line.
    await waitForText(installer.getByRole('table', { name: 'Job lines' }), /From plan “Carport, 88 Hill St”/);
    expect(await installer.getByRole('button', { name: 'Reserve stock' }).count()).toBe(0); // the trade desk reserves
    const jobUrl = installer.url();

    const desk = await h.newPage();
    await signInAs(desk, 'sales@stackyard.test');
    await desk.goto(jobUrl);
    await desk.getByRole('button', { name: 'Reserve stock' }).click();
    await waitForText(desk.locator('main'), /Part reserved/);
    const deskBackorders = desk.locator('section', { has: desk.getByRole('heading', { name: 'Backorders' }) });
    await waitForText(deskBackorders, new RegExp(`3 × ${scarce!.sku}`));
    await waitForText(deskBackorders, /No\. \d+ in the queue/);

    await installer.reload();
    await waitForText(installer.locator('main'), /Part reserved/);
    await waitForText(installer.locator('section', { has: installer.getByRole('heading', { name: 'Backorders' }) }), new RegExp(`3 × ${scarce!.sku}`));
    await waitForText(installer.locator('main'), /Total \(inc GST\)/);
    expect(await installer.locator('main').textContent()).not.toMatch(/On hand/i);
  });
});
