import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { launchBrowser, screenshot, signIn, watchRequests } from '../support/browser';
import { E2E_BASE_URL as BASE } from '../support/env';
import { DEMO } from '../support/http';

let ctx: BrowserContext;
beforeAll(async () => {
  ctx = await launchBrowser({ width: 1366, height: 900 });
});
afterAll(async () => {
  await ctx?.close();
});

async function home(email: string): Promise<{ page: Page; requests: string[]; api: Record<string, any> }> {
  // A fresh browser per role: nothing of the previous role's session or page state carries over.
  await ctx?.close();
  ctx = await launchBrowser({ width: 1366, height: 900 });
  const page = ctx.pages()[0] ?? (await ctx.newPage());
  const requests = watchRequests(page);
  await signIn(page, BASE, email);
  await page.waitForURL(`${BASE}/`);
  // The figures the page should show, read with the page's own session (one sign-in per role:
  // the server limits sign-ins per address and minute).
  const api = await (await page.request.get(`${BASE}/api/dashboard`)).json();
  return { page, requests, api };
}

const region = (page: Page, name: string) => page.getByRole('region', { name, exact: true });
/** The big number on a tile (its first line). */
const tileCount = async (page: Page, testId: string) => Number((await page.getByTestId(testId).locator('span').first().textContent())!.replace(/[^\d]/g, ''));

describe('home dashboards by role', () => {
  it('shows the inspector the Dock queue and today’s lots, and the tile opens the Dock', async () => {
    const { page, requests, api } = await home(DEMO.inspector);
    await region(page, 'Dock').waitFor();
    await page.getByRole('region', { name: /^Today, / }).waitFor();
    expect(await tileCount(page, 'tile-dock')).toBe(api.dock.queue);
    await screenshot(page, 'dashboard-inspector');
    // The home page is the first page after sign-in: no chart library on it.
    expect(requests.filter((u) => /trend-chart|ComposedChart|control-charts/.test(u))).toEqual([]);
    await page.getByTestId('tile-dock').click();
    await page.waitForURL(`${BASE}/dock`);
    await page.close();
  });

  it('shows the engineer NCRs, drift signals, SCAR steps and gauges; gauges due soon opens the filtered list', async () => {
    const { page, api } = await home(DEMO.engineer);
    for (const name of ['Nonconformances', 'Corrective actions', 'Gauges']) await region(page, name).waitFor();
    expect(await tileCount(page, 'tile-ncrs')).toBe(api.ncrs.notClosed);
    expect(await tileCount(page, 'tile-drift')).toBe(api.driftSignals.open);
    expect(await tileCount(page, 'tile-gauges-due')).toBe(api.gauges.dueSoon);
    await screenshot(page, 'dashboard-engineer');
    await page.getByTestId('tile-gauges-due').click();
    await page.waitForURL(`${BASE}/gauges?calibration=due-soon`);
    await page.getByRole('button', { name: 'Due within 30 days' }).waitFor();
    await page.close();
  });

  it('shows a supplier its steps to answer and its lots on hold, and no one else’s', async () => {
    const { page, api } = await home(DEMO.supplierSelby);
    await region(page, 'Corrective action steps to answer').waitFor();
    await region(page, 'Your lots').waitFor();
    expect(await tileCount(page, 'tile-on-hold')).toBe(api.lotsOnHold);
    expect(await page.getByRole('region', { name: 'Dock' }).count()).toBe(0);
    await screenshot(page, 'dashboard-supplier');
    await page.close();
  });

  it('shows the auditor the chain status and the recent changes', async () => {
    const { page } = await home(DEMO.auditor);
    await region(page, 'Audit chain').waitFor();
    await page.getByText('Chain intact').waitFor();
    const rows = region(page, 'Recent changes').getByRole('row');
    await rows.nth(1).waitFor();
    expect(await rows.count()).toBe(21); // header + the last 20 audit events (the demo has more)
    await screenshot(page, 'dashboard-auditor');
    await page.close();
  });

  it('shows the admin users by role and locked accounts', async () => {
    const { page, api } = await home(DEMO.admin);
    await region(page, 'Users').waitFor();
    expect(await tileCount(page, 'tile-users')).toBe(api.users.total);
    await page.getByRole('link', { name: /^Locked accounts: \d+$/ }).waitFor();
    await screenshot(page, 'dashboard-admin');
    await page.close();
  });
});

describe('Scorecards page', () => {
  it('shows engineers the ranking and a card with a trend chart per supplier, by quarter too', async () => {
    await ctx.clearCookies();
    const page = await ctx.newPage();
    await signIn(page, BASE, DEMO.engineer);
    await page.waitForURL(`${BASE}/`);
    await page.goto(`${BASE}/scorecards`);
    const ranking = page.getByRole('table', { name: 'Supplier ranking' });
    await ranking.waitFor();
    expect(await ranking.getByRole('row').count()).toBeGreaterThanOrEqual(4); // header + the three demo suppliers
    await page.getByRole('article', { name: 'Scorecard of Northgate Lamination Ltd' }).waitFor();
    await page.locator('[data-testid="scorecard-trend"] svg.recharts-surface').first().waitFor();
    await screenshot(page, 'scorecards');
    await page.getByLabel('Periods').selectOption('quarter');
    await page.waitForURL(/period=quarter/);
    await page.getByText(/^Q\d \d{4}$/).first().waitFor();
    // A range over 3 years is refused before anything is sent, with the limit named.
    await page.getByLabel('From').fill('2020-01-01');
    await page.getByText(/at most 3 years/).first().waitFor();
    await page.close();
  });

  it('shows a supplier user its own card only, without the ranking', async () => {
    await ctx.clearCookies();
    const page = await ctx.newPage();
    await signIn(page, BASE, DEMO.supplierNorthgate);
    await page.waitForURL(`${BASE}/`);
    await page.goto(`${BASE}/scorecards`);
    await page.getByRole('heading', { name: 'Your scorecard' }).waitFor();
    await page.getByRole('article', { name: 'Scorecard of Northgate Lamination Ltd' }).waitFor();
    expect(await page.getByRole('article').count()).toBe(1);
    expect(await page.getByRole('table', { name: 'Supplier ranking' }).count()).toBe(0);
    await screenshot(page, 'scorecards-supplier');
    await page.close();
  });
});
