import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { launchBrowser, screenshot, signIn } from '../support/browser';
import { E2E_BASE_URL as BASE } from '../support/env';
import { DEMO, signedIn, type Http } from '../support/http';
import { partWithBorePlan, receiveLot, rejectLot, supplierIdOf } from '../support/ncr-fixtures';

let ctx: BrowserContext;
let api: Http;
let lot: { id: string; ref: number };
let ncrId = '';
let ncrNumber = '';
let scarId = '';
let scarLink = '';

beforeAll(async () => {
  ctx = await launchBrowser({ width: 1280, height: 900 });
  // A rejected lot from Northgate, made through the API: received, one core out of tolerance, rejected.
  api = await signedIn(BASE, DEMO.engineer);
  const ngl = await supplierIdOf(api, 'NGL');
  const { partId, gaugeId } = await partWithBorePlan(api);
  const received = await receiveLot(api, { supplierId: ngl, partId, quantity: 100 });
  lot = await rejectLot(api, received, gaugeId);
  expect((lot as unknown as { status: string }).status).toBe('on-hold');
});
afterAll(async () => {
  await ctx?.close();
});

async function freshPage(): Promise<Page> {
  await ctx.clearCookies();
  return ctx.newPage();
}

/** The mail to this address that links to this request, once the outbox worker has sent it. */
async function waitForMail(to: string, contains: string): Promise<{ subject: string; text: string }> {
  for (let i = 0; i < 60; i++) {
    const r = await api.get('/api/dev/mailbox');
    const m = (r.body.items as { to: string[]; subject: string; text: string }[]).find((x) => x.to.includes(to) && x.text.includes(contains));
    if (m) return m;
    await new Promise((res) => setTimeout(res, 1000));
  }
  throw new Error(`no mail to ${to} mentioning ${contains}`);
}

