import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Locator, Page } from 'playwright-core';
import { startBrowserHarness, signInAs, type BrowserHarness } from './support.ts';
import { parts } from '../../seed/data/catalogue.ts';

let h: BrowserHarness;
beforeAll(async () => {
  h = await startBrowserHarness();
});
afterAll(() => h?.close());

const module5 = parts.find((p) => p.sku === 'HLM-TOR-M5')!;
const endCap = parts.find((p) => p.sku === 'HLM-TOR-EC')!;

const resultCount = async (page: Page) => Number((await page.getByTestId('result-count').textContent())?.replace(/[^\d]/g, ''));
const resultsTable = (page: Page) => page.getByRole('table', { name: 'Parts' });
const categoryCells = (page: Page) => resultsTable(page).locator('tbody tr').locator('td:nth-child(4)');

async function openCatalogue(page: Page) {
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Catalogue' }).click();
  await page.waitForURL(/\/catalogue$/);
  await page.getByRole('heading', { level: 1, name: 'Catalogue' }).waitFor();
  // The whole catalogue shows before any search.
  await page.getByTestId('result-count').filter({ hasText: /\d+ parts/ }).waitFor();
}

/** Waits until every row matches: results update after a short pause in typing. */
async function expectRows(page: Page, test: (texts: string[]) => boolean, what: string) {
  await expect
    .poll(async () => test(await resultsTable(page).locator('tbody tr').allTextContents()), { timeout: 10_000, message: what })
    .toBe(true);
}

async function fieldMessage(field: Locator) {
  const id = await field.getAttribute('aria-describedby');
  return id ? field.page().locator(`[id="${id}"]`).textContent() : null;
}

describe('catalogue search (trade desk)', () => {
  it('searches as you type, forgives a typo, filters by category and opens a part by keyboard', async () => {
    const page = await h.newPage();
    await signInAs(page, 'sales@stackyard.test');
    await openCatalogue(page);
    const all = await resultCount(page);
    const search = page.getByLabel('Search the catalogue');
    // Focus is not pushed into the search box on arrival (it stays where the user was), yet
    // typing goes straight into the search box.
    expect(await search.evaluate((el) => el !== document.activeElement)).toBe(true);

    await page.keyboard.type('cable cov');
    await page.waitForURL(/q=cable\+cov/);
    await expect.poll(() => resultCount(page)).toBeLessThan(all);
    await expectRows(page, (rows) => rows.length > 0 && rows.some((r) => /cable-protection cover/i.test(r)), 'a cable-protection cover among the results');

    await search.fill('controler');
    await page.waitForURL(/q=controler/);
    await expectRows(page, (rows) => rows.length > 0 && rows.some((r) => /controller/i.test(r)), 'controllers despite the typo');

    // Category facet on the whole catalogue: fewer parts, all of them controllers.
    await search.fill('');
    await expect.poll(() => resultCount(page)).toBe(all);
    const categories = page.getByRole('region', { name: 'Category' });
    const controllerFacet = categories.getByRole('button', { name: /^Controller\s+\d+$/ });
    const facetCount = Number((await controllerFacet.textContent())?.replace(/[^\d]/g, ''));
    await controllerFacet.click();
    await expect.poll(() => resultCount(page)).toBe(facetCount);
    expect(facetCount).toBeLessThan(all);
    expect(facetCount).toBeGreaterThan(0);
    expect(new Set(await categoryCells(page).allTextContents())).toEqual(new Set(['Controller']));
    expect(page.url()).toContain('category=controller');
    expect(await page.getByRole('button', { name: 'Remove filter Category: Controller' }).isVisible()).toBe(true);

    // Back removes the filter again: it lives in the URL.
    await page.goBack();
    await expect.poll(() => resultCount(page)).toBe(all);
    await page.goForward();
    await expect.poll(() => resultCount(page)).toBe(facetCount);

    // "/" focuses the search box from anywhere, ArrowDown enters the results (the second row's
    // SKU link after two presses), Enter follows the link.
    await page.getByRole('heading', { level: 1 }).click();
    await page.keyboard.press('/');
    expect(await search.evaluate((el) => el === document.activeElement)).toBe(true);
    await page.keyboard.press('ArrowDown');
    await page.keyboard.press('ArrowDown');
    const focusedSku = await page.evaluate(() => (document.activeElement?.matches('tbody tr:nth-child(2) a[data-row-action]') ? document.activeElement.textContent : null));
    expect(focusedSku).toMatch(/^[A-Z0-9]/);
    await page.keyboard.press('Enter');
    await page.waitForURL(new RegExp(`/catalogue/${focusedSku}$`));
    expect(await page.getByTestId('part-sku').textContent()).toBe(focusedSku);
    await expect.poll(() => page.title()).toMatch(/ · Stackyard$/);
  });

  it('jumps straight to a part when a scanner types its SKU and Enter', async () => {
    const page = await h.newPage();
    await signInAs(page, 'sales@stackyard.test');
    await page.goto('/catalogue');
    await page.getByTestId('result-count').filter({ hasText: /\d+ parts/ }).waitFor();
    // A keyboard-wedge scanner: the whole code in a burst, then Enter, faster than the typing pause.
    await page.keyboard.type(module5.sku, { delay: 2 });
    await page.keyboard.press('Enter');
    await page.waitForURL(`**/catalogue/${module5.sku}`);
    await page.getByRole('heading', { level: 1, name: module5.name }).waitFor();
    // A module carries cells: the dangerous-goods reminder is on its page, and sales sees its cost.
    await page.getByText('Contains lithium cells').waitFor();
    expect(await page.getByText('two-person lift').count()).toBeGreaterThan(0);
    expect(await page.getByText('Cost (ex GST)').count()).toBe(1);
    expect(await page.getByRole('link', { name: 'Edit' }).count()).toBe(0);

    // The same from its GTIN.
    await page.goto('/catalogue');
    await page.getByTestId('result-count').filter({ hasText: /\d+ parts/ }).waitFor();
    await page.keyboard.type(module5.gtin!, { delay: 2 });
    await page.keyboard.press('Enter');
    await page.waitForURL(`**/catalogue/${module5.sku}`);
  });
});

