// Accessibility and phone layout in the browser: axe-core on every main page, a planner task
// by keyboard alone, what axe cannot see (focus, shortcuts, announcements), and 390 px phones.
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { enqueueMail } from '../../server/services/mail.ts';
import { axeViolations, signInAs, startBrowserHarness, type BrowserHarness, waitForText } from './support.ts';

let h: BrowserHarness;
beforeAll(async () => {
  h = await startBrowserHarness();
});
afterAll(() => h?.close());

/** What has focus: its accessible-ish name (label, aria-label or text) and id. */
const focused = (page: Page) =>
  page.evaluate(() => {
    const el = document.activeElement as HTMLElement | null;
    if (!el || el === document.body) return { name: '', id: '', tag: 'body' };
    const labelled = (el as HTMLInputElement).labels?.[0]?.textContent ?? el.getAttribute('aria-label') ?? el.textContent ?? '';
    return { name: labelled.replace(/\s+/g, ' ').trim(), id: el.id, tag: el.tagName.toLowerCase() };
  });

/** Presses Tab until focus is on something whose name matches; fails after `max` presses. */
async function tabTo(page: Page, name: RegExp, max = 80) {
  for (let i = 0; i < max; i++) {
    await page.keyboard.press('Tab');
    if (name.test((await focused(page)).name)) return;
  }
  throw new Error(`Tab never reached ${name}`);
}

/** Pages in a settled state: the heading is there and nothing is still loading. */
async function settled(page: Page, url: string, heading: RegExp) {
  await page.goto(url);
  await waitForText(page.getByRole('heading', { level: 1 }), heading);
  await page.waitForLoadState('networkidle');
}

/** Nothing wider than the window: neither the page nor a table inside its box. */
async function expectWithinWidth(page: Page, state: string) {
  const widths = await page.evaluate(() => ({
    page: document.documentElement.scrollWidth,
    viewport: window.innerWidth,
    overflowing: Array.from(document.querySelectorAll('table'))
      .map((t) => t.parentElement!)
      .filter((box) => box.scrollWidth > box.clientWidth + 1)
      .map((box) => box.querySelector('table')?.getAttribute('aria-label') ?? 'a table'),
  }));
  expect(widths.page, state).toBeLessThanOrEqual(widths.viewport);
  expect(widths.overflowing, state).toEqual([]);
}

async function expectNoAxeViolations(page: Page, state: string) {
  expect((await axeViolations(page)).join('\n'), state).toBe('');
}

