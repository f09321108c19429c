import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { launchBrowser, screenshot, signIn } from '../support/browser';
import { E2E_BASE_URL as BASE } from '../support/env';

let ctx: BrowserContext;
beforeAll(async () => {
  ctx = await launchBrowser({ width: 1366, height: 900 });
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

const stamp = () => `${Date.now().toString(36)}${Math.floor(Math.random() * 1000)}`.toUpperCase();
const planIdOf = (url: string) => /\/plans-parts\/plans\/([0-9a-f-]{36})/.exec(url)?.[1] ?? '';

/** A small but real PDF header is all the server's sniffing needs. */
const PDF = Buffer.from('%PDF-1.4\n1 0 obj <<>> endobj\ntrailer <<>>\n%%EOF\n');

describe('plans & parts', () => {
  it('an engineer creates a part and a welded plan, edits, activates and revises it; an inspector reads it only', async () => {
    const page = await pageAs('engineer@harrowgate.test');
    const partNumber = `E2E-${stamp()}`;

    // ── A new part; a grade the server cannot parse comes back on its field.
    await page.goto(`${BASE}/plans-parts`);
    await page.getByRole('button', { name: 'New part' }).click();
    const form = page.getByRole('form', { name: 'New part' });
    await form.getByLabel('Part number').fill(partNumber);
    await form.getByLabel('Revision').fill('A');
    await form.getByLabel('Description').fill('48-slot welded stator core, browser test');
    await form.getByLabel('Core construction').selectOption('welded');
    await form.getByLabel('Steel grade').fill('X400-50');
    await form.getByLabel('Lamination thickness').fill('0.5');
    await form.getByLabel('Lamination net area').fill('250');
    await form.getByLabel('Bore (mm)').fill('150');
    await form.getByLabel('OD (mm)').fill('240');
    await form.getByLabel('Stack length').fill('80');
    await form.getByLabel('Slots').fill('48');
    await form.getByLabel('Core mass').fill('12.5');
    await page.getByRole('button', { name: 'Add part' }).click();
    await form.getByText(/is not a steel grade name/).waitFor();
    await screenshot(page, 'part-form-bad-grade');
    await form.getByLabel('Steel grade').fill('M400-50A');
    await page.getByRole('button', { name: 'Add part' }).click();
    await page.getByRole('heading', { name: `${partNumber} rev A` }).waitFor();
    // Density defaulted from the grade (the engineer left it empty).
    await page.getByText(/g\/cm³/).first().waitFor();
    await page.getByText('No plan yet', { exact: false }).waitFor();

    // ── The drawing: upload a PDF, then the link is there.
    await page.getByLabel('Drawing PDF file').setInputFiles({ name: 'core-drawing.pdf', mimeType: 'application/pdf', buffer: PDF });
    await page.getByRole('link', { name: 'core-drawing.pdf' }).waitFor();
    await screenshot(page, 'part-detail');

    // ── New plan from the welded template (preselected for a welded part).
    await page.getByRole('button', { name: 'New plan from template' }).click();
    const dialog = page.getByRole('dialog', { name: 'New plan from template' });
    expect(await dialog.getByRole('radio', { name: 'Welded core' }).isChecked()).toBe(true);
    await dialog.getByRole('button', { name: 'Create draft' }).click();
    await page.waitForURL(/\/plans-parts\/plans\/[0-9a-f-]{36}$/);
    const rev1 = planIdOf(page.url());
    await page.getByRole('heading', { name: 'Inspection plan rev 1' }).waitFor();
    const table = page.getByRole('table', { name: 'Characteristics' });
    await table.getByLabel('Code, OD').waitFor();
    // The welded template brings its own checks as well as the common ones.
    expect(await table.locator('input[aria-label^="Code, "]').count()).toBeGreaterThan(12);
    await screenshot(page, 'plan-editor-draft');

    // ── A wrong limit is caught on its cell before anything is sent.
    const odUsl = table.getByLabel('Upper limit, OD');
    const odLsl = table.getByLabel('Lower limit, OD');
    const lsl = Number(await odLsl.inputValue());
    const usl1 = Number(await odUsl.inputValue());
    expect(usl1).toBeGreaterThan(lsl);
    await odUsl.fill(String(lsl - 1));
    await page.getByRole('button', { name: 'Save', exact: true }).click();
    await page.getByRole('alert').getByText('The lower limit must be below the upper limit').waitFor();
    expect(await odLsl.getAttribute('aria-invalid')).toBe('true');
    await screenshot(page, 'plan-editor-cell-error');

    // ── Edit a limit properly.
    const usl2 = Number((usl1 + 0.02).toFixed(3));
    await odUsl.fill(String(usl2));
    expect(await odLsl.getAttribute('aria-invalid')).toBeNull();

    // ── A refusal only the server can make (a formula input that is not in the plan) comes back onto its row.
    await table.getByRole('button', { name: 'Method and details, ECC' }).click();
    let details = page.getByRole('dialog', { name: 'Method and details' });
    const inputs = details.getByLabel('Formula inputs');
    const eccInputs = await inputs.inputValue();
    await inputs.fill(`${eccInputs}, NOPE`);
    await details.getByRole('button', { name: 'Done' }).click();
    await page.getByRole('button', { name: 'Save', exact: true }).click();
    await page.getByRole('alert').getByText('Input NOPE is not a characteristic of this plan').waitFor();
    expect(await page.getByRole('alert').textContent()).toContain('(ECC) · Formula inputs');
    await table.getByRole('button', { name: 'Method and details, ECC' }).getByLabel('has errors').waitFor();
    await screenshot(page, 'plan-editor-server-error');
    await table.getByRole('button', { name: 'Method and details, ECC' }).click();
    details = page.getByRole('dialog', { name: 'Method and details' });
    await details.getByText('Input NOPE is not a characteristic of this plan').waitFor();
    await details.getByLabel('Formula inputs').fill(eccInputs);
    await details.getByRole('button', { name: 'Done' }).click();

    // ── Save the limit change.
    await page.getByRole('button', { name: 'Save', exact: true }).click();
    await page.locator('.fui-ToastTitle', { hasText: 'Draft rev 1 saved' }).waitFor();
    expect(await page.getByRole('button', { name: 'Save', exact: true }).isDisabled()).toBe(true);
    await page.reload();
    expect(Number(await page.getByRole('table', { name: 'Characteristics' }).getByLabel('Upper limit, OD').inputValue())).toBe(usl2);

    // ── Activate (with a confirmation).
    await page.getByRole('button', { name: 'Activate…' }).click();
    const confirm = page.getByRole('alertdialog', { name: 'Activate plan revision 1?' });
    await confirm.getByRole('button', { name: 'Activate' }).click();
    await page.getByText('Active plans are never edited — Revise to make a new draft.').waitFor();
    expect(await page.getByRole('button', { name: 'Save', exact: true }).count()).toBe(0);
    expect(await page.getByRole('table', { name: 'Characteristics' }).getByRole('textbox').count()).toBe(0);
    await screenshot(page, 'plan-active-read-only');

    // ── Revise into rev 2, change a limit there, save, and see it in the change view.
    await page.getByRole('button', { name: 'Revise' }).click();
    await page.getByRole('heading', { name: 'Inspection plan rev 2' }).waitFor();
    const rev2 = planIdOf(page.url());
    expect(rev2).not.toBe(rev1);
    const usl3 = Number((usl2 + 0.03).toFixed(3));
    await page.getByRole('table', { name: 'Characteristics' }).getByLabel('Upper limit, OD').fill(String(usl3));
    await page.getByRole('button', { name: 'Save', exact: true }).click();
    await page.locator('.fui-ToastTitle', { hasText: 'Draft rev 2 saved' }).waitFor();
    await page.getByRole('tab', { name: 'Changes' }).click();
    await page.waitForURL(/\/changes$/);
    const changes = page.getByRole('table', { name: 'Changes between revisions' });
    await changes.waitFor();
    const odRow = changes.getByRole('row').filter({ hasText: 'OD' }).filter({ hasText: 'Upper limit' });
    expect(await odRow.count()).toBe(1);
    const text = (await odRow.textContent()) ?? '';
    expect(text).toContain(String(usl2));
    expect(text).toContain(String(usl3));
    expect(text).toContain('Changed');
    await page.getByText('Rev 1 → rev 2: 1 change.').waitFor();
    await screenshot(page, 'plan-changes');

    // ── The part lists both revisions with their states.
    await page.goto(`${BASE}/plans-parts/parts/${(await (await page.request.get(`${BASE}/api/plans/${rev2}`)).json()).partId}`);
    const revisions = page.getByRole('table', { name: 'Plan revisions' });
    await revisions.getByRole('row', { name: 'Plan revision 2' }).getByText('Draft').waitFor();
    await revisions.getByRole('row', { name: 'Plan revision 1' }).getByText('Active').waitFor();
    await screenshot(page, 'part-detail-revisions');
    await page.close();

    // ── An inspector opens the same plans: read-only, no save, no inputs.
    const insp = await pageAs('inspector@harrowgate.test');
    await insp.goto(`${BASE}/plans-parts/plans/${rev2}`);
    await insp.getByRole('heading', { name: 'Inspection plan rev 2' }).waitFor();
    const inspTable = insp.getByRole('table', { name: 'Characteristics' });
    await inspTable.getByText('OD', { exact: true }).waitFor();
    expect(await insp.getByRole('button', { name: 'Save', exact: true }).count()).toBe(0);
    expect(await insp.getByRole('button', { name: 'Activate…' }).count()).toBe(0);
    expect(await inspTable.getByRole('textbox').count()).toBe(0);
    expect(await inspTable.getByRole('combobox').count()).toBe(0);
    expect(await inspTable.getByText(String(usl3), { exact: true }).count()).toBe(1);
    await screenshot(insp, 'plan-inspector-draft');
    await insp.goto(`${BASE}/plans-parts/plans/${rev1}`);
    await insp.getByText('Active plans are never edited — Revise to make a new draft.').waitFor();
    expect(await insp.getByRole('button', { name: 'Revise' }).count()).toBe(0);
    // The API agrees: an inspector's change is refused.
    const { token } = (await (await insp.request.get(`${BASE}/api/auth/csrf`)).json()) as { token: string };
    const refused = await insp.request.patch(`${BASE}/api/plans/${rev2}`, { data: { version: 1 }, headers: { 'x-csrf-token': token } });
    expect(refused.status()).toBe(403);
    expect(((await refused.json()) as { error: string }).error).not.toBe('csrf');
    await insp.close();
  }, 120_000);
});

describe('suppliers', () => {
  it('an engineer adds a supplier with contacts, and a status change needs a reason', async () => {
    const page = await pageAs('engineer@harrowgate.test');
    const code = `E2E-${stamp()}`.slice(0, 16);
    await page.goto(`${BASE}/suppliers`);
    await page.getByRole('button', { name: 'New supplier' }).click();
    const form = page.getByRole('form', { name: 'New supplier' });
    await form.getByLabel('Code').fill(code);
    await form.getByRole('textbox', { name: /^Name/ }).fill('Browser Test Stampings');
    await form.getByLabel('Contact e-mail 1', { exact: true }).fill('not-an-address');
    await page.getByRole('button', { name: 'Add supplier' }).click();
    await form.getByText('Enter a valid e-mail address').waitFor();
    await form.getByLabel('Contact e-mail 1', { exact: true }).fill('quality@browser-test.test');
    await form.getByRole('button', { name: 'Add an e-mail' }).click();
    await form.getByLabel('Contact e-mail 2', { exact: true }).fill('dispatch@browser-test.test');
    await screenshot(page, 'supplier-form');
    await page.getByRole('button', { name: 'Add supplier' }).click();
    await form.waitFor({ state: 'detached' });

    await page.getByRole('searchbox', { name: 'Search code or name' }).fill(code);
    await page.getByRole('link', { name: `Edit supplier ${code}` }).click();
    const edit = page.getByRole('form', { name: `Edit supplier ${code}` });
    await edit.getByLabel('Approval status').selectOption('conditional');
    await page.getByRole('button', { name: 'Save changes' }).click();
    await edit.getByText('Say why the approval status changes').waitFor();
    await edit.getByLabel('Why the approval status changes').fill('Burr height trending up on the last three lots');
    await page.getByRole('button', { name: 'Save changes' }).click();
    await edit.waitFor({ state: 'detached' });
    const row = page.getByRole('row').filter({ hasText: code });
    await row.getByText('Conditional').waitFor();
    await screenshot(page, 'suppliers');
    await page.close();

    const insp = await pageAs('inspector@harrowgate.test');
    await insp.goto(`${BASE}/suppliers`);
    await insp.getByRole('table', { name: 'Suppliers' }).waitFor();
    expect(await insp.getByRole('button', { name: 'New supplier' }).count()).toBe(0);
    await insp.close();
  }, 60_000);
});

describe('gauges', () => {
  it('labels calibration state in words and filters overdue and due-soon gauges', async () => {
    const page = await pageAs('engineer@harrowgate.test');
    const day = (n: number) => new Date(Date.now() + n * 86_400_000).toISOString().slice(0, 10);
    const tag = (s: string) => `E2E-${s}-${stamp()}`.slice(0, 24);
    const gauges = [
      { tag: tag('OVD'), due: day(-5) },
      { tag: tag('SOON'), due: day(10) },
      { tag: tag('OK'), due: day(200) },
    ];
    await page.goto(`${BASE}/gauges`);
    for (const g of gauges) {
      await page.getByRole('button', { name: 'New gauge' }).click();
      const form = page.getByRole('form', { name: 'New gauge' });
      await form.getByLabel('Asset tag').fill(g.tag);
      await form.getByLabel('Kind').selectOption('micrometer');
      await form.getByLabel('Description').fill('Outside micrometer 0–25 mm');
      await form.getByLabel('Resolution').fill('0.001');
      await form.getByLabel('Range from').fill('0');
      await form.getByLabel('Range to').fill('25');
      await form.getByLabel('Calibration due on').fill(g.due);
      await page.getByRole('button', { name: 'Add gauge' }).click();
      await form.waitFor({ state: 'detached' });
    }
    const rowOf = (t: string) => page.getByRole('row', { name: `Gauge ${t}` });
    await rowOf(gauges[0].tag).getByText('Overdue by 5 days').waitFor();
    await rowOf(gauges[1].tag).getByText('Due in 10 days').waitFor();
    await rowOf(gauges[2].tag).getByText('OK', { exact: true }).waitFor();
    await screenshot(page, 'gauges');

    await page.getByRole('button', { name: 'Overdue', exact: true }).click();
    await rowOf(gauges[1].tag).waitFor({ state: 'detached' });
    await rowOf(gauges[0].tag).waitFor();
    expect(await rowOf(gauges[2].tag).count()).toBe(0);
    await page.getByRole('button', { name: 'Due within 30 days' }).click();
    await rowOf(gauges[0].tag).waitFor({ state: 'detached' });
    await rowOf(gauges[1].tag).waitFor();
    expect(await rowOf(gauges[2].tag).count()).toBe(0);

    // Recording a calibration moves the overdue gauge's due date on.
    await page.getByRole('button', { name: 'All', exact: true }).click();
    await page.getByRole('button', { name: `Record calibration of ${gauges[0].tag}` }).click();
    const dlg = page.getByRole('dialog', { name: 'Record calibration' });
    await dlg.getByLabel('Next calibration due on').fill(day(365));
    await dlg.getByRole('button', { name: 'Record calibration' }).click();
    await rowOf(gauges[0].tag).getByText('OK', { exact: true }).waitFor();
    await page.close();
  }, 60_000);
});
