import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, count, eq, gte, lte } from 'drizzle-orm';
import sharp from 'sharp';
import { parse } from 'csv-parse/sync';
import { startTestApp, type TestApp } from '../support/test-app';
import { DEMO, Http, signedIn } from '../support/http';
import { makeGauge, makePart, makeSupplier, simpleCharacteristic } from '../support/factories';
import { reading } from '../../src-api/db/schema';
import { MAX_PDF_CORES, MAX_READINGS_RANGE_DAYS } from '../../shared/schemas/ledger';

// pdf-parse 2 ships CommonJS next to ESM; the class is the v2 API (README: new PDFParse({ data })).
// eslint-disable-next-line @typescript-eslint/no-require-imports
const { PDFParse } = require('pdf-parse') as typeof import('pdf-parse');

let t: TestApp;
let eng: Http;
let insp: Http;
let aud: Http;
let boreGauge: { id: string; calibrationDueOn: string; version: number };
let burrGauge: { id: string; assetTag: string; calibrationDueOn: string };
let supplierId: string;

const INJECTED_LOT = '=HYPERLINK("http://evil.test","click")';

beforeAll(async () => {
  t = await startTestApp();
  eng = await signedIn(t.url, DEMO.engineer);
  insp = await signedIn(t.url, DEMO.inspector);
  aud = await signedIn(t.url, DEMO.auditor);
  boreGauge = await makeGauge(eng, { kind: 'bore-gauge' });
  burrGauge = await makeGauge(eng, { kind: 'burr-gauge', unit: 'µm', resolution: 1, description: 'Burr gauge' });
  supplierId = (await makeSupplier(eng)).id;
});
afterAll(async () => {
  await t?.close();
});

const CHARS = [
  simpleCharacteristic({ code: 'BORE', severity: 'major' }),
  simpleCharacteristic({ code: 'BURR', name: 'Burr height', unit: 'µm', nominal: null, lsl: null, usl: 50, readingsPerSample: 4, gaugeKind: 'burr-gauge', severity: 'minor' }),
  { code: 'PAPERS', name: 'Certificate present, heats match', kind: 'attribute', layout: 'pass-fail', severity: 'critical' },
];

async function partWithPlan() {
  const p = await makePart(eng);
  const plan = await eng.post('/api/plans', { partId: p.id, samplingKind: 'aql', inspectionLevel: 'II', aql: 1.0, characteristics: CHARS });
  expect(plan.status).toBe(201);
  const act = await eng.post(`/api/plans/${plan.body.id}/activate`, { version: plan.body.version });
  expect(act.status).toBe(200);
  return { part: p, plan: act.body };
}

async function receive(partId: string, quantity: number, over: Record<string, unknown> = {}) {
  const r = await insp.post('/api/lots', { supplierId, partId, supplierLotNumber: `SL-${Math.random().toString(36).slice(2, 8)}`, quantity, heatNumbers: ['H-4471'], ...over });
  if (r.status !== 201) throw new Error(`receive: ${r.status} ${JSON.stringify(r.body)}`);
  return r.body;
}

const goodCore = (sampleId: string, bore = 150.01) => [
  { sampleId, characteristicCode: 'BORE', values: [bore], gaugeId: boreGauge.id },
  { sampleId, characteristicCode: 'BURR', values: [18, 21, 19, 22], gaugeId: burrGauge.id },
  { sampleId, characteristicCode: 'PAPERS', values: [], pass: true },
];

async function putReadings(lotId: string, samples: { id: string }[]) {
  for (let i = 0; i < samples.length; i += 1000) {
    const r = await insp.put(`/api/lots/${lotId}/readings`, { readings: samples.slice(i, i + 1000).flatMap((s) => goodCore(s.id)) });
    expect(r.status).toBe(200);
  }
}

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