describe('axe-core on every main page', () => {
  it('finds nothing on the sign-in page and the installer’s pages', async () => {
    const page = await h.newPage();
    await page.goto('/sign-in');
    await page.getByLabel('E-mail').waitFor();
    await expectNoAxeViolations(page, 'sign-in');
    await signInAs(page, 'installer@stackyard.test');
    const pages: [string, string, RegExp][] = [
      ['home', '/', /Good to see you/],
      ['catalogue', '/catalogue', /^Catalogue$/],
      ['catalogue search', '/catalogue?q=cable+cover&category=cable-cover', /^Catalogue$/],
      ['catalogue browse', '/catalogue/browse', /./],
      ['part', '/catalogue/HLM-TOR-M5', /Tor HV battery module/],
      ['planner with a plan', '/planner?range=HLM-TOR&modules=4', /^Stack planner$/],
      ['planner that cannot plan', '/planner?range=QRB-HEARTH&modules=9', /^Stack planner$/],
      ['saved plans', '/plans', /^Saved plans$/],
      ['unknown page', '/nowhere', /./],
    ];
    for (const [state, url, heading] of pages) {
      await settled(page, url, heading);
      await expectNoAxeViolations(page, state);
    }
  });

  it('finds nothing on purchasing’s edit pages and the admin’s user pages', async () => {
    const page = await h.newPage();
    await signInAs(page, 'purchasing@stackyard.test');
    for (const [state, url, heading] of [
      ['part edit', '/catalogue/HLM-TOR-M5/edit', /./],
      ['new part', '/catalogue/new', /./],
      ['range edit', '/ranges/QRB-RIDGE/edit', /./],
    ] as [string, string, RegExp][]) {
      await settled(page, url, heading);
      await expectNoAxeViolations(page, state);
    }

    const admin = await h.newPage();
    await signInAs(admin, 'admin@stackyard.test');
    await settled(admin, '/admin/users', /^Users$/);
    await expectNoAxeViolations(admin, 'users');
    await admin.getByRole('button', { name: 'New user' }).click();
    await admin.getByRole('form', { name: 'New user' }).waitFor();
    await expectNoAxeViolations(admin, 'users, new user form');
    await admin.getByRole('button', { name: 'Create user' }).click();
    await admin.getByRole('form', { name: 'New user' }).getByRole('alert').first().waitFor();
    await expectNoAxeViolations(admin, 'users, new user form with errors');
    await admin.getByRole('button', { name: 'Cancel' }).click();
    await admin.getByRole('table', { name: 'Users' }).locator('tbody [data-row-action]').first().click();
    await admin.getByRole('form', { name: 'Role and company' }).waitFor();
    await expectNoAxeViolations(admin, 'users, editor open');
  });

  // One test per page group and width, so each has its own time budget on a busy machine.
  for (const size of [undefined, { width: 390, height: 844 }]) {
    const where = size ? 'phone ' : '';
    it(`finds nothing on the jobs pages${size ? ' at phone width' : ''}`, async () => {
      const sales = await h.newPage(size);
      await signInAs(sales, 'sales@stackyard.test');
      await settled(sales, '/jobs', /^Jobs$/);
      await expectNoAxeViolations(sales, `${where}jobs`);
      await expectWithinWidth(sales, `${where}jobs`);
      await sales.getByRole('table', { name: 'Jobs' }).locator('tbody [data-row-action]').first().click();
      await waitForText(sales.getByRole('heading', { level: 1 }), /^(?!Jobs$)./);
      await sales.waitForLoadState('networkidle');
      await expectNoAxeViolations(sales, `${where}job page`);
      await expectWithinWidth(sales, `${where}job page`);
      await settled(sales, '/jobs/new', /^New job$/);
      await expectNoAxeViolations(sales, `${where}new job`);
    });

    it(`finds nothing on the stock pages${size ? ' at phone width' : ''}`, async () => {
      const warehouse = await h.newPage(size);
      await signInAs(warehouse, 'warehouse@stackyard.test');
      for (const [state, url, heading] of [
        ['stock', '/stock', /^Stock$/],
        ['movements', '/stock/movements', /^Stock movements$/],
        ['stock entry', '/stock/entry', /^Stock in and out$/],
        ['low stock', '/stock/low', /^Low stock$/],
        ['warehouses', '/admin/warehouses', /^Warehouses and bins$/],
        ['part with stock settings', '/catalogue/HLM-TOR-M5', /Tor HV battery module/],
      ] as [string, string, RegExp][]) {
        await settled(warehouse, url, heading);
        await expectNoAxeViolations(warehouse, `${where}${state}`);
        await expectWithinWidth(warehouse, `${where}${state}`);
      }
    });
  }

  it('finds nothing on the warehouse pages (pick queue, pick screen with a refusal, pick list, labels, handover), at desk and at phone width', async () => {
    const ids = Object.fromEntries((await h.t.db.execute<{ reference: string; id: string }>(sql`select reference, id from jobs where reference in ('BG-2041 Fern St', 'SS-0317 Jetty Rd')`)).rows.map((r) => [r.reference, r.id]));
    const pickJob = ids['BG-2041 Fern St']!;
    const readyJob = ids['SS-0317 Jetty Rd']!;
    for (const size of [undefined, { width: 390, height: 844 }]) {
      const where = size ? 'phone ' : '';
      const page = await h.newPage(size);
      await signInAs(page, 'warehouse@stackyard.test');
      for (const [state, url, heading] of [
        ['pick queue', '/picking', /^Pick queue$/],
        ['pick screen', `/jobs/${pickJob}/pick`, /^Pick BG-2041 Fern St$/],
        ['pick list', `/jobs/${pickJob}/pick-list`, /^Pick list BG-2041 Fern St$/],
        ['labels', `/jobs/${readyJob}/labels`, /^Labels$/],
        ['handover sheet', `/jobs/${readyJob}/handover`, /^Handover SS-0317 Jetty Rd$/],
      ] as [string, string, RegExp][]) {
        await settled(page, url, heading);
        await expectNoAxeViolations(page, `${where}${state}`);
        await expectWithinWidth(page, `${where}${state}`);
      }
      // A refused scan's loud answer passes too.
      await settled(page, `/jobs/${pickJob}/pick`, /^Pick BG-2041 Fern St$/);
      await page.keyboard.type('NOT-ON-THIS-JOB\n');
      await waitForText(page.getByTestId('scan-feedback'), /Refused/);
      await expectNoAxeViolations(page, `${where}pick screen, refused scan`);
      await expectWithinWidth(page, `${where}pick screen, refused scan`);
    }
  });

  it('finds nothing on the purchasing pages, at desk and at phone width', async () => {
    for (const size of [undefined, { width: 390, height: 844 }]) {
      const where = size ? 'phone ' : '';
      const page = await h.newPage(size);
      await signInAs(page, 'purchasing@stackyard.test');
      for (const [state, url, heading] of [
        ['price lists', '/purchasing', /^Purchasing$/],
        ['suppliers', '/purchasing/suppliers', /^Suppliers$/],
        ['sell pricing', '/purchasing/pricing', /^Sell pricing$/],
        ['reorder', '/purchasing/reorder', /^Reorder$/],
        ['purchase orders', '/purchasing/orders', /^Purchase orders$/],
      ] as [string, string, RegExp][]) {
        await settled(page, url, heading);
        await expectNoAxeViolations(page, `${where}${state}`);
        await expectWithinWidth(page, `${where}${state}`);
      }
      await settled(page, '/purchasing/suppliers', /^Suppliers$/);
      await page.getByRole('table', { name: 'Suppliers' }).locator('tbody [data-row-action]').first().click();
      await waitForText(page.getByRole('heading', { level: 1 }), /^(?!Suppliers$)./);
      await page.waitForLoadState('networkidle');
      await page.getByRole('table', { name: 'Supplier parts' }).locator('tbody [data-row-action]').first().click();
      await waitForText(page.locator('main'), /Cost history of/);
      await expectNoAxeViolations(page, `${where}supplier with cost history`);
      await expectWithinWidth(page, `${where}supplier with cost history`);
    }
   }, 180_000); // ten pages at two widths

  it('finds nothing at phone width, with the menu and the filters open', async () => {
    const page = await h.newPage({ width: 390, height: 844 });
    await signInAs(page, 'sales@stackyard.test');
    await settled(page, '/catalogue', /^Catalogue$/);
    await expectNoAxeViolations(page, 'phone catalogue');
    await page.getByRole('button', { name: /^Filters/ }).click();
    await expectNoAxeViolations(page, 'phone catalogue, filters open');
    await page.getByRole('button', { name: 'Menu' }).click();
    await expectNoAxeViolations(page, 'phone menu open');
  });
});

