import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Locator, Page } from 'playwright-core';
import { HANDLING_CAUTIONS } from '../../shared/compute/plan-templates';
import { launchBrowser, screenshot, signIn } from '../support/browser';
import { E2E_BASE_URL as BASE } from '../support/env';
import { DEMO, signedIn, type Http } from '../support/http';
import { benchFixture, stamp } from '../support/bench-fixture';

let ctx: BrowserContext;
let eng: Http;
let supplierId: string;
let partId: string;
let boreTag: string;
let burrTag: string;

beforeAll(async () => {
  ctx = await launchBrowser({ width: 1280, height: 900 });
  eng = await signedIn(BASE, DEMO.engineer);
  ({ supplierId, partId, boreTag, burrTag } = await benchFixture(eng, { partPrefix: 'IMP', description: 'Import e2e core, 48 slots', tagPrefix: ['BI', 'UI'] }));
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

/** Picks a gauge in the import dialog by its asset tag (other gauges of the kind exist, so none is preselected). */
async function chooseGauge(dialog: Locator, code: string, kind: string, tag: string) {
  const picker = dialog.getByLabel(`Gauge for ${code} (${kind})`);
  const option = picker.locator('option', { hasText: tag });
  await option.waitFor({ state: 'attached' });
  await expect.poll(() => picker.isEnabled()).toBe(true);
  await picker.selectOption((await option.getAttribute('value'))!);
}

/**
 * A CMM export: semicolons with decimal commas, a note column nobody maps (long, so the upload
 * lasts long enough to watch its progress when the link is throttled).
 */
function cmmFile(rows: string[]): { name: string; mimeType: string; buffer: Buffer } {
  const note = `CMM program STATOR-48 rev C, probe 2 mm ruby, ${'operator remark '.repeat(1500)}`.trim();
  const text = ['Core;BORE mm;BURR_1;BURR_2;BURR_3;BURR_4;Papers;Note', ...rows.map((r) => `${r};${note}`)].join('\r\n') + '\r\n';
  return { name: 'cmm-export.csv', mimeType: 'text/csv', buffer: Buffer.from(text, 'utf8') };
}

describe('gauge CSV import', () => {
  it('refuses a file with one bad row by its line, imports the corrected file with progress, and knows it the second time', async () => {
    const r = await eng.post('/api/lots', { supplierId, partId, supplierLotNumber: `NGL-${stamp()}`, quantity: 10 });
    expect(r.status).toBe(201);
    const lotId = r.body.id as string;
    expect(r.body.samples).toHaveLength(3); // ISO 2859-1 Tables 1 and 2-A: lot 10 at S-2 → code letter A; at AQL 4.0 the arrow leads to plan B, n 3
    const page = await inspectorPage();
    await page.goto(`${BASE}/lots/${lotId}`);
    await page.getByRole('table', { name: 'Bench sheet' }).waitFor();

    // ── Choose the file: previewed in the browser, the columns guessed from their names.
    await page.getByRole('button', { name: 'Import gauge CSV' }).click();
    const dialog = page.getByRole('dialog', { name: 'Import gauge CSV' });
    const bad = cmmFile(['1;150,012;12;14;11;13;ok', '2;150,0x1;15;16;14;15;ok', '3;149,990;11;12;10;12;ok']);
    await dialog.getByLabel('Gauge CSV file').setInputFiles(bad);
    const preview = dialog.getByRole('table', { name: 'CSV preview' });
    await preview.getByText('150,0x1').waitFor();
    await dialog.getByText('separated by semicolons (;)', { exact: false }).waitFor();
    expect(await dialog.getByLabel('Core serial column').inputValue()).toBe('Core');
    expect(await dialog.getByLabel('BORE Value column').inputValue()).toBe('BORE mm');
    for (let i = 1; i <= 4; i++) expect(await dialog.getByLabel(`BURR #${i} column`).inputValue()).toBe(`BURR_${i}`);
    expect(await dialog.getByLabel('PAPERS Pass / fail column').inputValue()).toBe('Papers');
    // The note column is shown but mapped to nothing.
    expect(await preview.getByRole('columnheader', { name: 'Note' }).textContent()).toBe('Note');
    expect(await preview.getByRole('columnheader', { name: /BORE mm/ }).textContent()).toBe('→ BOREBORE mm');
    // Measured values need their gauge before the import is allowed.
    expect(await dialog.getByRole('button', { name: 'Import', exact: true }).isDisabled()).toBe(true);
    await chooseGauge(dialog, 'BORE', 'bore gauge', boreTag);
    await chooseGauge(dialog, 'BURR', 'burr gauge', burrTag);
    await dialog.getByText(/Ready: 3 rows × BORE, BURR, PAPERS/).waitFor();
    await screenshot(page, 'import-dialog-mapped');

    // ── One bad row: the server names its line and reason, and nothing goes in.
    await dialog.getByRole('button', { name: 'Import', exact: true }).click();
    await dialog.getByText('Nothing was imported').waitFor();
    const problems = dialog.getByRole('list', { name: 'Row problems' });
    await problems.getByText('line 3: BORE column “BORE mm” has “150,0x1”, not a number').waitFor();
    expect(await problems.getByRole('listitem').count()).toBe(1);
    // The same line is marked in the preview.
    expect(await preview.locator('tbody tr').nth(1).evaluate((tr) => getComputedStyle(tr).boxShadow)).not.toBe('none');
    expect(await preview.locator('tbody tr').nth(0).evaluate((tr) => getComputedStyle(tr).boxShadow)).toBe('none');
    await screenshot(page, 'import-dialog-row-error');
    expect((await eng.get(`/api/lots/${lotId}`)).body.readings).toHaveLength(0);

    // ── The corrected file (same columns: the mapping and gauges are kept), sent over a slow link.
    const good = cmmFile(['1;150,012;12;14;11;13;ok', '2;150,021;15;16;14;15;ok', '3;149,990;11;12;10;12;ok']);
    await dialog.getByLabel('Gauge CSV file').setInputFiles(good);
    await preview.getByText('150,021').waitFor();
    expect(await dialog.getByLabel('BORE Value column').inputValue()).toBe('BORE mm');
    const cdp = await ctx.newCDPSession(page);
    await cdp.send('Network.enable');
    await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 20, downloadThroughput: -1, uploadThroughput: 24 * 1024 });
    // Every value the progress bar shows while the file goes up.
    await page.evaluate(() => {
      const seen: number[] = [];
      (window as unknown as { progressSeen: number[] }).progressSeen = seen;
      new MutationObserver(() => {
        const bar = document.querySelector('[role="progressbar"][aria-label="Import upload progress"]');
        const v = bar?.getAttribute('aria-valuenow');
        if (v != null) seen.push(Number(v));
      }).observe(document.body, { subtree: true, childList: true, attributes: true, attributeFilter: ['aria-valuenow'] });
    });
    await dialog.getByRole('button', { name: 'Import', exact: true }).click();
    await dialog.getByText(/Uploading cmm-export\.csv: ([1-9]|[1-9]\d) %/).waitFor();
    await screenshot(page, 'import-dialog-progress');
    await dialog.getByText('Imported', { exact: true }).waitFor({ timeout: 30_000 });
    await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });
    const seen = await page.evaluate(() => (window as unknown as { progressSeen: number[] }).progressSeen);
    expect(seen.some((v) => v > 0 && v < 1)).toBe(true);
    await dialog.getByText('3 rows, 9 readings from cmm-export.csv', { exact: false }).waitFor();
    await screenshot(page, 'import-dialog-imported');

    // ── Closed: the sheet shows the imported values, judged as if typed.
    await dialog.getByRole('button', { name: 'Close' }).click();
    await dialog.waitFor({ state: 'detached' });
    await expect.poll(() => page.getByLabel('Core 1 BORE Value (mm)').inputValue()).toBe('150.012');
    expect(await page.getByLabel('Core 2 BORE Value (mm)').inputValue()).toBe('150.021');
    expect(await page.getByLabel('Core 3 BURR #4 (µm)').inputValue()).toBe('12');
    expect(await page.getByRole('group', { name: 'Core 2 PAPERS: pass or fail' }).getByRole('button', { name: /Pass/ }).getAttribute('aria-pressed')).toBe('true');
    await page.getByRole('heading', { name: 'Bench sheet' }).evaluate((el) => el.scrollIntoView({ block: 'start' }));
    await screenshot(page, 'import-sheet-values');
    const stored = (await eng.get(`/api/lots/${lotId}`)).body;
    expect(stored.readings.filter((x: { source: string }) => x.source === 'import')).toHaveLength(9);

    // ── The same file again: recognised, not imported twice.
    await page.getByRole('button', { name: 'Import gauge CSV' }).click();
    await dialog.getByLabel('Gauge CSV file').setInputFiles(good);
    // The gauges the lot's readings were taken with are chosen again.
    await expect.poll(async () => (await dialog.getByLabel('Gauge for BORE (bore gauge)').locator('option:checked').textContent()) ?? '').toContain(boreTag);
    await expect.poll(async () => (await dialog.getByLabel('Gauge for BURR (burr gauge)').locator('option:checked').textContent()) ?? '').toContain(burrTag);
    await dialog.getByRole('button', { name: 'Import', exact: true }).click();
    await dialog.getByText('Already imported').waitFor();
    await dialog.getByText(/already imported into this lot .*not imported again/).waitFor();
    await screenshot(page, 'import-dialog-already');
    expect((await eng.get(`/api/lots/${lotId}`)).body.readings.filter((x: { source: string }) => x.source === 'import')).toHaveLength(9);
    await page.close();
  });
});