describe('browsing results and a part page (sales)', () => {
  it('sorts by a column header, pages through results, and shows a superseded part with its successor', async () => {
    const page = await h.newPage();
    await signInAs(page, 'sales@stackyard.test');
    await openCatalogue(page);
    const all = await resultCount(page);
    expect(all).toBeGreaterThan(50); // more than one page of 50

    // Without words the list is in SKU order and the header says so; a click on it sorts
    // descending (the URL keeps it).
    const skuHeader = resultsTable(page).getByRole('columnheader', { name: /SKU/ });
    const firstSku = () => resultsTable(page).locator('tbody tr').first().locator('td:nth-child(2)').textContent();
    const ascending = [...parts.map((p) => p.sku)].sort()[0];
    await expect.poll(() => skuHeader.getAttribute('aria-sort')).toBe('ascending');
    await expect.poll(firstSku).toBe(ascending);
    await skuHeader.getByRole('button').click();
    await page.waitForURL(/sort=sku/);
    await expect.poll(() => skuHeader.getAttribute('aria-sort')).toBe('descending');
    const descending = [...parts.map((p) => p.sku)].sort().at(-1);
    await expect.poll(firstSku).toBe(descending);

    // Next shows the following page of the same order; Previous comes back.
    const firstPage = await resultsTable(page).locator('tbody tr td:nth-child(2)').allTextContents();
    await page.getByRole('button', { name: 'Next →' }).click();
    await page.waitForURL(/page=2/);
    await expect.poll(async () => (await resultsTable(page).locator('tbody tr td:nth-child(2)').allTextContents())[0]).not.toBe(firstPage[0]);
    const secondPage = await resultsTable(page).locator('tbody tr td:nth-child(2)').allTextContents();
    expect(secondPage.some((sku) => firstPage.includes(sku))).toBe(false);
    expect(secondPage[0]! < firstPage.at(-1)!).toBe(true); // still descending across the page break
    await page.getByRole('button', { name: '← Previous' }).click();
    await expect.poll(firstSku).toBe(descending);

    // A superseded part: its specs in groups, compliance, stock per warehouse and a link on to its successor.
    const old = parts.find((p) => p.supersededBy === module5.sku)!;
    await page.goto(`/catalogue/${old.sku}`);
    await page.getByRole('heading', { level: 1, name: old.name }).waitFor();
    for (const section of ['Electrical', 'Physical', 'Compliance', 'Stock by warehouse']) {
      await page.getByRole('heading', { level: 2, name: section }).waitFor();
    }
    await page.getByRole('link', { name: new RegExp(module5.sku) }).first().click();
    await page.waitForURL(`**/catalogue/${module5.sku}`);
    await page.getByRole('heading', { level: 1, name: module5.name }).waitFor();
    expect(await page.getByText(old.sku).count()).toBeGreaterThan(0); // "Replaces" the old one
  });
});