describe('by keyboard alone', () => {
  it('plans a stack and saves it as a draft without the mouse', async () => {
    const page = await h.newPage();
    await page.goto('/sign-in');
    await page.getByLabel('E-mail').waitFor();
    await tabTo(page, /^E-mail$/);
    await page.keyboard.type('installer@stackyard.test');
    await tabTo(page, /^Password$/);
    await page.keyboard.type('stackyard-demo');
    await page.keyboard.press('Enter');
    await page.getByRole('navigation', { name: 'Main' }).waitFor();

    // The skip link comes first; then the navigation.
    await page.keyboard.press('Tab');
    expect((await focused(page)).name).toBe('Skip to content');
    await tabTo(page, /^Stack planner$/);
    await page.keyboard.press('Enter');
    await waitForText(page.getByRole('heading', { level: 1 }), /^Stack planner$/);

    await tabTo(page, /Quarnby Hearth 51/);
    await page.keyboard.press('Enter');
    await tabTo(page, /^Modules per stack/);
    await page.keyboard.press('Control+A');
    await page.keyboard.type('3');
    await waitForText(page.getByTestId('dvc'), /DVC-A/);
    // The changed figures are announced (a polite live region).
    await waitForText(page.getByTestId('plan-announcement'), /1 stack of 3 modules, [\d.]+ kWh usable, DVC-A/);

    await tabTo(page, /^Save as draft$/);
    await page.keyboard.press('Enter');
    await tabTo(page, /^Plan name/);
    await page.keyboard.type('Keyboard only garage');
    await tabTo(page, /^Site suburb/);
    await page.keyboard.type('Footscray');
    await tabTo(page, /^Site postcode/);
    await page.keyboard.type('3011');
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/plans\/[0-9a-f-]{36}$/);
    await waitForText(page.getByRole('heading', { level: 1 }), /^Keyboard only garage$/);
    await expectNoAxeViolations(page, 'saved plan');
  });

  it('passes a table in one Tab, moves by arrows, and opens a row with Enter', async () => {
    const page = await h.newPage();
    await signInAs(page, 'sales@stackyard.test');
    await settled(page, '/catalogue', /^Catalogue$/);
    // No focus is pushed into the search box on load: the page starts at the top.
    expect((await focused(page)).tag).toBe('body');
    // The default order is by SKU, and the column says so.
    expect(await page.getByRole('columnheader', { name: /SKU/ }).getAttribute('aria-sort')).toBe('ascending');

    const table = page.getByRole('table', { name: 'Parts' });
    const stops = await table.evaluate((t) => Array.from(t.querySelectorAll('a, button')).filter((el) => (el as HTMLElement).tabIndex >= 0).length);
    const headerButtons = await table.locator('thead button').count();
    expect(stops).toBe(headerButtons + 1);

    await page.getByLabel('Search the catalogue').focus();
    await page.keyboard.press('ArrowDown');
    const first = (await focused(page)).name;
    await page.keyboard.press('ArrowDown');
    const second = (await focused(page)).name;
    expect(second).not.toBe(first);
    expect(second).toMatch(/^[A-Z0-9-]+$/);
    await page.keyboard.press('Enter');
    await page.waitForURL(new RegExp(`/catalogue/${second}$`));
  });

  it('moves focus to the user editor it opens, and back when it closes', async () => {
    const page = await h.newPage();
    await signInAs(page, 'admin@stackyard.test');
    await settled(page, '/admin/users', /^Users$/);
    const firstUser = page.getByRole('table', { name: 'Users' }).locator('tbody [data-row-action]').first();
    const name = (await firstUser.textContent()) ?? '';
    await firstUser.focus();
    await page.keyboard.press('Enter');
    await expect.poll(async () => (await focused(page)).id).toBe('user-editor-title');
    expect((await focused(page)).name).toContain(name);
    await page.getByRole('button', { name: 'Close' }).click();
    expect((await focused(page)).name).toBe(name);
  });

  it('offers the search shortcut from every page, and lets it be changed or turned off', async () => {
    const page = await h.newPage();
    await signInAs(page, 'installer@stackyard.test');
    await settled(page, '/plans', /^Saved plans$/);
    await page.keyboard.press('/');
    await page.waitForURL(/\/catalogue$/);
    await expect.poll(async () => (await focused(page)).id).toBe('catalogue-search');

    await settled(page, '/plans', /^Saved plans$/);
    await page.getByRole('button', { name: /Ivy Brennard|Brightgum/ }).click();
    await page.getByLabel('Search shortcut').selectOption('off');
    await page.keyboard.press('Escape');
    expect(await page.getByLabel('Search shortcut').count()).toBe(0);
    await page.keyboard.press('/');
    await page.waitForTimeout(300);
    expect(page.url()).toMatch(/\/plans$/);

    // Ctrl + / instead: the choice is kept in this browser.
    await page.getByRole('button', { name: /Ivy Brennard|Brightgum/ }).click();
    await page.getByLabel('Search shortcut').selectOption('ctrl+/');
    await page.keyboard.press('Escape');
    await page.reload();
    await waitForText(page.getByRole('heading', { level: 1 }), /^Saved plans$/);
    await page.keyboard.press('/');
    await page.waitForTimeout(300);
    expect(page.url()).toMatch(/\/plans$/);
    await page.keyboard.press('Control+/');
    await page.waitForURL(/\/catalogue$/);
    await page.getByText(/Press Ctrl \+ \/ to search from anywhere/).waitFor();
    expect(await page.getByText(/Press Ctrl \+ \/ to search from anywhere/).count()).toBe(1);
  });
});

