import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFile } from 'node:fs/promises';
import { PDFDocument } from 'pdf-lib';
import { sql } from 'drizzle-orm';
import { startBrowserHarness, signInAs, type BrowserHarness, waitForText } from './support.ts';
import { pdfText } from '../support/pdf-text.ts';

let h: BrowserHarness;
beforeAll(async () => {
  h = await startBrowserHarness();
});
afterAll(() => h?.close());

describe('picking', () => {
  it('picks a whole demo job by typing scans, keeps scans made offline, then prints its labels and handover sheet', async () => {
    const [job] = (await h.t.db.execute<{ id: string }>(sql`select id from jobs where reference = 'BG-2041 Fern St'`)).rows;
    const lines = (
      await h.t.db.execute<{ sku: string; qty: number; category: string }>(sql`
        select p.sku, jl.qty, p.category from job_lines jl join parts p on p.id = jl.part_id where jl.job_id = ${job!.id} order by jl.line_no`)
    ).rows;
    const units = lines.reduce((n, l) => n + l.qty, 0);

    const page = await h.newPage();
    await signInAs(page, 'warehouse@stackyard.test');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Picking' }).click();
    await page.getByRole('link', { name: 'BG-2041 Fern St' }).click();
    await waitForText(page.getByRole('heading', { level: 1 }), /^Pick BG-2041 Fern St$/);
    const scanField = page.getByLabel('Scan or type a code, then Enter');
    await expect.poll(() => scanField.evaluate((el) => el === document.activeElement)).toBe(true);
    const progress = page.getByText(/of \d+ units ·/);
    const feedback = page.getByTestId('scan-feedback');

    // A wedge scanner types into whatever has focus and ends with Enter: the scan field keeps it.
    let picked = 0;
    const scan = async (code: string, counts: number) => {
      await page.keyboard.type(`${code}\n`);
      picked += counts;
      await waitForText(progress, new RegExp(`^${picked} of ${units} units`));
    };

    await page.keyboard.type('NOT-A-PART-999\n');
    await waitForText(feedback, /Refused: NOT-A-PART-999/);
    await waitForText(feedback, /Expected: /);
    expect(await feedback.getAttribute('data-ok')).toBe('false');

    let serial = 0;
    for (const [i, l] of lines.entries()) {
      if (['module', 'controller', 'inverter'].includes(l.category)) {
        await page.keyboard.type(`${l.sku}\n`);
        await waitForText(feedback, new RegExp(`${l.sku}: now scan the serial of each unit`));
        for (let u = 0; u < l.qty; u++) await scan(`E2E-${String(++serial).padStart(4, '0')}`, 1);
      } else if (i === 1 && l.qty > 1) {
        // A quantity keyed once, then the part scanned.
        await page.getByLabel('Quantity (leave empty for 1)').fill(String(l.qty));
        await scanField.click();
        await scan(l.sku, l.qty);
      } else if (l.sku === lines.at(-1)!.sku) {
        // The last part is scanned in a Wi-Fi dead spot: it waits on the device and goes when the link is back.
        await page.context().setOffline(true);
        for (let u = 0; u < l.qty; u++) await page.keyboard.type(`${l.sku}\n`);
        await waitForText(page.locator('main'), new RegExp(`${l.qty} scans? waiting to send`));
        await page.context().setOffline(false);
        picked += l.qty;
        await waitForText(progress, new RegExp(`^${picked} of ${units} units`), 30_000);
      } else for (let u = 0; u < l.qty; u++) await scan(l.sku, 1);
    }
    expect(await feedback.getAttribute('data-ok')).toBe('true');
    await page.getByRole('button', { name: 'Complete pick' }).click();
    await waitForText(page.locator('main'), /Pick complete/);
    await waitForText(page.locator('main'), new RegExp(`${units} units issued with ${serial} serials`));

    const [status] = (await h.t.db.execute<{ status: string }>(sql`select status from jobs where id = ${job!.id}`)).rows;
    expect(status!.status).toBe('ready');

    // Labels: the preview, then the A4 sheet as a file.
    await page.getByRole('link', { name: 'Labels' }).click();
    await waitForText(page.getByRole('heading', { level: 1 }), /^Labels$/);
    const [a4] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'A4 sheets (PDF)' }).click()]);
    const sheet = await PDFDocument.load(await readFile((await a4.path())!));
    const count = Number(/^(\d+) labels/.exec((await page.getByText(/^\d+ labels:/).textContent()) ?? '')![1]);
    expect(sheet.getPageCount()).toBe(Math.ceil(count / 21));

    // The handover sheet lists every serial captured.
    await page.goto(`/jobs/${job!.id}/handover`);
    await waitForText(page.getByRole('heading', { level: 1 }), /^Handover BG-2041 Fern St$/);
    const [pdf] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download PDF' }).click()]);
    const { text } = await pdfText(await readFile((await pdf.path())!));
    for (let s = 1; s <= serial; s++) expect(text).toContain(`E2E-${String(s).padStart(4, '0')}`);
  }, 180_000);

  it('counts a bin by scanning and posts the difference as a count correction with who and when', async () => {
    const [level] = (
      await h.t.db.execute<{ warehouse: string; bin: string; sku: string; on_hand: number }>(sql`
        select w.code as warehouse, l.bin, p.sku, l.on_hand from stock_levels l join warehouses w on w.id = l.warehouse_id join parts p on p.id = l.part_id
        where l.on_hand between 1 and 8 and p.category not in ('module', 'controller', 'inverter')
          and not exists (select 1 from stock_levels o where o.warehouse_id = l.warehouse_id and o.bin = l.bin and o.reserved > 0)
        order by l.on_hand, w.code, l.bin limit 1`)
    ).rows;
    expect(level).toBeDefined();
    const page = await h.newPage();
    await signInAs(page, 'warehouse@stackyard.test');
    await page.goto('/stock/entry?tab=count');
    await page.getByLabel('Warehouse').selectOption(level!.warehouse);
    await page.getByRole('combobox', { name: 'Bin', exact: true }).fill(level!.bin);
    await page.getByRole('button', { name: 'Start counting' }).click();
    const field = page.getByLabel("Scan or type a part's code, then Enter");
    // One more on the shelf than the book says.
    for (let i = 0; i <= level!.on_hand; i++) {
      await field.fill(level!.sku);
      await field.press('Enter');
      await waitForText(page.locator('main'), new RegExp(`Counted 1 × ${level!.sku}`));
      await expect.poll(() => page.getByLabel(`Counted ${level!.sku}`).inputValue()).toBe(String(i + 1));
    }
    await page.getByRole('button', { name: 'Post the count' }).click();
    await waitForText(page.locator('main'), new RegExp(`${level!.sku}: \\+1 \\(CNT-`));
    const [moved] = (
      await h.t.db.execute<{ qty: number; by: string; reason: string }>(sql`
        select m.qty, u.email as by, m.reason from stock_movements m join parts p on p.id = m.part_id join "user" u on u.id = m.user_id
        where p.sku = ${level!.sku} and m.kind = 'count-correction' order by m.id desc limit 1`)
    ).rows;
    expect(moved).toEqual({ qty: 1, by: 'warehouse@stackyard.test', reason: `Cycle count of ${level!.bin}` });
  }, 120_000);
});
