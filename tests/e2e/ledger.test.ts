import fs from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { launchBrowser, screenshot, signIn } from '../support/browser';
import { E2E_BASE_URL as BASE } from '../support/env';
import { DEMO, signedIn, type Http } from '../support/http';
import { makeGauge, makePart, makeSupplier, simpleCharacteristic } from '../support/factories';

let ctx: BrowserContext;
let eng: Http;
let insp: Http;

const stamp = () => `${Date.now().toString(36)}${Math.floor(Math.random() * 1000)}`.toUpperCase();

/** A lot carried through the real API from receipt to decision, as the dock would. */
async function decidedLot() {
  const bore = await makeGauge(eng, { kind: 'bore-gauge' });
  const burr = await makeGauge(eng, { kind: 'burr-gauge', unit: 'µm', resolution: 1, description: 'Burr gauge' });
  const supplier = await makeSupplier(eng, { name: 'Ledger Test Stampings' });
  const part = await makePart(eng);
  const plan = await eng.post('/api/plans', {
    partId: part.id,
    samplingKind: 'aql',
    inspectionLevel: 'II',
    aql: 1.0,
    characteristics: [
      simpleCharacteristic({ code: 'BORE' }),
      simpleCharacteristic({ code: 'BURR', name: 'Burr height', unit: 'µm', nominal: null, lsl: null, usl: 50, readingsPerSample: 4, gaugeKind: 'burr-gauge', severity: 'minor' }),
    ],
  });
  expect((await eng.post(`/api/plans/${plan.body.id}/activate`, { version: plan.body.version })).status).toBe(200);
  const supplierLotNumber = `LDG-${stamp()}`;
  const lot = await insp.post('/api/lots', { supplierId: supplier.id, partId: part.id, supplierLotNumber, quantity: 30, heatNumbers: ['H-7731'] });
  expect(lot.status).toBe(201);
  const readings = lot.body.samples.flatMap((s: { id: string }) => [
    { sampleId: s.id, characteristicCode: 'BORE', values: [150.012], gaugeId: bore.id },
    { sampleId: s.id, characteristicCode: 'BURR', values: [17, 19, 21, 18], gaugeId: burr.id },
  ]);
  expect((await insp.put(`/api/lots/${lot.body.id}/readings`, { readings })).status).toBe(200);
  const fresh = await insp.get(`/api/lots/${lot.body.id}`);
  const dec = await insp.post(`/api/lots/${lot.body.id}/decision`, { decision: 'accept', comment: 'All cores within limits (browser test)', version: fresh.body.version });
  expect(dec.status).toBe(200);
  return { lot: dec.body, supplierLotNumber, part, boreDue: bore.calibrationDueOn as string, boreTag: bore.assetTag as string };
}

beforeAll(async () => {
  ctx = await launchBrowser({ width: 1366, height: 900 });
  eng = await signedIn(BASE, DEMO.engineer);
  insp = await signedIn(BASE, DEMO.inspector);
});
afterAll(async () => {
  await ctx?.close();
});

async function pageAs(email: string): Promise<Page> {
  await ctx.clearCookies();
  const page = await ctx.newPage();
  await signIn(page, BASE, email);
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
  return page;
}