describe('from a rejected lot to an accepted containment', () => {
  let page: Page;

  it('the engineer raises an NCR from the rejected lot', async () => {
    page = await freshPage();
    await signIn(page, BASE, DEMO.engineer);
    await page.getByRole('navigation', { name: 'Main' }).waitFor();
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Nonconformances' }).click();
    await page.getByRole('tab', { name: /Waiting for an NCR/ }).click();
    const card = page.getByRole('article', { name: `Held lot ${lot.ref}` });
    await card.waitFor();
    await screenshot(page, 'ncr-waiting-lots');
    await card.getByRole('button', { name: `Raise an NCR for lot ${lot.ref}` }).click();
    const form = page.getByRole('form', { name: `Raise an NCR for lot ${lot.ref}` });
    await form.waitFor();
    // Prefilled from the failed reading: the bore, its limits and value, the BORE code, the whole lot.
    expect(await form.getByLabel('Title').inputValue()).toMatch(/Bore diameter out of tolerance/);
    expect(await form.getByLabel('Found').inputValue()).toContain('core 1 150.21 mm');
    expect(await form.getByRole('checkbox', { name: /BORE/ }).isChecked()).toBe(true);
    expect(await form.getByLabel(/Suspect quantity/).inputValue()).toBe('100');
    await screenshot(page, 'ncr-raise-panel');
    await page.getByRole('button', { name: 'Raise NCR', exact: true }).click();
    await page.waitForURL(/\/nonconformances\/[0-9a-f-]{36}$/);
    ncrId = page.url().split('/').pop()!;
    const title = await page.getByRole('heading', { level: 1 }).textContent();
    expect(title).toMatch(/^NCR-\d{4}-\d{4}$/);
    ncrNumber = title!;
    await page.getByRole('region', { name: 'Linked cores and readings' }).getByText('Out of tolerance').waitFor();
    await screenshot(page, 'ncr-raised');
  });

  it('prints the hold tag on an A6 page with a QR code to the NCR', async () => {
    await page.getByRole('button', { name: 'Print hold tag' }).click();
    await page.waitForURL(/\/hold-tag$/);
    const tag = page.getByRole('article', { name: `Hold tag ${ncrNumber}` });
    await tag.waitFor();
    expect(await tag.textContent()).toContain('HOLD — DO NOT USE');
    expect(await tag.textContent()).toContain('100 cores');
    expect(await tag.textContent()).toContain(`#${lot.ref}`);
    const qr = tag.getByRole('img', { name: /QR code/ });
    await expect.poll(() => qr.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth)).toBeGreaterThan(0);
    await screenshot(page, 'hold-tag');
    await page.emulateMedia({ media: 'print' });
    await screenshot(page, 'hold-tag-print');
    const pdf = (await page.pdf({ preferCSSPageSize: true, printBackground: true })).toString('latin1');
    const boxes = [...pdf.matchAll(/\/MediaBox\s*\[\s*0\s+0\s+([\d.]+)\s+([\d.]+)\s*\]/g)];
    expect(boxes).toHaveLength(1); // one page
    // A6 is 105 × 148 mm = 297.6 × 419.5 pt (ISO 216); Chromium rounds the page to whole CSS pixels.
    expect(Math.abs(Number(boxes[0][1]) - 297.6)).toBeLessThan(1.5);
    expect(Math.abs(Number(boxes[0][2]) - 419.5)).toBeLessThan(1.5);
    await page.emulateMedia({ media: 'screen' });
    await page.getByRole('link', { name: `Back to ${ncrNumber}` }).click();
    await page.waitForURL(new RegExp(`/nonconformances/${ncrId}$`));
  });

  it('dispositions part scrap, part sort with an e-signature (a wrong password saves nothing)', async () => {
    await page.getByRole('button', { name: 'Start review' }).click();
    const board = page.getByRole('form', { name: 'Dispositions' });
    await board.waitFor();
    const line1 = board.getByRole('group', { name: 'Disposition line 1' });
    await line1.getByLabel('Cores').fill('12');
    await line1.getByLabel('Rationale').fill('Bore oversize beyond any rework; scrap the worst cores');
    await line1.getByLabel('Scrap value').fill('150');
    await board.getByRole('status').getByText('12 of 100 cores assigned').waitFor();
    await screenshot(page, 'review-board-short');
    await board.getByRole('button', { name: 'Add a line' }).click();
    const line2 = board.getByRole('group', { name: 'Disposition line 2' });
    expect(await line2.getByLabel('Disposition').inputValue()).toBe('sort');
    expect(await line2.getByLabel('Cores').inputValue()).toBe('88');
    await line2.getByLabel('Rationale').fill('Screen every bore at receiving; release the good ones');
    await line2.getByLabel('Hours').fill('6');
    await line2.getByLabel('Rate per hour').fill('42');
    await board.getByRole('status').getByText('100 of 100 cores assigned').waitFor();
    expect(await line2.getByLabel('Cost of line 2').textContent()).toContain('252.00');
    await screenshot(page, 'review-board');
    await board.getByRole('button', { name: 'Sign the disposition…' }).click();
    const dialog = page.getByRole('alertdialog', { name: 'Sign the disposition' });
    await dialog.waitFor();
    await dialog.getByRole('checkbox', { name: 'I approve this disposition' }).check();
    await dialog.getByLabel('Your password').fill('not-my-password');
    await dialog.getByRole('button', { name: 'Sign and record' }).click();
    await dialog.getByRole('alert').getByText(/The password is not right/).waitFor();
    await screenshot(page, 'e-sign-wrong-password');
    await dialog.getByLabel('Your password').fill('yokeline-demo');
    await dialog.getByRole('button', { name: 'Sign and record' }).click();
    await page.getByText('Disposition signed').waitFor();
    const table = page.getByRole('table', { name: 'Dispositions' });
    expect(await table.textContent()).toMatch(/Scrap\s*12/);
    expect(await table.textContent()).toMatch(/Sort \/ 100 % screen\s*88/);
    expect(await page.getByRole('region', { name: 'Review board' }).getByLabel('Signatures').textContent()).toContain('Tomas Reyes');
    await screenshot(page, 'ncr-dispositioned');
    const lotNow = await api.get(`/api/lots/${lot.id}`);
    expect(lotNow.body.status).toBe('released');
  });

  it('issues a corrective action request to the supplier', async () => {
    await page.getByRole('button', { name: 'Issue corrective action' }).click();
    const dialog = page.getByRole('dialog', { name: 'Issue a corrective action request' });
    await dialog.waitFor();
    await dialog.getByRole('button', { name: 'Issue and mail' }).click();
    await page.waitForURL(/\/corrective-actions\/[0-9a-f-]{36}$/);
    scarId = page.url().split('/').pop()!;
    expect(await page.getByRole('heading', { level: 1 }).textContent()).toMatch(/^SCAR-\d{4}-\d{4}$/);
    await page.getByRole('region', { name: 'D3 Containment' }).waitFor();
    await screenshot(page, 'scar-issued');
    await page.close();
  });

  it('the supplier opens the link from the captured mail, signs in and answers D3', async () => {
    const mail = await waitForMail(DEMO.supplierNorthgate, scarId);
    expect(mail.subject).toMatch(/corrective action requested/);
    scarLink = /(https?:\/\/\S+\/supplier-desk\/corrective-actions\/[0-9a-f-]{36})/.exec(mail.text)![1];
    const p = await freshPage();
    await p.goto(scarLink);
    await p.waitForURL(/\/sign-in\?next=/);
    await p.getByLabel('E-mail').fill(DEMO.supplierNorthgate);
    await p.getByLabel('Password').fill('yokeline-demo');
    await p.getByRole('button', { name: 'Sign in' }).click();
    await p.waitForURL(new RegExp(`/supplier-desk/corrective-actions/${scarId}$`));
    const d3 = p.getByRole('region', { name: 'D3 Containment' });
    await d3.waitFor();
    await screenshot(p, 'desk-scar-open');
    await d3.getByLabel('Containment actions').fill('All stock at Northgate quarantined; 100 % bore check on the press line and in the warehouse.');
    await d3.getByLabel('Checked at your plant').fill('1200');
    await d3.getByLabel('Nonconforming at your plant').fill('14');
    await d3.getByLabel('Checked in transit').fill('300');
    await d3.getByLabel('Nonconforming in transit').fill('0');
    await d3.getByLabel('How clean shipments are marked').fill('Green dot on the pallet label');
    await d3.getByRole('button', { name: 'Submit D3 for review' }).click();
    await d3.getByText('Waiting for review').waitFor();
    expect(await d3.textContent()).toContain('1200 checked, 14 nonconforming');
    await screenshot(p, 'desk-d3-submitted');
    await p.getByRole('link', { name: 'Back to the Supplier desk' }).click();
    await p.getByRole('table', { name: 'Your corrective actions' }).waitFor();
    await screenshot(p, 'supplier-desk');
    await p.close();
  });

  it('another supplier following the same link sees no trace of it', async () => {
    const p = await freshPage();
    await signIn(p, BASE, DEMO.supplierSelby);
    await p.getByRole('navigation', { name: 'Main' }).waitFor();
    await p.goto(scarLink);
    await p.getByText('There is no such request here').waitFor();
    expect(await p.locator('main').textContent()).not.toContain('Northgate');
    await screenshot(p, 'desk-other-supplier');
    await p.close();
  });

  it('the engineer accepts D3', async () => {
    const p = await freshPage();
    await signIn(p, BASE, DEMO.engineer);
    await p.getByRole('navigation', { name: 'Main' }).waitFor();
    await p.goto(`${BASE}/corrective-actions/${scarId}`);
    const d3 = p.getByRole('region', { name: 'D3 Containment' });
    await d3.waitFor();
    await d3.getByLabel('Comment on D3 for the supplier').fill('Good containment; keep the green dot until D6.');
    await d3.getByRole('button', { name: 'Accept D3' }).click();
    await d3.getByText('Accepted', { exact: true }).waitFor();
    await p.getByRole('table', { name: 'Mail' }).getByText('Sent').first().waitFor();
    await screenshot(p, 'scar-d3-accepted');
    await p.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Corrective actions' }).click();
    await p.getByRole('table', { name: 'Corrective actions' }).getByRole('link', { name: /SCAR-/ }).first().waitFor();
    await screenshot(p, 'scars-list');
    await p.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Nonconformances' }).click();
    await p.getByRole('table', { name: 'Nonconformance reports' }).getByRole('link', { name: ncrNumber }).waitFor();
    await screenshot(p, 'ncrs-list');
    await p.getByRole('tab', { name: 'Defect codes' }).click();
    await p.getByRole('table', { name: 'Defect codes' }).getByText('BURR', { exact: true }).waitFor();
    await screenshot(p, 'defect-codes');
    const r = await api.get(`/api/corrective-actions/${scarId}`);
    expect(r.body.status).toBe('containment-in');
    expect(r.body.steps.find((x: { step: string }) => x.step === 'D3').status).toBe('accepted');
    await p.close();
  });
});