describe('what axe cannot see', () => {
  it('draws the focus ring in the dark navigation at 3:1 or more', async () => {
    const page = await h.newPage();
    await signInAs(page, 'sales@stackyard.test');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Catalogue' }).focus();
    await page.keyboard.press('Tab');
    const ratio = await page.evaluate(() => {
      const el = document.activeElement as HTMLElement;
      const nav = el.closest('nav')!;
      const rgb = (c: string) => (c.match(/[\d.]+/g) ?? []).slice(0, 3).map(Number);
      // WCAG 2.x relative luminance and contrast ratio.
      const lum = (c: number[]) => {
        const [r, g, b] = c.map((v) => v / 255).map((v) => (v <= 0.03928 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4));
        return 0.2126 * r! + 0.7152 * g! + 0.0722 * b!;
      };
      const a = lum(rgb(getComputedStyle(el).outlineColor));
      const b = lum(rgb(getComputedStyle(nav).backgroundColor));
      return (Math.max(a, b) + 0.05) / (Math.min(a, b) + 0.05);
    });
    // WCAG 2.1 SC 1.4.11 (non-text contrast): at least 3:1.
    expect(ratio).toBeGreaterThanOrEqual(3);
  });

  it('names each warehouse column in the BOM, not only its code', async () => {
    const page = await h.newPage();
    await signInAs(page, 'sales@stackyard.test');
    await settled(page, '/planner?range=HLM-TOR&modules=4', /^Stack planner$/);
    const bom = page.getByRole('table', { name: 'Bill of materials' });
    await bom.getByRole('columnheader', { name: 'Western depot' }).waitFor();
    await bom.getByRole('columnheader', { name: 'Northern depot' }).waitFor();
  });
});