/** One lot carried from receipt to decision, with a photo; the calibration is renewed afterwards. */
async function decidedLot() {
  const { part, plan } = await partWithPlan();
  const l = await receive(part.id, 20, { supplierLotNumber: INJECTED_LOT, poNumber: '@SUM(A1:A9)', heatNumbers: ['-2+3', 'H-4471'] });
  await putReadings(l.id, l.samples);
  const img = await sharp({ create: { width: 640, height: 480, channels: 3, background: '#8a6a4a' } }).jpeg().toBuffer();
  const form = new FormData();
  form.append('file', new Blob([new Uint8Array(img)], { type: 'image/jpeg' }), 'burr.jpg');
  form.append('caption', 'Slot edge, core 1');
  form.append('sampleId', l.samples[0].id);
  expect((await insp.post(`/api/lots/${l.id}/photos`, form)).status).toBe(201);
  const fresh = await insp.get(`/api/lots/${l.id}`);
  const dec = await insp.post(`/api/lots/${l.id}/decision`, { decision: 'accept', comment: 'All cores within limits', version: fresh.body.version });
  expect(dec.status).toBe(200);
  // The bore gauge is calibrated again after the readings: the ledger must keep the old due date.
  const g = await eng.get(`/api/gauges/${boreGauge.id}`);
  const renewed = new Date(Date.now() + 400 * 86_400_000).toISOString().slice(0, 10);
  const patched = await eng.patch(`/api/gauges/${boreGauge.id}`, { calibrationDueOn: renewed, version: g.body.version });
  expect(patched.status).toBe(200);
  return { lot: dec.body, part, plan, oldDue: g.body.calibrationDueOn as string, renewed };
}

let story: Awaited<ReturnType<typeof decidedLot>>;
beforeAll(async () => {
  story = await decidedLot();
});

describe('GET /api/ledger/lots/:id', () => {
  it('tells the lot’s story in time order: received → readings → photo → decision, with audit records', async () => {
    const r = await aud.get(`/api/ledger/lots/${story.lot.id}`);
    expect(r.status).toBe(200);
    const events = r.body.events as { at: string; kind: string; auditId: number | null; audit?: { action: string } }[];
    const times = events.map((e) => Date.parse(e.at));
    expect(times).toEqual([...times].sort((a, b) => a - b));
    const firstOf = (kind: string) => events.findIndex((e) => e.kind === kind);
    expect(firstOf('received')).toBeGreaterThanOrEqual(0);
    expect(firstOf('received')).toBeLessThan(firstOf('readings'));
    expect(firstOf('readings')).toBeLessThan(firstOf('photo'));
    expect(firstOf('photo')).toBeLessThan(firstOf('decision'));
    expect(firstOf('decision')).toBeLessThan(firstOf('switching'));
    const actions = events.filter((e) => e.kind === 'audit').map((e) => e.audit!.action);
    expect(actions).toEqual(['lot.received', 'lot.readings_saved', 'lot.photo_added', 'lot.accepted']);
    // Each audit entry names its record, in chain order.
    const ids = events.filter((e) => e.kind === 'audit').map((e) => e.auditId!);
    expect(ids).toEqual([...ids].sort((a, b) => a - b));
    expect(r.body.lot).toMatchObject({ ref: story.lot.ref, supplierLotNumber: INJECTED_LOT, decision: 'accept', decidedBy: `Ines Varga <${DEMO.inspector}>` });
  });

  it('keeps the gauge’s calibration due date at the time of the reading, not today’s', async () => {
    const r = await aud.get(`/api/ledger/lots/${story.lot.id}`);
    const readings = r.body.events.find((e: { kind: string }) => e.kind === 'readings');
    expect(story.renewed).not.toBe(story.oldDue);
    expect(readings.gauges).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ id: boreGauge.id, dueOn: story.oldDue, overdueAtTime: false }),
        expect.objectContaining({ id: burrGauge.id, assetTag: burrGauge.assetTag, dueOn: burrGauge.calibrationDueOn }),
      ]),
    );
    const bore = readings.readings.filter((x: { characteristicCode: string }) => x.characteristicCode === 'BORE');
    expect(bore).toHaveLength(story.lot.samples.length);
    expect(bore.every((x: { gaugeDueOn: string }) => x.gaugeDueOn === story.oldDue)).toBe(true);
    // The gauge itself did move on.
    expect((await eng.get(`/api/gauges/${boreGauge.id}`)).body.calibrationDueOn).toBe(story.renewed);
  });

  it('shows the sampling and the switching state in force when the lot arrived', async () => {
    const r = await aud.get(`/api/ledger/lots/${story.lot.id}`);
    const received = r.body.events.find((e: { kind: string }) => e.kind === 'received');
    expect(received.sampling).toMatchObject({ sampleSize: story.lot.sampling.sampleSize, accept: story.lot.sampling.accept, reject: story.lot.sampling.reject, severity: 'normal' });
    expect(received.switching).toMatchObject({ severity: 'normal', discontinued: false });
    expect(received.detail).toContain(INJECTED_LOT);
    const switching = r.body.events.find((e: { kind: string }) => e.kind === 'switching');
    expect(switching.switching.consecutiveAccepted).toBe(received.switching.consecutiveAccepted + 1);
  });

  it('lists the part’s plan revisions with what changed', async () => {
    const rev = await eng.post(`/api/plans/${story.plan.id}/revise`);
    expect(rev.status).toBe(201);
    const upd = await eng.patch(`/api/plans/${rev.body.id}`, { aql: 0.65, version: rev.body.version });
    expect(upd.status).toBe(200);
    const r = await aud.get(`/api/ledger/lots/${story.lot.id}`);
    expect(r.body.plans.map((p: { revision: number }) => p.revision)).toEqual([2, 1]);
    const [second, first] = r.body.plans;
    expect(first).toMatchObject({ isLotPlan: true, status: 'active', fromRevision: null });
    expect(second).toMatchObject({ isLotPlan: false, status: 'draft', fromRevision: 1 });
    expect(second.changes).toEqual(expect.arrayContaining([expect.objectContaining({ scope: 'sampling', field: 'aql', before: 1, after: 0.65 })]));
  });

  it('answers 404 for an unknown lot and refuses inspectors and suppliers', async () => {
    expect((await aud.get('/api/ledger/lots/00000000-0000-4000-8000-000000000000')).status).toBe(404);
    expect((await aud.get('/api/ledger/lots/not-an-id')).status).toBe(400);
    expect((await insp.get(`/api/ledger/lots/${story.lot.id}`)).status).toBe(403);
    const sup = await signedIn(t.url, DEMO.supplierNorthgate);
    expect((await sup.get(`/api/ledger/lots/${story.lot.id}`)).status).toBe(403);
    expect((await eng.get(`/api/ledger/lots/${story.lot.id}`)).status).toBe(200);
    const admin = await signedIn(t.url, DEMO.admin);
    expect((await admin.get(`/api/ledger/lots/${story.lot.id}`)).status).toBe(200);
  });
});

