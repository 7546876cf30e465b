import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startBrowserHarness, signInAs, waitForText, type BrowserHarness } from './support.ts';

let h: BrowserHarness;
beforeAll(async () => {
  h = await startBrowserHarness();
});
afterAll(() => h?.close());

const ROLES = [
  { email: 'admin@stackyard.test', role: 'Administrator', nav: ['Home', 'Catalogue', 'Stack planner', 'Saved plans', 'Jobs', 'Picking', 'Stock', 'Purchasing', 'Purchase orders', 'Warehouses', 'Users', 'Outbox'] },
  { email: 'purchasing@stackyard.test', role: 'Purchasing', nav: ['Home', 'Catalogue', 'Stack planner', 'Saved plans', 'Jobs', 'Stock', 'Purchasing', 'Purchase orders'] },
  { email: 'warehouse@stackyard.test', role: 'Warehouse', nav: ['Home', 'Catalogue', 'Jobs', 'Picking', 'Stock', 'Purchase orders'] },
  { email: 'sales@stackyard.test', role: 'Trade desk', nav: ['Home', 'Catalogue', 'Stack planner', 'Saved plans', 'Jobs', 'Stock'] },
  { email: 'installer@stackyard.test', role: 'Installer', nav: ['Home', 'Catalogue', 'Stack planner', 'Saved plans', 'Jobs'] },
  { email: 'installer2@stackyard.test', role: 'Installer', nav: ['Home', 'Catalogue', 'Stack planner', 'Saved plans', 'Jobs'] },
];

describe('signing in', () => {
  it('sends a visitor without a session to the sign-in page', async () => {
    const page = await h.newPage();
    await page.goto('/admin/users');
    await page.waitForURL(/\/sign-in\?redirectTo=%2Fadmin%2Fusers/);
    await expect.poll(() => page.title()).toBe('Sign in · Stackyard');
  });

  it('explains a wrong password', async () => {
    const page = await h.newPage();
    await page.goto('/sign-in');
    await page.getByLabel('E-mail').fill('sales@stackyard.test');
    await page.getByLabel('Password').fill('wrong-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expectText(page.getByRole('alert'), 'do not match');
  });

  it.each(ROLES)('lands $email on their home with their navigation', async ({ email, role, nav }) => {
    const page = await h.newPage();
    await signInAs(page, email);
    const main = page.getByRole('navigation', { name: 'Main' });
    // The frame draws before the session answers; the role and the links follow it.
    await waitForText(page.getByRole('heading', { level: 1 }), /^Good to see you/);
    expect(await page.getByTestId('nav-role').textContent()).toBe(role);
    expect(await main.getByRole('link').allTextContents()).toEqual(nav);
    expect(await page.getByRole('heading', { level: 1 }).textContent()).toMatch(/^Good to see you/);
  });

  it('shows a real 404 page inside the app and signs out', async () => {
    const page = await h.newPage();
    await signInAs(page, 'warehouse@stackyard.test');
    await page.goto('/no-such-page');
    expect(await page.getByRole('heading', { level: 1 }).textContent()).toBe('Page not found');
    await page.getByRole('button', { name: /Wes Marrow/ }).click();
    // The user's panel is a disclosure (it holds a setting too), its actions plain buttons.
    await page.getByRole('button', { name: 'Sign out', exact: true }).click();
    await page.waitForURL(/\/sign-in/);
    await page.goto('/');
    await page.waitForURL(/\/sign-in/);
  });
});

describe('admin users page', () => {
  it('lets the admin create an installer who can then sign in', async () => {
    const page = await h.newPage();
    await signInAs(page, 'admin@stackyard.test');
    await page.getByRole('link', { name: 'Users' }).first().click();
    await page.getByRole('button', { name: 'New user' }).click();
    const form = page.getByRole('form', { name: 'New user' });
    await form.getByRole('button', { name: 'Create user' }).click();
    await expectText(form.getByRole('alert').first(), 'Enter a name');
    await form.getByLabel('Name').fill('Rowan Pellow');
    await form.getByLabel('E-mail').fill('rowan@brightgum.test');
    await form.getByLabel('Role').selectOption('installer');
    await form.getByLabel('Company').selectOption({ label: 'Brightgum Electrical' });
    await form.getByLabel('First password').fill('rowan-password-1');
    await form.getByRole('button', { name: 'Create user' }).click();
    await expectText(page.getByRole('status').first(), 'Rowan Pellow can now sign in');
    await page.getByLabel('Search users').fill('rowan');
    await page.getByRole('cell', { name: 'rowan@brightgum.test' }).waitFor();

    const other = await h.newPage();
    await signInAs(other, 'rowan@brightgum.test', 'rowan-password-1');
    expect(await other.getByTestId('nav-role').textContent()).toBe('Installer');
  });
});

async function expectText(locator: import('playwright-core').Locator, text: string) {
  await locator.waitFor();
  expect(await locator.textContent()).toContain(text);
}