describe('at 390 × 844 (a phone)', () => {
  it('keeps the catalogue, a part, the planner, saved plans and users within the width', async () => {
    const page = await h.newPage({ width: 390, height: 844 });
    await signInAs(page, 'admin@stackyard.test');
    const pages: [string, RegExp][] = [
      ['/', /Good to see you/],
      ['/catalogue', /^Catalogue$/],
      ['/catalogue/HLM-TOR-M5', /Tor HV battery module/],
      ['/planner?range=HLM-TOR&modules=4', /^Stack planner$/],
      ['/plans', /^Saved plans$/],
      ['/admin/users', /^Users$/],
    ];
    for (const [url, heading] of pages) {
      await settled(page, url, heading);
      // Tables scroll inside their box on a desk; on a phone they must fit it too.
      await expectWithinWidth(page, url);
    }
    // The navigation is a menu button; its links appear when it opens.
    const nav = page.getByRole('navigation', { name: 'Main' });
    expect(await nav.getByRole('link', { name: 'Catalogue' }).isVisible()).toBe(false);
    await nav.getByRole('button', { name: 'Menu' }).click();
    await nav.getByRole('link', { name: 'Catalogue' }).click();
    await waitForText(page.getByRole('heading', { level: 1 }), /^Catalogue$/);
    // The menu closes once the new page is shown (an effect after navigation): wait for it.
    await expect.poll(() => nav.getByRole('link', { name: 'Catalogue' }).isVisible()).toBe(false);
  });
});