describe('History ledger', () => {
  it('the auditor finds a lot by its supplier lot number, follows its story and downloads its PDF', async () => {
    const d = await decidedLot();
    const page = await pageAs(DEMO.auditor);
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'History ledger' }).click();
    await page.getByRole('heading', { name: 'History ledger' }).waitFor();
    await page.getByRole('status', { name: 'Audit chain' }).getByText(/Chain intact · [\d,.\s ]+ records · checked/).waitFor();

    await page.getByRole('searchbox', { name: 'Lot ref, supplier lot, heat or PO number' }).fill(d.supplierLotNumber);
    const row = page.getByRole('link', { name: `Story of lot ${d.lot.ref}, supplier lot ${d.supplierLotNumber}` });
    await row.waitFor();
    // The search narrowed the list to this lot alone.
    await page.getByText('1–1 of 1').waitFor();
    await screenshot(page, 'ledger-search');
    await row.click();

    await page.getByRole('heading', { name: `Lot ${d.lot.ref} · ${d.supplierLotNumber}` }).waitFor();
    const timeline = page.getByRole('region', { name: 'Timeline' });
    await timeline.locator('li[data-kind="decision"]').waitFor();
    const kinds = await timeline.locator('li[data-kind]').evaluateAll((els) => els.map((e) => e.getAttribute('data-kind')));
    const at = (k: string) => kinds.indexOf(k);
    expect(at('received')).toBeGreaterThanOrEqual(0);
    expect(at('received')).toBeLessThan(at('readings'));
    expect(at('readings')).toBeLessThan(at('decision'));
    // The gauge with the calibration due date it had when the readings were taken.
    await timeline.getByLabel('Gauges used').getByText(`${d.boreTag} · due ${d.boreDue}`).waitFor();
    await timeline.getByText(/^Accepted — released/).waitFor();
    await screenshot(page, 'ledger-lot-story');

    // The readings of the save open in place.
    await timeline.getByRole('button', { name: /Show the \d+ readings/ }).click();
    await page.getByRole('table', { name: 'Readings of this save' }).waitFor();

    const downloaded = page.waitForEvent('download');
    await page.getByRole('button', { name: 'Download PDF report' }).click();
    const dl = await downloaded;
    expect(dl.suggestedFilename()).toMatch(new RegExp(`^yokeline-lot-${d.lot.ref}-report-.*\\.pdf$`));
    const file = await dl.path();
    expect(fs.readFileSync(file).subarray(0, 5).toString('latin1')).toBe('%PDF-');
    await page.getByText(/^Downloaded yokeline-lot-/).waitFor();
    await page.mouse.move(0, 0);
    await screenshot(page, 'ledger-lot-downloaded');
    await page.close();
  });

  it('browses the raw audit records with filters and exports them as CSV', async () => {
    const page = await pageAs(DEMO.auditor);
    await page.goto(`${BASE}/history-ledger?tab=audit`);
    const table = page.getByRole('table', { name: 'Audit records' });
    await table.waitFor();
    await page.getByLabel('Entity').first().selectOption('lot');
    await page.getByRole('searchbox', { name: 'Action' }).fill('lot.accepted');
    // Only accepted-lot records remain once the filtered page has arrived.
    const actions = () => table.locator('tbody tr td:nth-child(4)').allTextContents();
    await expect.poll(async () => { const a = await actions(); return a.length > 0 && a.every((x) => x === 'lot.accepted'); }, { timeout: 10_000 }).toBe(true);
    await table.getByRole('button', { name: /^Details of record/ }).first().click();
    await table.getByText(/hash: {10}[0-9a-f]{64}/).waitFor();
    const downloaded = page.waitForEvent('download');
    await page.getByRole('button', { name: 'Export audit records (CSV)' }).click();
    const dl = await downloaded;
    expect(dl.suggestedFilename()).toMatch(/^yokeline-audit-events-.*\.csv$/);
    const csv = fs.readFileSync(await dl.path(), 'utf8');
    expect(csv.split('\r\n')[0]).toContain('id,at,actor_email,action');
    await page.getByText(/^Downloaded yokeline-audit-events-/).waitFor();
    await screenshot(page, 'ledger-audit-records');
    await page.close();
  });

  it('keeps the ledger from inspectors', async () => {
    const page = await pageAs(DEMO.inspector);
    await expect(page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'History ledger' }).count()).resolves.toBe(0);
    await page.goto(`${BASE}/history-ledger`);
    await page.getByText('The History ledger is for auditors, engineers and administrators').waitFor();
    await page.close();
  });
});
