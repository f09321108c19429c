import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { count } from 'drizzle-orm';
import { parse } from 'csv-parse/sync';
import { startTestApp, type TestApp } from '../support/test-app';
import { DEMO, signedIn, type Http } from '../support/http';
import { disposition, raise, rejectedLot, scrap, sort, startReview, supplierIdOf } from '../support/ncr-fixtures';
import { correctiveAction, ncr } from '../../src-api/db/schema';

// pdf-parse 2 ships CommonJS next to ESM; the class is the v2 API (README: new PDFParse({ data })).
// eslint-disable-next-line @typescript-eslint/no-require-imports
const { PDFParse } = require('pdf-parse') as typeof import('pdf-parse');

let t: TestApp;
let eng: Http;
let insp: Http;
let aud: Http;
let signed: { id: string; number: string; signatures: { signerEmail: string; signerName: string; contentHash: string }[] };
let scar: { id: string; number: string };

const INJECTED_TITLE = '=HYPERLINK("http://evil.test","click")';

beforeAll(async () => {
  t = await startTestApp();
  eng = await signedIn(t.url, DEMO.engineer);
  insp = await signedIn(t.url, DEMO.inspector);
  aud = await signedIn(t.url, DEMO.auditor);
  const { lot } = await rejectedLot(eng, { supplierId: await supplierIdOf(eng, 'NGL') });
  const raised = await raise(eng, { lotId: lot.id, title: INJECTED_TITLE });
  const reviewing = await startReview(eng, raised);
  const r = await disposition(eng, reviewing, [scrap(40), sort(60)]);
  if (r.status !== 201) throw new Error(`disposition: ${r.status} ${JSON.stringify(r.body)}`);
  signed = r.body;
  const s = await eng.post('/api/corrective-actions', { ncrId: signed.id });
  if (s.status !== 201) throw new Error(`issue SCAR: ${s.status} ${JSON.stringify(s.body)}`);
  scar = s.body;
});
afterAll(async () => {
  await t?.close();
});

/** A GET with the session cookie that keeps the raw bytes (CSV, PDF). */
async function download(h: Http, path: string): Promise<{ status: number; type: string | null; total: string | null; body: Buffer }> {
  const res = await fetch(t.url + path, { headers: { cookie: h.cookieHeader() } });
  return { status: res.status, type: res.headers.get('content-type'), total: res.headers.get('x-total-rows'), body: Buffer.from(await res.arrayBuffer()) };
}
const rowsOf = (csv: Buffer) => parse(csv, { bom: true, columns: true, skip_empty_lines: true }) as Record<string, string>[];

async function pdfText(pdf: Buffer): Promise<string> {
  const parser = new PDFParse({ data: new Uint8Array(pdf) });
  try {
    return (await parser.getText()).text;
  } finally {
    await parser.destroy();
  }
}

describe('NCR report PDF', () => {
  it('names the NCR, its disposition lines and the engineer who signed, with the signed hash', async () => {
    expect(signed.signatures).toHaveLength(1);
    const r = await download(aud, `/api/exports/ncrs/${signed.id}/report.pdf`);
    expect(r.status).toBe(200);
    expect(r.type).toBe('application/pdf');
    expect(r.body.subarray(0, 5).toString()).toBe('%PDF-');
    const text = await pdfText(r.body);
    expect(text).toContain(signed.number);
    expect(text).toContain(signed.signatures[0].signerEmail);
    expect(text).toContain('Bore cannot be recovered');
    // sort: 6 h × 42 = 252.00; scrap value 12.5 × 40 = 500.00 (the fixture's own figures)
    expect(text).toContain('252.00');
    expect(text).toContain(signed.signatures[0].contentHash.slice(0, 16));
  });

  it('is refused to an inspector and unknown for a missing NCR', async () => {
    expect((await download(insp, `/api/exports/ncrs/${signed.id}/report.pdf`)).status).toBe(403);
    expect((await download(aud, '/api/exports/ncrs/00000000-0000-4000-8000-000000000000/report.pdf')).status).toBe(404);
  });
});

describe('8D report PDF', () => {
  it('names the SCAR, the NCR it came from and each 8D step', async () => {
    const r = await download(eng, `/api/exports/corrective-actions/${scar.id}/report.pdf`);
    expect(r.status).toBe(200);
    expect(r.type).toBe('application/pdf');
    const text = await pdfText(r.body);
    expect(text).toContain(scar.number);
    expect(text).toContain(signed.number);
    expect(text).toContain('D3');
    expect(text).toContain('D8');
  });

  it('is refused to an inspector', async () => {
    expect((await download(insp, `/api/exports/corrective-actions/${scar.id}/report.pdf`)).status).toBe(403);
  });
});

describe('NCR and SCAR CSV exports', () => {
  it('streams one row per NCR, formula text neutralised', async () => {
    const r = await download(aud, '/api/exports/ncrs.csv');
    expect(r.status).toBe(200);
    expect(r.type).toMatch(/^text\/csv/);
    const rows = rowsOf(r.body);
    const [{ n }] = await t.db.select({ n: count() }).from(ncr);
    expect(rows).toHaveLength(n);
    expect(r.total).toBe(String(n));
    const mine = rows.find((x) => x.ncr_number === signed.number);
    expect(mine).toBeDefined();
    expect(mine!.title).toBe(`'${INJECTED_TITLE}`);
    expect(mine!.dispositions).toBe('scrap 40; sort 60');
    expect(Number(mine!.disposed_quantity)).toBe(100);
    expect(mine!.scar_numbers).toBe(scar.number);
    expect(mine!.signatures).toContain(signed.signatures[0].signerEmail);
  });

  it('streams one row per corrective action request', async () => {
    const r = await download(eng, '/api/exports/corrective-actions.csv');
    expect(r.status).toBe(200);
    const rows = rowsOf(r.body);
    const [{ n }] = await t.db.select({ n: count() }).from(correctiveAction);
    expect(rows).toHaveLength(n);
    const mine = rows.find((x) => x.scar_number === scar.number);
    expect(mine).toMatchObject({ ncr_number: signed.number, supplier_code: 'NGL', steps_accepted: '0' });
  });

  it('is refused to an inspector', async () => {
    expect((await download(insp, '/api/exports/ncrs.csv')).status).toBe(403);
    expect((await download(insp, '/api/exports/corrective-actions.csv')).status).toBe(403);
  });
});