describe('editing a part (purchasing)', () => {
  it('changes a part’s name and refuses an invalid GTIN next to the field', async () => {
    const page = await h.newPage();
    await signInAs(page, 'purchasing@stackyard.test');
    await page.goto(`/catalogue/${endCap.sku}`);
    await page.getByRole('heading', { level: 1, name: endCap.name }).waitFor();
    await page.getByRole('link', { name: 'Edit', exact: true }).click();
    await page.waitForURL(`**/catalogue/${endCap.sku}/edit`);
    const form = page.getByRole('form', { name: `Edit ${endCap.sku}` });

    // A GTIN with its check digit off by one is refused beside the GTIN field, before anything is sent.
    const gtin = form.getByLabel('GTIN');
    const good = endCap.gtin!;
    const bad = good.slice(0, -1) + String((Number(good.slice(-1)) + 1) % 10);
    await gtin.fill(bad);
    await form.getByRole('button', { name: 'Save changes' }).click();
    await expect.poll(() => fieldMessage(gtin)).toContain('check digit is wrong');
    expect(await gtin.getAttribute('aria-invalid')).toBe('true');
    expect(page.url()).toContain('/edit');

    const renamed = `${endCap.name} (revised)`;
    await gtin.fill(good);
    await form.getByLabel('Name', { exact: true }).fill(renamed);
    await form.getByRole('button', { name: 'Save changes' }).click();
    await page.waitForURL(new RegExp(`/catalogue/${endCap.sku}$`));
    await page.getByRole('heading', { level: 1, name: renamed }).waitFor();

    // The search finds it under its new name.
    await page.goto(`/catalogue?q=${encodeURIComponent('revised')}`);
    await expectRows(page, (rows) => rows.some((r) => r.includes(renamed)), 'the renamed part in the results');
  });
});

describe('creating a part (purchasing)', () => {
  it('shows the chosen category’s own fields, puts the server’s duplicate-SKU refusal beside the SKU, then creates it', async () => {
    const page = await h.newPage();
    await signInAs(page, 'purchasing@stackyard.test');
    await openCatalogue(page);
    await page.getByRole('link', { name: 'New part' }).click();
    const form = page.getByRole('form', { name: 'New part' });
    await form.waitFor();
    expect(await form.getByLabel('Length (m)').count()).toBe(0);
    await form.getByLabel('Category').selectOption('cable-set');
    // A cable set asks for its length and cross-section (the shared field table).
    await form.getByLabel(/^Length \(m\)/).fill('2.5');
    await form.getByLabel(/^Cross-section/).fill('25');

    // An SKU that exists already: only the server knows, and its answer lands beside the field.
    const sku = form.getByLabel('SKU');
    await sku.fill(module5.sku);
    await form.getByLabel('Name', { exact: true }).fill('Test cable set 2.5 m');
    await form.getByLabel('Maker').selectOption('HLM');
    await form.getByLabel('Mass (kg)').fill('1.2');
    await form.getByRole('button', { name: 'Create part' }).click();
    await expect.poll(() => fieldMessage(sku)).toMatch(/already/i);
    expect(await sku.getAttribute('aria-invalid')).toBe('true');

    await sku.fill('TST-CBL-25');
    await form.getByRole('button', { name: 'Create part' }).click();
    await page.waitForURL(/\/catalogue\/TST-CBL-25$/);
    await page.getByRole('heading', { level: 1, name: 'Test cable set 2.5 m' }).waitFor();
    expect(await page.getByText('2.5 m').count()).toBeGreaterThan(0);
  });
});

describe('browsing by maker and range', () => {
  it('lists makers, kinds of part and ranges with counts, each opening the filtered catalogue', async () => {
    const page = await h.newPage();
    await signInAs(page, 'installer@stackyard.test');
    await openCatalogue(page);
    await page.getByRole('link', { name: 'Browse by maker or range' }).click();
    await page.getByRole('heading', { level: 1, name: 'Browse the catalogue' }).waitFor();
    const hearth = parts.filter((p) => p.sku.startsWith('QRB-HEARTH'));
    expect(hearth.length).toBeGreaterThan(0);
    await page.getByRole('link', { name: /Quarnby Hearth 51/ }).click();
    await page.waitForURL(/\/catalogue\?range=QRB-HEARTH/);
    await expectRows(page, (rows) => rows.length > 0, 'parts of the Hearth range');
    expect(await resultCount(page)).toBeGreaterThanOrEqual(3);
  });
});
