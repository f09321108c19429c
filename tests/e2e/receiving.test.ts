import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import sharp from 'sharp';
import path from 'node:path';
import { ARTIFACTS, launchBrowser, screenshot, signIn } from '../support/browser';
import { E2E_BASE_URL as BASE } from '../support/env';
import { DEMO, signedIn, type Http } from '../support/http';
import { makeGauge } from '../support/factories';
import { benchFixture, stamp } from '../support/bench-fixture';

const PDF = Buffer.from('%PDF-1.4\n1 0 obj <<>> endobj\ntrailer <<>>\n%%EOF\n');

let ctx: BrowserContext;
let eng: Http;
let supplierId: string;
let partId: string;
let partLabel: string;
let boreTag: string;
let burrTag: string;

beforeAll(async () => {
  ctx = await launchBrowser({ width: 1280, height: 800 });
  eng = await signedIn(BASE, DEMO.engineer);
  ({ supplierId, partId, partLabel, boreTag, burrTag } = await benchFixture(eng, { partPrefix: 'RCV', description: 'Receiving e2e core, 48 slots', tagPrefix: ['BG', 'BU'] }));
  // An overdue bore gauge: listed, but not selectable.
  await makeGauge(eng, { assetTag: `BX-${stamp()}`, kind: 'bore-gauge', calibrationDueOn: '2020-01-31' });
});
afterAll(async () => {
  await ctx?.close();
});

async function inspectorPage(): Promise<Page> {
  await ctx.clearCookies();
  const page = await ctx.newPage();
  await signIn(page, BASE, DEMO.inspector);
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
  return page;
}

const focused = (page: Page) => page.evaluate(() => document.activeElement?.getAttribute('aria-label') ?? document.activeElement?.textContent ?? '');

/** Types a value and presses Enter, then checks the sheet moved on to the cell expected next. */
async function enter(page: Page, value: string, next: string | RegExp) {
  await page.keyboard.type(value);
  await page.keyboard.press('Enter');
  await expect.poll(() => focused(page)).toMatch(next);
}

/** Chooses a gauge with the keyboard: focus its picker and type the start of its asset tag. */
async function chooseGauge(page: Page, code: string, kind: string, tag: string) {
  const picker = page.getByLabel(`Gauge for ${code} (${kind})`);
  // The list arrives after the sheet; the picker is disabled until then.
  await picker.locator('option', { hasText: tag }).waitFor({ state: 'attached' });
  await expect.poll(() => picker.isEnabled()).toBe(true);
  await picker.focus();
  await page.keyboard.type(tag);
  await expect.poll(async () => (await picker.locator('option:checked').textContent()) ?? '').toContain(tag);
}