describe('CSV exports', () => {
  it('lots.csv parses back with the same rows and neutralised formula cells', async () => {
    const r = await download(aud, `/api/exports/lots.csv?supplierId=${supplierId}`);
    expect(r.status).toBe(200);
    expect(r.type).toMatch(/^text\/csv/);
    const list = await aud.get(`/api/lots?supplierId=${supplierId}&pageSize=200`);
    const rows = rowsOf(r.body);
    expect(rows).toHaveLength(list.body.total);
    expect(Number(r.total)).toBe(list.body.total);
    const mine = rows.find((x) => x.lot_ref === String(story.lot.ref))!;
    expect(mine.supplier_lot_number).toBe(`'${INJECTED_LOT}`);
    expect(mine.po_number).toBe(`'@SUM(A1:A9)`);
    expect(mine.heat_numbers).toBe(`'-2+3; H-4471`);
    expect(mine).toMatchObject({ decision: 'accept', decided_by: DEMO.inspector, sample_size: String(story.lot.sampling.sampleSize), part_number: story.part.partNumber });
  });

  it('lots.csv applies the list’s filters', async () => {
    const r = await download(aud, `/api/exports/lots.csv?q=${encodeURIComponent(String(story.lot.ref))}&status=released`);
    const rows = rowsOf(r.body);
    expect(rows.map((x) => x.lot_ref)).toEqual([String(story.lot.ref)]);
  });

  it('readings.csv for one lot has one row per stored reading, with the gauge due date at the time', async () => {
    const r = await download(eng, `/api/exports/readings.csv?lotId=${story.lot.id}`);
    expect(r.status).toBe(200);
    const [{ n }] = await t.db.select({ n: count() }).from(reading).where(eq(reading.lotId, story.lot.id));
    const rows = rowsOf(r.body);
    expect(rows).toHaveLength(n);
    expect(Number(r.total)).toBe(n);
    expect(rows.every((x) => x.supplier_lot_number === `'${INJECTED_LOT}`)).toBe(true);
    const bore = rows.filter((x) => x.characteristic === 'BORE');
    expect(bore.every((x) => x.gauge_due_on_at_time === story.oldDue && x.value === '150.01' && x.conforming === 'true')).toBe(true);
    const burr = rows.find((x) => x.characteristic === 'BURR')!;
    expect(burr.raw_readings).toBe('18; 21; 19; 22');
  });

  it('streams more rows than one cursor batch (1 000) and still counts every one', async () => {
    const { part } = await partWithPlan();
    const big = await receive(part.id, 40_000); // ISO 2859-1 Table 1: 35 001–150 000, level II → N, n 500
    expect(big.samples).toHaveLength(500);
    await putReadings(big.id, big.samples.slice(0, 400));
    const r = await download(aud, `/api/exports/readings.csv?lotId=${big.id}`);
    const rows = rowsOf(r.body);
    expect(rows).toHaveLength(1200);
    expect(new Set(rows.map((x) => `${x.core_serial}|${x.characteristic}`)).size).toBe(1200);
    // Ordered by core, then characteristic in plan order.
    expect(rows.slice(0, 3).map((x) => x.characteristic)).toEqual(['BORE', 'BURR', 'PAPERS']);
    expect(rows.at(-1)!.core_serial).toBe('400');
  });

  it('readings.csv by time range has the rows entered in it', async () => {
    const from = new Date(Date.now() - 3600_000);
    const to = new Date(Date.now() + 3600_000);
    const r = await download(aud, `/api/exports/readings.csv?from=${from.toISOString()}&to=${to.toISOString()}`);
    expect(r.status).toBe(200);
    const [{ n }] = await t.db.select({ n: count() }).from(reading).where(and(gte(reading.enteredAt, from), lte(reading.enteredAt, to)));
    expect(n).toBeGreaterThan(0);
    expect(rowsOf(r.body)).toHaveLength(n);
  });

  it('audit-events.csv carries the list’s filters and the same records', async () => {
    const list = await aud.get(`/api/audit-events?entity=lot&entityId=${story.lot.id}&pageSize=200&sort=at`);
    const r = await download(aud, `/api/exports/audit-events.csv?entity=lot&entityId=${story.lot.id}&sort=at`);
    expect(r.status).toBe(200);
    const rows = rowsOf(r.body);
    expect(rows.map((x) => Number(x.id))).toEqual(list.body.items.map((x: { id: number }) => x.id));
    expect(rows[0]).toMatchObject({ action: 'lot.received', actor_email: DEMO.inspector, entity: 'lot', entity_id: story.lot.id, hash: list.body.items[0].hash });
    expect(JSON.parse(rows[0].after)).toMatchObject({ ref: story.lot.ref });
    const byActor = rowsOf((await download(aud, `/api/exports/audit-events.csv?actor=engineer%40harrowgate&action=gauge.created`)).body);
    expect(byActor.length).toBeGreaterThan(0);
    expect(byActor.every((x) => x.actor_email === DEMO.engineer && x.action === 'gauge.created')).toBe(true);
  });

  it.each([
    ['/api/exports/readings.csv?from=2026-05-01&to=2026-04-01', 'to', /before/],
    [`/api/exports/readings.csv?from=2024-01-01&to=2026-01-01`, 'to', new RegExp(`${MAX_READINGS_RANGE_DAYS} days`)],
    ['/api/exports/readings.csv', 'from', /lotId/],
    ['/api/exports/audit-events.csv?from=2026-12-01T00:00:00Z&to=2026-01-01T00:00:00Z', 'to', /before/],
    ['/api/exports/lots.csv?receivedFrom=2026-05-01&receivedTo=2026-04-01', 'receivedTo', /before/],
    ['/api/exports/lots.csv?colour=red', '_', /colour/],
    ['/api/exports/audit-events.csv?page=2', '_', /page/],
    ['/api/exports/readings.csv?lotId=abc', 'lotId', /lot id/],
  ])('refuses %s with 400 naming the problem', async (path, field, message) => {
    const r = await aud.get(path);
    expect(r.status).toBe(400);
    expect(r.body.fields[field]).toMatch(message);
  });

  it('refuses exports to inspectors and suppliers', async () => {
    for (const path of ['/api/exports/lots.csv', `/api/exports/readings.csv?lotId=${story.lot.id}`, '/api/exports/audit-events.csv', `/api/exports/lots/${story.lot.id}/report.pdf`]) {
      expect((await insp.get(path)).status).toBe(403);
    }
    const sup = await signedIn(t.url, DEMO.supplierSelby);
    expect((await sup.get('/api/exports/lots.csv')).status).toBe(403);
    expect((await new Http(t.url).get('/api/exports/lots.csv')).status).toBe(401);
  });
});

