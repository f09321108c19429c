import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import fs from 'node:fs';
import path from 'node:path';
import sharp from 'sharp';
import { ARTIFACTS, isLoopback, launchBrowser, screenshot, signIn, watchRequests } from '../support/browser';
import { E2E_BASE_URL as BASE } from '../support/env';
import { DEMO, signedIn, type Http } from '../support/http';
import { makeGauge, makePart, makeSupplier } from '../support/factories';

const stamp = () => `${Date.now().toString(36)}${Math.floor(Math.random() * 1000)}`.toUpperCase();
const CORES = 3;

let ctx: BrowserContext;
let eng: Http;
let insp: Http;
let supplierName: string;
let partNumber: string;

/** Deterministic noise in [-1, 1], so the drifting series is the same every run. */
function noise(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return (s / 2 ** 32) * 2 - 1;
  };
}

beforeAll(async () => {
  ctx = await launchBrowser({ width: 1366, height: 900 });
  eng = await signedIn(BASE, DEMO.engineer);
  insp = await signedIn(BASE, DEMO.inspector);
  supplierName = `Drift Press ${stamp()}`;
  const supplier = await makeSupplier(eng, { name: supplierName });
  const part = await makePart(eng, { partNumber: `DRF-${stamp()}`, description: 'Drift watch e2e core' });
  partNumber = part.partNumber;
  const gauge = await makeGauge(eng, { kind: 'burr-gauge', unit: 'µm', resolution: 0.1, description: 'Burr gauge' });
  const plan = await eng.post('/api/plans', {
    partId: part.id,
    samplingKind: 'zero-acceptance',
    zeroSampleSize: CORES,
    characteristics: [
      { code: 'BURR', name: 'Burr height', kind: 'variable', unit: 'µm', lsl: null, usl: 50, layout: 'single', readingsPerSample: 4, gaugeKind: 'burr-gauge', chartKind: 'xbar-r', subgroupSize: 4, wearDriven: true, severity: 'major' },
    ],
  });
  expect(plan.status).toBe(201);
  expect((await eng.post(`/api/plans/${plan.body.id}/activate`, { version: plan.body.version })).status).toBe(200);
  // 14 steady lots, then a wearing die: burr climbs about 1.6 µm a lot toward the 50 µm limit.
  const rnd = noise(11);
  for (let i = 0; i < 30; i++) {
    const mean = i < 14 ? 21 : 21 + 1.6 * (i - 13);
    const lot = await insp.post('/api/lots', { supplierId: supplier.id, partId: part.id, supplierLotNumber: `DR-${i + 1}`, quantity: 60, receivedAt: new Date(Date.now() - (40 - i) * 86_400_000).toISOString() });
    expect(lot.status).toBe(201);
    const readings = lot.body.samples.map((s: { id: string }) => ({ sampleId: s.id, characteristicCode: 'BURR', gaugeId: gauge.id, values: [0, 1, 2, 3].map(() => Math.round((mean + 1.4 * rnd()) * 10) / 10) }));
    expect((await insp.put(`/api/lots/${lot.body.id}/readings`, { readings })).status).toBe(200);
    const now = await insp.get(`/api/lots/${lot.body.id}`);
    expect((await insp.post(`/api/lots/${lot.body.id}/decision`, { decision: 'accept', comment: 'To plan', version: now.body.version })).status).toBe(200);
  }
}, 180_000);
afterAll(async () => {
  await ctx?.close();
});

async function engineerPage(): Promise<{ page: Page; requests: string[] }> {
  await ctx.clearCookies();
  const page = await ctx.newPage();
  const requests = watchRequests(page);
  await signIn(page, BASE, DEMO.engineer);
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
  return { page, requests };
}