describe('calculators', () => {
  it('computes the REFERENCES worked examples in the browser, and the server agrees', async () => {
    const page = await inspectorPage();
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Calculators' }).click();
    await page.getByRole('heading', { name: 'Calculators', level: 1 }).waitFor();

    // ── Least-squares circle: 8 points at 45° on centre (10, −5), r 25.
    const circle = page.getByRole('region', { name: 'Least-squares circle', exact: true });
    const box = circle.getByRole('textbox', { name: /^Probed points/ });
    await box.fill('0, 0\n1, 1');
    await box.blur();
    await circle.getByText('a circle needs at least 3 points').waitFor(); // the shared schema's own message
    await box.fill('0, 0\n1, 1\nabc');
    await circle.getByText('line 3: “abc” is not an x, y pair').waitFor();
    const pts = Array.from({ length: 8 }, (_, i) => `${10 + 25 * Math.cos((i * Math.PI) / 4)}, ${-5 + 25 * Math.sin((i * Math.PI) / 4)}`);
    await box.fill(pts.join('\n'));
    const fit = circle.getByRole('region', { name: 'Circle fit result' });
    await fit.getByText('50.0000 mm', { exact: true }).waitFor(); // REFERENCES Geometry (ISO 4291 least squares): 8 points at 45°, r 25 → diameter 50, exact
    await fit.getByText('(10.0000, −5.0000) mm').waitFor(); // REFERENCES Geometry: centre (10, −5) recovered exactly
    await fit.getByText('0.0000 mm = 0.0 µm').waitFor(); // ISO 12181: a perfect circle has RONt 0
    await circle.getByRole('button', { name: 'Check on server' }).click();
    await circle.getByRole('status', { name: 'Circle fit: server check' }).getByText('Server agrees').waitFor();

    // ── Eccentricity: the same bore, the OD's centre 0.03 mm over in x.
    const ecc = page.getByRole('region', { name: 'Bore-to-OD eccentricity', exact: true });
    await ecc.getByRole('textbox', { name: /^Bore points/ }).fill(pts.join('\n'));
    const od = Array.from({ length: 8 }, (_, i) => `${10.03 + 40 * Math.cos((i * Math.PI) / 4)}, ${-5 + 40 * Math.sin((i * Math.PI) / 4)}`);
    await ecc.getByRole('textbox', { name: /^OD points/ }).fill(od.join('\n'));
    const eccResult = ecc.getByRole('region', { name: 'Eccentricity result' });
    await eccResult.getByText('0.0300 mm', { exact: true }).waitFor(); // REFERENCES Geometry: eccentricity = distance between the least-squares centres
    await eccResult.getByText('0.0600 mm', { exact: true }).waitFor(); // ISO 1101 (REFERENCES): coaxiality value = 2 × centre offset
    await ecc.getByRole('button', { name: 'Check on server' }).click();
    await ecc.getByRole('status', { name: 'Eccentricity: server check' }).getByText('Server agrees').waitFor();

    // ── Stacking factor: 5.90 kg, 80 cm², 100 mm, 7.65 g/cm³.
    const sf = page.getByRole('region', { name: 'Stacking factor', exact: true });
    const byMass = sf.getByRole('form', { name: 'Stacking factor by mass' });
    await byMass.getByRole('button', { name: 'Check on server' }).click();
    await byMass.getByText('massG must be a number').waitFor(); // inline, from the shared schema
    await byMass.getByRole('textbox', { name: /^Core mass/ }).fill('5900');
    await byMass.getByRole('textbox', { name: /^Steel density/ }).fill('7.65');
    await byMass.getByRole('textbox', { name: /^Lamination net area/ }).fill('80');
    await byMass.getByRole('textbox', { name: /^Stack length/ }).fill('100');
    await byMass.getByText('= 5.900 kg', { exact: false }).waitFor();
    await byMass.getByRole('region', { name: 'Stacking factor by mass result' }).getByText('0.964 (96.4 %)').waitFor(); // REFERENCES Electrical steel (ASTM A719 / IEC 60404-13 core check): 5.90 kg, 80 cm², 100 mm, 7.65 g/cm³ → 0.964
    await byMass.getByRole('button', { name: 'Check on server' }).click();
    await byMass.getByRole('status', { name: 'Stacking factor: server check' }).getByText('Server agrees').waitFor();
    const byCount = sf.getByRole('form', { name: 'Stacking factor by count' });
    await byCount.getByRole('textbox', { name: /^Laminations/ }).fill('276');
    await byCount.getByRole('textbox', { name: /^Nominal thickness/ }).fill('0.35');
    await byCount.getByRole('textbox', { name: /^Stack length/ }).fill('100');
    await byCount.getByRole('region', { name: 'Stacking factor by count result' }).getByText('0.966 (96.6 %)').waitFor(); // S = n·t/L (common practice): 276 × 0.35 mm / 100 mm = 0.966
    await byCount.getByText(/Typical minimum for 0.35 mm strip: 0.95/).waitFor(); // IEC 60404-8-4 (memory, REFERENCES): 0.95 at 0.35 mm
    await byCount.getByRole('button', { name: 'Check on server' }).click();
    await byCount.getByRole('status', { name: 'Stacking factor by count: server check' }).getByText('Server agrees').waitFor();

    // ── Insulation: Franklin current 0.10 A, with the energized-test caution beside it.
    const ins = page.getByRole('region', { name: 'Surface insulation resistance', exact: true });
    await ins.getByRole('complementary', { name: 'Handling cautions' }).getByText(HANDLING_CAUTIONS.energized).waitFor();
    await ins.getByText(/site's procedures, local codes and licensed practice govern/).waitFor();
    await ins.getByText('ASTM A717 / IEC 60404-11', { exact: false }).first().waitFor();
    const currents = ins.getByRole('textbox', { name: /^Franklin currents/ });
    await currents.fill('1.5');
    await ins.getByRole('button', { name: 'Check on server' }).click();
    await ins.getByText('reading 1: a Franklin current is between 0 and 1 A').waitFor(); // ASTM A717: 0 A perfect insulator … 1 A short
    await currents.fill('0.10');
    await ins.getByRole('region', { name: 'Insulation result' }).getByText('58.1 Ω·cm²', { exact: true }).waitFor(); // REFERENCES Electrical steel (ASTM A717 / IEC 60404-11): Rᵢ = 6.45 (1/0.10 − 1) = 58.1 Ω·cm²
    await ins.getByRole('button', { name: 'Check on server' }).click();
    await ins.getByRole('status', { name: 'Insulation: server check' }).getByText('Server agrees').waitFor();
    await screenshot(page, 'calculators');
    await page.close();
  });
});