describe('lot inspection report PDF', () => {
  it('contains the lot ref, the part number, the decider and page numbers', async () => {
    const r = await download(aud, `/api/exports/lots/${story.lot.id}/report.pdf`);
    expect(r.status).toBe(200);
    expect(r.type).toBe('application/pdf');
    expect(r.body.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    const text = await pdfText(r.body);
    expect(text).toContain('Yokeline — Lot inspection report');
    expect(text).toContain(`Lot ${story.lot.ref}`);
    expect(text).toContain(story.part.partNumber);
    expect(text).toContain(DEMO.inspector);
    expect(text).toContain('Ines Varga');
    expect(text).toContain(INJECTED_LOT);
    expect(text).toContain(story.oldDue); // the bore gauge's due date when measured
    expect(text).not.toContain(story.renewed);
    expect(text).toMatch(/Page 1 of \d/);
  });

  it(`refuses a lot with more than ${MAX_PDF_CORES} sampled cores, naming the limit`, async () => {
    const { part } = await partWithPlan();
    const huge = await receive(part.id, 200_000); // ISO 2859-1 Table 1: 150 001–500 000, level II → P, n 800
    expect(huge.samples.length).toBeGreaterThan(MAX_PDF_CORES);
    const r = await aud.get(`/api/exports/lots/${huge.id}/report.pdf`);
    expect(r.status).toBe(400);
    expect(r.body.message).toContain(String(MAX_PDF_CORES));
    expect(r.body.fields.id).toMatch(/readings as CSV/);
  });

  it('answers 404 for an unknown lot', async () => {
    expect((await aud.get('/api/exports/lots/00000000-0000-4000-8000-000000000000/report.pdf')).status).toBe(404);
  });
});

describe('nonconformance on the timeline', () => {
  it('adds the NCR, its signed dispositions and their audit records to a rejected lot’s story', async () => {
    const { part } = await partWithPlan();
    const l = await receive(part.id, 20);
    await putReadings(l.id, l.samples);
    const bad = await insp.put(`/api/lots/${l.id}/readings`, { readings: [{ sampleId: l.samples[0].id, characteristicCode: 'BORE', values: [150.2], gaugeId: boreGauge.id }] });
    expect(bad.status).toBe(200);
    const fresh = await insp.get(`/api/lots/${l.id}`);
    expect((await insp.post(`/api/lots/${l.id}/decision`, { decision: 'reject', comment: 'Bore oversize on core 1', version: fresh.body.version })).status).toBe(200);
    const raised = await insp.post('/api/ncrs', { lotId: l.id, title: 'Bore oversize', requirement: 'Bore 150 ± 0.05 mm', found: 'Core 1 measured 150.2 mm', defectCodes: ['BORE'], suspectQuantity: 20 });
    expect(raised.status).toBe(201);
    const review = await eng.post(`/api/ncrs/${raised.body.id}/transition`, { to: 'in-review', version: raised.body.version });
    expect(review.status).toBe(200);
    const signed = await eng.post(`/api/ncrs/${raised.body.id}/dispositions`, {
      version: review.body.version,
      lines: [{ kind: 'return-to-supplier', quantity: 20, rationale: 'Oversize bores cannot be reworked here' }],
      signature: { password: 'yokeline-demo', meaning: 'I approve this disposition' },
    });
    expect(signed.status).toBe(201);

    const r = await aud.get(`/api/ledger/lots/${l.id}`);
    expect(r.status).toBe(200);
    const events = r.body.events as { kind: string; title: string; at: string; audit?: { entity: string } }[];
    const number = raised.body.number as string;
    expect(r.body.linked).toEqual([expect.objectContaining({ entity: 'ncr', id: raised.body.id, label: number })]);
    expect(r.body.notes).toEqual([]);
    const titles = events.map((e) => `${e.kind}: ${e.title}`);
    expect(titles).toEqual(expect.arrayContaining([expect.stringMatching(new RegExp(`^ncr: ${number} raised`)), expect.stringMatching(new RegExp(`^ncr: ${number} taken to the review board`)), expect.stringMatching(new RegExp(`^disposition: ${number} disposition 1: return to supplier, 20 cores`)), expect.stringMatching(/^signature: Signed by Tomas Reyes \(engineer\): “I approve this disposition”/)]));
    // The NCR's own audit records join the lot's.
    expect(events.some((e) => e.kind === 'audit' && e.audit!.entity === 'ncr')).toBe(true);
    const idx = (re: RegExp) => titles.findIndex((x) => re.test(x));
    expect(idx(/^decision: Rejected/)).toBeLessThan(idx(/^ncr: .* raised/));
    expect(idx(/^ncr: .* raised/)).toBeLessThan(idx(/^signature:/));
    const times = events.map((e) => Date.parse(e.at));
    expect(times).toEqual([...times].sort((a, b) => a - b));

    const pdf = await download(aud, `/api/exports/lots/${l.id}/report.pdf`);
    expect(pdf.status).toBe(200);
    const text = await pdfText(pdf.body);
    expect(text).toContain(number);
    expect(text).toContain('Rejected by Ines Varga');
  });
});