describe('Drift watch', () => {
  it('the engineer opens a drifting burr chart, sees the flagged points and the forecast, and freezes limits', async () => {
    const { page, requests } = await engineerPage();
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Drift watch' }).click();
    await page.getByRole('heading', { name: 'Drift watch' }).waitFor();
    const row = page.getByRole('row', { name: new RegExp(`${partNumber} BURR`) });
    await row.waitFor();
    expect(await row.textContent()).toMatch(/Signal|Die service due/);
    expect(await row.textContent()).toMatch(/about \d+ lots?/);
    await screenshot(page, 'drift-watch');

    // The chart library arrives only now, with the chart page.
    const before = requests.filter((u) => /control-charts/.test(u)).length;
    expect(before).toBe(0);
    await row.getByRole('link', { name: 'BURR' }).click();
    await page.getByRole('heading', { name: 'BURR · Burr height' }).waitFor();
    await page.locator('[data-export="chart"] svg.recharts-surface').first().waitFor();
    expect(requests.some((u) => /control-charts/.test(u))).toBe(true);

    const info = await page.getByText(/flagged points: \d+/).textContent();
    expect(Number(/flagged points: (\d+)/.exec(info ?? '')?.[1])).toBeGreaterThan(0);
    // Flag markers are drawn as diamonds on the chart.
    expect(await page.locator('[data-export="chart"] path[stroke-width="2.2"]').count()).toBeGreaterThan(0);
    const forecast = page.getByRole('region', { name: 'Die-wear forecast' });
    expect(await forecast.textContent()).toMatch(/About \d+ lots? left before the burr height limit; conservative \d+ lots?/);
    await expect.poll(() => page.getByRole('region', { name: 'Capability' }).textContent()).toMatch(/Cpk/);

    // Hovering a flagged point names the lot, core and rule.
    const mark = page.locator('[data-export="chart"] path[stroke-width="2.2"]').last();
    const box = await mark.boundingBox();
    if (box) await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    const tip = page.locator('[role="status"]').filter({ hasText: /Lot \d+ · core \d/ });
    await tip.first().waitFor();
    expect(await tip.first().textContent()).toMatch(/we\d|trend6/);
    await screenshot(page, 'drift-chart-burr');

    // Exports: every point as CSV, the charts as one PNG drawn from their SVG.
    const [csv] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Export CSV' }).click()]);
    const csvText = fs.readFileSync((await csv.path())!, 'utf8');
    expect(csvText.split('\n')[0]).toBe('index,lot_ref,lot_id,received_at,core,part,value,range,unit,center,lcl,ucl,limit_version,rules,messages');
    expect(csvText.trim().split('\n')).toHaveLength(1 + 30 * CORES);
    const [png] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Export PNG' }).click()]);
    const pngFile = path.join(ARTIFACTS, 'drift-export.png');
    await png.saveAs(pngFile);
    const meta = await sharp(pngFile).metadata();
    expect(meta.format).toBe('png');
    expect(meta.width).toBeGreaterThan(1000);
    expect(meta.height).toBeGreaterThan(600);

    await page.getByRole('button', { name: 'Freeze limits…' }).click();
    const dialog = page.getByRole('dialog', { name: 'Freeze control limits' });
    await dialog.waitFor();
    // The reason is required: the form says so before sending.
    await dialog.getByRole('button', { name: 'Freeze limits' }).click();
    await dialog.getByText('Give the reason for freezing these limits').waitFor();
    await dialog.getByLabel(/Baseline: first subgroups/).fill('36');
    await dialog.getByLabel(/Reason/).fill('Baseline from the steady lots before the die began to wear');
    await screenshot(page, 'drift-freeze-dialog');
    await dialog.getByRole('button', { name: 'Freeze limits' }).click();
    await dialog.waitFor({ state: 'hidden' });
    await page.getByText('Limits version 1').waitFor();
    expect(await page.getByText(/from the first 36 subgroups/).count()).toBeGreaterThan(0);
    await screenshot(page, 'drift-chart-frozen');
    expect(requests.filter((u) => !isLoopback(u))).toEqual([]);
    await page.close();
  });

  /** The burr chart's signal table, as the engineer. */
  async function signalsTable() {
    const { page } = await engineerPage();
    await page.goto(`${BASE}/drift-watch`);
    await page.getByRole('row', { name: new RegExp(`${partNumber} BURR`) }).getByRole('link', { name: 'BURR' }).click();
    const table = page.getByRole('table', { name: 'Drift signals' });
    await table.waitFor();
    return { page, table };
  }

  it('acknowledges a signal with a note', async () => {
    const { page, table } = await signalsTable();
    const first = table.getByRole('button', { name: /^Acknowledge/ }).first();
    const label = (await first.getAttribute('aria-label')) ?? '';
    expect(label).toMatch(/^Acknowledge \S+ (\(spread\) )?on lot \d+$/);
    await first.click();
    const dialog = page.getByRole('dialog', { name: 'Acknowledge signal' });
    await dialog.getByLabel(/What was found or done/).fill('Supplier asked to check the die; next lots watched closely');
    await dialog.getByRole('button', { name: 'Acknowledge' }).click();
    await dialog.waitFor({ state: 'hidden' });
    // That signal is no longer open: its button is gone and the note is on the row.
    await expect.poll(() => table.getByRole('button', { name: label, exact: true }).count()).toBe(0);
    await page.close();
  });

  it('opens an NCR from a signal, prefilled from the chart, and the signal then links to it', async () => {
    const { page, table } = await signalsTable();
    const first = table.getByRole('button', { name: /^Open an NCR from/ }).first();
    const label = (await first.getAttribute('aria-label')) ?? '';
    const lotRef = /on lot (\d+)$/.exec(label)?.[1];
    expect(lotRef).toBeTruthy();
    await first.click();
    const form = page.getByRole('form', { name: 'Raise an NCR from a drift signal' });
    await form.waitFor();
    // Drafted from the signal: the characteristic and rule, the lot and its message, the BURR code.
    expect(await form.getByLabel('Title').inputValue()).toMatch(/^Burr height/);
    expect(await form.getByLabel('Found').inputValue()).toMatch(new RegExp(`^Lot ${lotRef}\\b`));
    await expect.poll(() => form.getByRole('checkbox', { name: /BURR/ }).isChecked()).toBe(true);
    // The suspect quantity is the engineer's to give: sending without it is refused inline.
    await page.getByRole('button', { name: 'Raise NCR', exact: true }).click();
    await form.getByText(/Enter the number of suspect cores/).waitFor();
    await form.getByLabel(/Suspect quantity/).fill('120');
    await screenshot(page, 'drift-raise-ncr');
    await page.getByRole('button', { name: 'Raise NCR', exact: true }).click();
    await page.waitForURL(/\/nonconformances\/[0-9a-f-]{36}$/);
    const number = (await page.getByRole('heading', { level: 1 }).textContent()) ?? '';
    expect(number).toMatch(/^NCR-\d{4}-\d{4}$/);
    // Back on the chart, the signal names the NCR and offers nothing more.
    await page.getByRole('link', { name: 'BURR control chart' }).click();
    await table.waitFor();
    // Open signals are listed first; the one taken into the NCR may be past the first 20.
    const showAll = page.getByRole('button', { name: /^Show all \d+$/ });
    if ((await showAll.count()) > 0) await showAll.click();
    await table.getByRole('link', { name: number }).waitFor();
    expect(await table.getByRole('button', { name: label, exact: true }).count()).toBe(0);
    await page.close();
  });

  it('is not offered to suppliers', async () => {
    await ctx.clearCookies();
    const page = await ctx.newPage();
    await signIn(page, BASE, DEMO.supplierNorthgate);
    await page.getByRole('navigation', { name: 'Main' }).waitFor();
    const nav = await page.getByRole('navigation', { name: 'Main' }).getByRole('link').allTextContents();
    expect(nav.map((t) => t.trim())).not.toContain('Drift watch');
    await page.close();
  });
});
