import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { isLoopback, launchBrowser, screenshot, signIn, watchRequests } from '../support/browser';
import { E2E_BASE_URL as BASE } from '../support/env';

let ctx: BrowserContext;
beforeAll(async () => {
  ctx = await launchBrowser();
});
afterAll(async () => {
  await ctx?.close();
});

async function freshPage(): Promise<{ page: Page; requests: string[] }> {
  await ctx.clearCookies();
  const page = await ctx.newPage();
  return { page, requests: watchRequests(page) };
}

const navOf = async (page: Page) => (await page.getByRole('navigation', { name: 'Main' }).getByRole('link').allTextContents()).map((s) => s.trim());

describe('sign-in and navigation by role', () => {
  const cases: [string, string, string[], string[]][] = [
    ['inspector@harrowgate.test', 'inspector', ['Dock', 'Lot file', 'Drift watch', 'Nonconformances', 'Gauges'], ['Admin', 'Supplier desk', 'History ledger']],
    ['engineer@harrowgate.test', 'engineer', ['Dock', 'Corrective actions', 'Plans & parts', 'History ledger'], ['Admin', 'Supplier desk']],
    ['auditor@harrowgate.test', 'auditor', ['History ledger', 'Lot file', 'Scorecards'], ['Admin', 'Supplier desk']],
    ['admin@harrowgate.test', 'admin', ['Admin'], ['Dock', 'Nonconformances', 'Supplier desk']],
    ['quality@selby-pressworks.test', 'supplier', ['Supplier desk', 'Lot file', 'Scorecards'], ['Dock', 'Admin', 'Drift watch', 'History ledger']],
  ];
  for (const [email, role, shown, hidden] of cases) {
    it(`${role} signs in and sees its own navigation`, async () => {
      const { page, requests } = await freshPage();
      await signIn(page, BASE, email);
      await page.getByRole('navigation', { name: 'Main' }).waitFor();
      const nav = await navOf(page);
      for (const n of shown) expect(nav).toContain(n);
      for (const n of hidden) expect(nav).not.toContain(n);
      await screenshot(page, `home-${role}`);
      // Fonts, scripts and API calls all stay on this machine.
      expect(requests.filter((u) => !isLoopback(u))).toEqual([]);
      await page.close();
    });
  }
});

describe('sign-in form', () => {
  it('shows an inline error for a wrong password and keeps the e-mail', async () => {
    const { page } = await freshPage();
    await signIn(page, BASE, 'inspector@harrowgate.test', 'definitely-wrong');
    const alert = page.getByRole('alert');
    await alert.waitFor();
    expect(await alert.textContent()).toMatch(/do not match an account/);
    expect(await page.getByLabel('E-mail').inputValue()).toBe('inspector@harrowgate.test');
    await screenshot(page, 'sign-in-wrong-password');
    await page.close();
  });

  it('shows field errors before sending an empty form', async () => {
    const { page } = await freshPage();
    await page.goto(`${BASE}/sign-in`);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByText('Enter an e-mail address').waitFor();
    await page.getByText('Enter your password').waitFor();
    await page.close();
  });

  it('returns to the page you wanted after signing in', async () => {
    const { page } = await freshPage();
    await page.goto(`${BASE}/gauges`);
    await page.waitForURL(/\/sign-in\?next=%2Fgauges/);
    await page.getByLabel('E-mail').fill('engineer@harrowgate.test');
    await page.getByLabel('Password').fill('yokeline-demo');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(`${BASE}/gauges`);
    await page.close();
  });
});

describe('sign-out', () => {
  it('returns to sign-in and the session is gone', async () => {
    const { page } = await freshPage();
    await signIn(page, BASE, 'engineer@harrowgate.test');
    await page.getByRole('button', { name: /Account:/ }).click();
    await page.getByRole('menuitem', { name: 'Sign out' }).click();
    await page.waitForURL(/\/sign-in/);
    await page.goto(`${BASE}/dock`);
    await page.waitForURL(/\/sign-in\?next=%2Fdock/);
    await page.close();
  });

  it('an unknown address shows the not-found page inside the shell', async () => {
    const { page } = await freshPage();
    await signIn(page, BASE, 'inspector@harrowgate.test');
    await page.getByRole('navigation', { name: 'Main' }).waitFor();
    await page.goto(`${BASE}/no-such-page`);
    await page.getByText('There is no page at this address').waitFor();
    await page.close();
  });
});