describe('receiving at the dock', () => {
  it('an inspector receives a lot, enters a full sample by keyboard alone, attaches a photo, sees an out-of-tolerance bore flagged, and rejects the lot', async () => {
    const page = await inspectorPage();

    // ── The Dock.
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Dock' }).click();
    await page.getByRole('heading', { name: 'Dock' }).waitFor();
    await page.getByRole('table', { name: 'Lots waiting' }).or(page.getByText('No lots waiting')).waitFor();
    await screenshot(page, 'receiving-dock');

    // ── Receive a lot of 10 cores.
    await page.getByRole('button', { name: 'Receive a lot' }).click();
    const form = page.getByRole('form', { name: 'Receive a lot' });
    await form.getByRole('combobox', { name: /^Supplier/ }).selectOption(supplierId);
    // The part list loads for the chosen supplier: wait for it, then there must be exactly one.
    await expect.poll(() => form.getByLabel('Part revision').locator('option', { hasText: partLabel }).count()).toBe(1);
    await form.getByLabel('Part revision').selectOption(partId);
    const lotNumber = `NGL-${stamp()}`;
    await form.getByLabel('Supplier lot number').fill(lotNumber);
    await form.getByLabel('PO number').fill('PO-77812');
    await form.getByLabel('Quantity (cores)').fill('10');
    await form.getByLabel('Heat or coil number').fill('H24-0817');
    await form.getByLabel('Heat or coil number').press('Enter');
    await form.getByLabel('Heat or coil number').fill('H24-0818');
    await form.getByLabel('Heat or coil number').press('Enter');
    await form.getByRole('list', { name: 'Heat numbers' }).getByText('H24-0818').waitFor();
    await form.getByLabel('Certificate of conformance').setInputFiles({ name: 'coc.pdf', mimeType: 'application/pdf', buffer: PDF });
    // Before receipt the sample is already shown, from the same ISO 2859-1 functions the server uses.
    await form.getByLabel('Expected sampling').getByText('Sample 3 cores').waitFor();
    await screenshot(page, 'receiving-receive-form');
    await page.getByRole('button', { name: 'Receive lot' }).click();

    // ── The Lot file, with the computed sampling shown clearly.
    await page.waitForURL(/\/lots\/[0-9a-f-]{36}$/);
    const lotId = /\/lots\/([0-9a-f-]{36})$/.exec(page.url())![1];
    await page.getByText(/Lot \d+ received/).waitFor();
    // The receive dialog's modal hid the app from assistive technology; leaving it must undo that.
    await expect.poll(() => page.locator('#root').getAttribute('aria-hidden')).toBeNull();
    const sampling = page.getByRole('group', { name: 'Sampling' });
    await sampling.getByText('3 of 10').waitFor();
    await page.getByRole('link', { name: 'coc.pdf' }).waitFor();

    // ── Gauges by keyboard; the overdue one is listed but disabled.
    await chooseGauge(page, 'BORE', 'bore gauge', boreTag);
    await chooseGauge(page, 'BURR', 'burr gauge', burrTag);
    expect(await page.getByLabel('Gauge for BORE (bore gauge)').locator('option[disabled]', { hasText: 'calibration overdue since 2020-01-31' }).count()).toBeGreaterThan(0);
    await page.getByLabel('Handling cautions').getByText(/Sharp edges/).first().waitFor();

    // ── A full sample by keyboard: Tab from the last gauge picker lands on core 1's bore.
    await page.keyboard.press('Tab');
    await expect.poll(() => focused(page)).toBe('Core 1 BORE Value (mm)');
    const bores = ['150.012', '150.200', '149.990'];
    for (let core = 1; core <= 3; core++) {
      await enter(page, bores[core - 1], `Core ${core} BURR #1 (µm)`);
      await enter(page, '12', `Core ${core} BURR #2 (µm)`);
      await enter(page, '14', `Core ${core} BURR #3 (µm)`);
      await enter(page, '11', `Core ${core} BURR #4 (µm)`);
      await enter(page, '13', /^(✓ )?Pass$/);
      if (core < 3) {
        // Enter on Pass passes the paperwork check and moves on to the next core.
        await page.keyboard.press('Enter');
        await expect.poll(() => focused(page)).toBe(`Core ${core + 1} BORE Value (mm)`);
      } else {
        // F fails it and asks what failed; the check is sent once the note is there.
        await page.keyboard.press('f');
        await expect.poll(() => focused(page)).toBe('Core 3 PAPERS: what failed (required)');
        await page.keyboard.type('Heat H24-0818 is not on the certificate');
        await page.keyboard.press('Enter');
      }
    }

    // ── The out-of-tolerance bore is flagged in words, not colour alone.
    const core2 = page.getByRole('row', { name: 'Core 2' });
    await expect.poll(() => core2.locator('[data-verdict="out"]').first().textContent()).toBe('out');
    expect(await page.getByRole('row', { name: 'Core 1' }).locator('[data-verdict="out"]').count()).toBe(0);
    await core2.getByText('✕ 1 out').waitFor();
    await page.getByRole('status', { name: 'Readings sent' }).getByText('All readings saved').waitFor();

    // ── A photo of core 2, with upload progress, then its thumbnail.
    const jpeg = await sharp({ create: { width: 64, height: 48, channels: 3, background: '#888' } }).jpeg().toBuffer();
    await page.getByLabel('Photos of core 2', { exact: true }).setInputFiles({ name: 'bore-core-2.jpg', mimeType: 'image/jpeg', buffer: jpeg });
    await page.getByRole('button', { name: /Open photo: Core 2/ }).waitFor();
    await core2.getByText('Photo (1)').waitFor();
    await screenshot(page, 'receiving-bench-sheet');
    // And as the inspector sees it on a 1280 × 800 tablet, scrolled to the sheet.
    await page.getByRole('heading', { name: 'Bench sheet' }).evaluate((el) => el.scrollIntoView({ block: 'start' }));
    await page.screenshot({ path: path.join(ARTIFACTS, 'receiving-bench-sheet-tablet.png') });

    // ── The server agrees, then the decision: reject → on hold.
    const saved = await eng.get(`/api/lots/${lotId}`);
    expect(saved.body.status).toBe('inspecting');
    expect(saved.body.readings.filter((r: { characteristicCode: string }) => r.characteristicCode === 'BORE').map((r: { conforming: boolean }) => r.conforming).sort()).toEqual([false, true, true]);
    expect(saved.body.photos).toHaveLength(1);
    const papers = saved.body.readings.filter((r: { characteristicCode: string }) => r.characteristicCode === 'PAPERS');
    expect(papers.map((r: { pass: boolean }) => r.pass).sort()).toEqual([false, true, true]);
    expect(papers.find((r: { pass: boolean }) => !r.pass).note).toBe('Heat H24-0818 is not on the certificate');
    const decision = page.getByRole('region', { name: 'Decision' });
    await decision.getByText('Proposal: reject').waitFor();
    await decision.getByText(/2 nonconforming ≥ Re 1/).waitFor();
    expect(await decision.getByRole('button', { name: 'Accept lot' }).isDisabled()).toBe(true);
    await decision.getByLabel(/Comment for the record/).focus();
    await page.keyboard.type('Core 2 bore 150.200 mm, above the 150.05 limit.');
    await decision.getByRole('button', { name: 'Reject lot — put on hold' }).click();
    await page.getByRole('group', { name: 'Sampling' }).waitFor();
    await page.getByText('On hold', { exact: true }).first().waitFor();
    await decision.getByText(/nonconformance report follows in review/).waitFor();
    // The decision moved the supplier × part switching state; its history names this lot.
    await page.getByRole('list', { name: 'Switching history' }).getByText('this lot', { exact: false }).waitFor();
    await screenshot(page, 'receiving-on-hold');
    const held = await eng.get(`/api/lots/${lotId}`);
    expect(held.body.status).toBe('on-hold');
    expect(held.body.decisionComment).toMatch(/150\.200/);
    await page.close();
  });

  it('keeps readings the server could not take, through a reload, and sends them when it is back', async () => {
    const r = await eng.post('/api/lots', { supplierId, partId, supplierLotNumber: `NGL-${stamp()}`, quantity: 10 });
    expect(r.status).toBe(201);
    const lotId = r.body.id as string;
    const page = await inspectorPage();
    // The server is "down" for readings: every PUT fails as if the network dropped.
    await page.route('**/api/lots/*/readings', (route) => route.abort('internetdisconnected'));
    await page.goto(`${BASE}/lots/${lotId}`);
    await chooseGauge(page, 'BORE', 'bore gauge', boreTag);
    await page.getByLabel('Core 1 BORE Value (mm)').focus();
    await page.keyboard.type('150.004');
    await page.keyboard.press('Enter');
    const status = page.getByRole('status', { name: 'Readings sent' });
    await status.getByText(/1 reading not sent yet — retrying/).waitFor();
    await screenshot(page, 'receiving-unsent');

    // Reload while still offline: the reading comes back from this browser and is retried.
    await page.reload();
    expect(await page.getByLabel('Core 1 BORE Value (mm)').inputValue()).toBe('150.004');
    await status.getByText(/1 reading not sent yet — retrying/).waitFor();
    expect((await eng.get(`/api/lots/${lotId}`)).body.readings).toHaveLength(0);

    // Back online: it is sent, and the server has it.
    await page.unroute('**/api/lots/*/readings');
    await status.getByRole('button', { name: 'Retry now' }).click();
    await status.getByText('All readings saved').waitFor();
    const after = await eng.get(`/api/lots/${lotId}`);
    expect(after.body.readings.map((x: { characteristicCode: string; values: number[] }) => [x.characteristicCode, x.values])).toEqual([['BORE', [150.004]]]);
    expect(await page.evaluate((id) => localStorage.getItem(`yokeline.unsent.${id}`), lotId)).toBeNull();
    await page.close();
  });

  it('shows the server refusing a reading on the core it concerns, and a photo that is not an image', async () => {
    const r = await eng.post('/api/lots', { supplierId, partId, supplierLotNumber: `NGL-${stamp()}`, quantity: 10 });
    const lotId = r.body.id as string;
    const page = await inspectorPage();
    // As the server answers for a gauge that went overdue between choosing it and saving.
    await page.route('**/api/lots/*/readings', (route) =>
      route.fulfill({ status: 400, contentType: 'application/json', body: JSON.stringify({ error: 'validation', message: 'Some readings were refused; nothing was saved', fields: { 'readings.0.gaugeId': `Gauge ${boreTag} was due for calibration on 2026-01-01: readings taken with it are refused. Use a calibrated gauge.` } }) }),
    );
    await page.goto(`${BASE}/lots/${lotId}`);
    await chooseGauge(page, 'BORE', 'bore gauge', boreTag);
    await page.getByLabel('Core 1 BORE Value (mm)').focus();
    await page.keyboard.type('150.010');
    await page.keyboard.press('Enter');
    const alert = page.getByRole('row').filter({ hasText: 'BORE (gauge)' });
    await alert.getByText(/Core 1: BORE \(gauge\): Gauge .* was due for calibration/).waitFor();
    await page.getByRole('status', { name: 'Readings sent' }).getByText('1 reading refused — see the marked cores').waitFor();

    // A text file named .jpg: the server sniffs the bytes and refuses it (415), in words.
    await page.getByLabel('Add photos to the lot', { exact: true }).setInputFiles({ name: 'not-a-photo.jpg', mimeType: 'image/jpeg', buffer: Buffer.from('hello, I am text') });
    await page.getByRole('list', { name: 'Photo uploads' }).getByRole('alert').getByText('Photos must be JPEG, PNG or WebP images').waitFor();
    await page.close();
  });
});