describe('the frame and the user forms', () => {
  it('draws the frame at once while the session check is slow', async () => {
    const page = await h.newPage();
    await signInAs(page, 'sales@stackyard.test');
    let release: () => void = () => {};
    const held = new Promise<void>((r) => (release = r));
    await page.route('**/api/me', async (route) => {
      await held;
      await route.continue();
    });
    await page.goto('/plans');
    // The navigation and a note show while /api/me is still on its way.
    await page.getByRole('navigation', { name: 'Main' }).waitFor();
    await page.getByText('Checking your sign-in…').waitFor();
    release();
    await waitForText(page.getByRole('heading', { level: 1 }), /^Saved plans$/);
  });

  it('picks the wholesaler for a staff role and offers only customer companies to an installer', async () => {
    const page = await h.newPage();
    await signInAs(page, 'admin@stackyard.test');
    await settled(page, '/admin/users', /^Users$/);
    await page.getByRole('button', { name: 'New user' }).click();
    const form = page.getByRole('form', { name: 'New user' });
    // Cancel sits beside the main button, styled as the secondary action.
    expect(await form.getByRole('button', { name: 'Cancel' }).getAttribute('class')).toContain('bg-card');
    expect(await form.getByRole('button', { name: 'Create user' }).getAttribute('class')).toContain('bg-copper');

    const company = form.getByLabel('Company');
    const options = () => company.locator('option:not([disabled])').allTextContents();
    expect(await options()).toEqual(['Brightgum Electrical', 'Saltbush Home Energy', 'Southerly Solar & Storage']);
    await form.getByLabel('Role').selectOption('sales');
    expect(await company.inputValue()).toBe('Lowtide Battery Wholesale');
    expect(await company.getAttribute('readonly')).not.toBeNull();

    await form.getByLabel('Name').fill('Noor Haddad');
    await form.getByLabel('E-mail').fill('noor@stackyard.test');
    await form.getByLabel('First password').fill('a-good-password');
    await form.getByRole('button', { name: 'Create user' }).click();
    await page.getByText('Noor Haddad can now sign in as noor@stackyard.test.').waitFor();

    // Editing: moving that user to the installer role asks for a customer company.
    await page.getByRole('table', { name: 'Users' }).getByRole('button', { name: 'Noor Haddad' }).click();
    const access = page.getByRole('form', { name: 'Role and company' });
    await access.getByLabel('Role').selectOption('installer');
    await access.getByRole('button', { name: 'Save' }).click();
    await waitForText(access.getByRole('alert').first(), /customer company/);
    await access.getByLabel('Company').selectOption({ label: 'Saltbush Home Energy' });
    await access.getByRole('button', { name: 'Save' }).click();
    await page.getByText('Role and company saved.').waitFor();
    const row = page.getByRole('table', { name: 'Users' }).getByRole('row').filter({ hasText: 'Noor Haddad' });
    await waitForText(row, /Installer.*Saltbush Home Energy/);
  });
});

describe('the installer portal, password pages and the outbox', () => {
  it('finds nothing on them and keeps them within a phone’s width', async () => {
    const draft = (await h.t.db.execute<{ id: string }>(sql`select j.id from jobs j join companies c on c.id = j.company_id where c.account_type = 'cash' and j.status = 'draft' order by j.reference limit 1`)).rows[0]!;
    const message = await enqueueMail(h.t.db, { event: 'password-reset', to: 'someone-with-a-long-address@brightgum-electrical.test', data: { name: 'Someone', url: `${h.baseUrl}/reset-password?token=x` } });
    for (const size of [undefined, { width: 390, height: 844 }]) {
      const where = size ? 'phone ' : '';
      const anon = await h.newPage(size);
      for (const [state, url, heading] of [
        ['forgotten password', '/forgot-password', /^Forgotten password$/],
        ['choose a password', '/reset-password?token=abc', /^Choose a password$/],
      ] as [string, string, RegExp][]) {
        await settled(anon, url, heading);
        await expectNoAxeViolations(anon, `${where}${state}`);
        if (size) await expectWithinWidth(anon, url);
      }
      const installer = await h.newPage(size);
      await signInAs(installer, 'installer2@stackyard.test');
      for (const [state, url, heading] of [
        ['portal home', '/', /Good to see you/],
        ['unpaid card job', `/jobs/${draft.id}`, /./],
      ] as [string, string, RegExp][]) {
        await settled(installer, url, heading);
        await expectNoAxeViolations(installer, `${where}${state}`);
        if (size) await expectWithinWidth(installer, url);
      }
      const admin = await h.newPage(size);
      await signInAs(admin, 'admin@stackyard.test');
      await settled(admin, '/admin/outbox', /^Outbox$/);
      await expectNoAxeViolations(admin, `${where}outbox`);
      if (size) await expectWithinWidth(admin, '/admin/outbox');
      await settled(admin, `/admin/outbox/${message}`, /^Choose a new Stackyard password$/);
      await expectNoAxeViolations(admin, `${where}outbox message`);
      if (size) await expectWithinWidth(admin, 'outbox message');
    }
  }, 240_000);
});
