import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import sharp from 'sharp';
import { startTestApp, type TestApp } from '../support/test-app';
import { DEMO, type Http, signedIn } from '../support/http';
import { makeGauge, makePart, makeSupplier, simpleCharacteristic } from '../support/factories';
import { lot, reading } from '../../src-api/db/schema';

let t: TestApp;
let eng: Http;
let insp: Http;
let boreGauge: { id: string };
let burrGauge: { id: string };
let supplierId: string;

beforeAll(async () => {
  t = await startTestApp();
  eng = await signedIn(t.url, DEMO.engineer);
  insp = await signedIn(t.url, DEMO.inspector);
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

async function partWithPlan(over: Record<string, unknown> = {}) {
  const p = await makePart(eng);
  const plan = await eng.post('/api/plans', { partId: p.id, samplingKind: 'aql', inspectionLevel: 'II', aql: 1.0, characteristics: CHARS, ...over });
  expect(plan.status).toBe(201);
  const act = await eng.post(`/api/plans/${plan.body.id}/activate`, { version: plan.body.version });
  expect(act.status).toBe(200);
  return { part: p, plan: act.body };
}

async function receive(partId: string, quantity: number, sid = supplierId) {
  const r = await insp.post('/api/lots', { supplierId: sid, partId, supplierLotNumber: `SL-${Math.random().toString(36).slice(2, 8)}`, quantity, heatNumbers: ['H-4471'] });
  if (r.status !== 201) throw new Error(`receive: ${r.status} ${JSON.stringify(r.body)}`);
  return r.body;
}

/** Good readings for every characteristic of one core; `bore` overrides the bore value. */
const goodCore = (sampleId: string, bore = 150.01) => [
  { sampleId, characteristicCode: 'BORE', values: [bore], gaugeId: boreGauge.id },
  { sampleId, characteristicCode: 'BURR', values: [18, 21, 19, 22], gaugeId: burrGauge.id },
  { sampleId, characteristicCode: 'PAPERS', values: [], pass: true },
];

describe('GET /api/sampling/plan', () => {
  it('answers ISO 2859-1 plans', async () => {
    const r = await insp.get('/api/sampling/plan?lotSize=1000&level=II&aql=1.0');
    expect(r.body).toMatchObject({ codeLetter: 'J', sampleSize: 80, accept: 2, reject: 3, inspectAll: false }); // ISO 2859-1 Table 1 + Table 2-A
    const t2 = await insp.get('/api/sampling/plan?lotSize=1000&level=II&aql=1.0&severity=tightened');
    expect(t2.body).toMatchObject({ sampleSize: 80, accept: 1, reject: 2 }); // ISO 2859-1 Table 2-B
    const small = await insp.get('/api/sampling/plan?lotSize=10&level=II&aql=0.65');
    expect(small.body.inspectAll).toBe(true); // ISO 2859-1 Table 2-A: n 20 > lot 10 → 100 %
  });

  it.each([
    ['lotSize=1&level=II&aql=1.0', 'lotSize'],
    ['lotSize=100&level=IV&aql=1.0', 'level'],
    ['lotSize=100&level=II&aql=0.3', 'aql'],
    ['lotSize=abc&level=II&aql=1.0', 'lotSize'],
  ])('refuses %s', async (q, field) => {
    const r = await insp.get(`/api/sampling/plan?${q}`);
    expect(r.status).toBe(400);
    expect(r.body.fields[field]).toBeTruthy();
  });
});

describe('receiving a lot', () => {
  it('stores the sampling plan and creates n sampled cores', async () => {
    const { part } = await partWithPlan();
    const l = await receive(part.id, 1000);
    expect(l.sampling).toMatchObject({ codeLetter: 'J', sampleSize: 80, accept: 2, reject: 3, severity: 'normal', level: 'II', aql: 1 }); // ISO 2859-1 Tables 1, 2-A
    expect(l.samples).toHaveLength(80);
    expect(l.samples.map((s: { serial: number }) => s.serial).slice(0, 3)).toEqual([1, 2, 3]);
    expect(l.status).toBe('received');
    const dock = await insp.get('/api/lots?status=waiting&pageSize=200');
    expect(dock.body.items.map((x: { id: string }) => x.id)).toContain(l.id);
  });

  it('inspects every core when n ≥ lot size', async () => {
    const { part } = await partWithPlan();
    const l = await receive(part.id, 6);
    expect(l.sampling.inspectAll).toBe(true); // ISO 2859-1 Table 2-A: A/1.0 ↓ → n 13 > 6
    expect(l.samples).toHaveLength(6);
  });

  it('refuses a disapproved supplier, a part with no active plan, and bad quantities', async () => {
    const { part } = await partWithPlan();
    const bad = await makeSupplier(eng, { approvalStatus: 'disapproved', approvalReason: 'Failed audit' });
    const r1 = await insp.post('/api/lots', { supplierId: bad.id, partId: part.id, supplierLotNumber: 'X', quantity: 10 });
    expect(r1.status).toBe(400);
    expect(r1.body.fields.supplierId).toMatch(/disapproved/);
    const bare = await makePart(eng);
    const r2 = await insp.post('/api/lots', { supplierId, partId: bare.id, supplierLotNumber: 'X', quantity: 10 });
    expect(r2.status).toBe(400);
    expect(r2.body.fields.partId).toMatch(/no active inspection plan/);
    for (const quantity of [0, -3, 2.5, 'ten']) {
      const r = await insp.post('/api/lots', { supplierId, partId: part.id, supplierLotNumber: 'X', quantity });
      expect(r.status).toBe(400);
      expect(r.body.fields.quantity).toBeTruthy();
    }
  });

  it('lets a supplier user see its own lots only, and refuses receiving to auditors', async () => {
    const { part } = await partWithPlan();
    const sup = await signedIn(t.url, DEMO.supplierNorthgate);
    const mine = await sup.get('/api/suppliers');
    const myLot = await receive(part.id, 20, mine.body.items[0].id);
    const otherLot = await receive(part.id, 20);
    expect((await sup.get(`/api/lots/${myLot.id}`)).status).toBe(200);
    const denied = await sup.get(`/api/lots/${otherLot.id}`);
    expect(denied.status).toBe(404);
    const list = await sup.get('/api/lots?pageSize=200');
    expect(list.body.items.every((x: { supplierCode: string }) => x.supplierCode === 'NGL')).toBe(true);
    const aud = await signedIn(t.url, DEMO.auditor);
    expect((await aud.post('/api/lots', { supplierId, partId: part.id, supplierLotNumber: 'X', quantity: 5 })).status).toBe(403);
  });
});

describe('readings', () => {
  it('stores readings, computes the result, and the last write wins', async () => {
    const { part } = await partWithPlan();
    const l = await receive(part.id, 20);
    const s = l.samples[0].id;
    expect((await insp.put(`/api/lots/${l.id}/readings`, { readings: goodCore(s) })).status).toBe(200);
    expect((await insp.put(`/api/lots/${l.id}/readings`, { readings: [{ sampleId: s, characteristicCode: 'BURR', values: [30, 31, 60, 29], gaugeId: burrGauge.id }] })).status).toBe(200);
    const rows = await t.db.select().from(reading).where(eq(reading.sampleId, s));
    const burr = rows.find((r) => r.characteristicCode === 'BURR')!;
    expect(burr.values).toEqual([30, 31, 60, 29]);
    expect(burr.value).toBeCloseTo(37.5, 9);
    expect(burr.conforming).toBe(false); // one reading 60 µm above the 50 µm limit
    const [row] = await t.db.select().from(lot).where(eq(lot.id, l.id));
    expect(row.status).toBe('inspecting');
  });

  it('refuses a reading taken with an overdue gauge, naming the gauge and its due date', async () => {
    const { part } = await partWithPlan();
    const l = await receive(part.id, 20);
    const past = new Date(Date.now() - 86_400_000).toISOString().slice(0, 10);
    const old = await makeGauge(eng, { kind: 'bore-gauge', calibrationDueOn: past });
    const r = await insp.put(`/api/lots/${l.id}/readings`, { readings: [{ sampleId: l.samples[0].id, characteristicCode: 'BORE', values: [150], gaugeId: old.id }] });
    expect(r.status).toBe(400);
    expect(r.body.fields['readings.0.gaugeId']).toContain(`due for calibration on ${past}`);
    expect(await t.db.select().from(reading).where(eq(reading.lotId, l.id))).toHaveLength(0);
  });

  it.each([
    [{ values: [Number.NaN] }, 'values.0'], // JSON carries NaN as null
    [{ values: [150, 150.01] }, 'values'],
    [{ values: ['150'] }, 'values.0'],
    [{ characteristicCode: 'NOPE' }, 'characteristicCode'],
    [{ sampleId: '00000000-0000-4000-8000-000000000000' }, 'sampleId'],
  ])('refuses %j and stores nothing', async (over, field) => {
    const { part } = await partWithPlan();
    const l = await receive(part.id, 20);
    const body = { readings: [goodCore(l.samples[0].id)[1], { sampleId: l.samples[0].id, characteristicCode: 'BORE', values: [150], gaugeId: boreGauge.id, ...over }] };
    const r = await insp.put(`/api/lots/${l.id}/readings`, body);
    expect(r.status).toBe(400);
    expect(Object.keys(r.body.fields).some((k) => k.endsWith(field))).toBe(true);
    expect(await t.db.select().from(reading).where(eq(reading.lotId, l.id))).toHaveLength(0);
  });

  it('needs a note on a failed check', async () => {
    const { part } = await partWithPlan();
    const l = await receive(part.id, 20);
    const r = await insp.put(`/api/lots/${l.id}/readings`, { readings: [{ sampleId: l.samples[0].id, characteristicCode: 'PAPERS', pass: false }] });
    expect(r.status).toBe(400);
    expect(r.body.fields['readings.0.note']).toMatch(/note/);
  });
});

describe('decision and switching', () => {
  async function inspectLot(partId: string, badCores: number) {
    const l = await receive(partId, 50); // ISO 2859-1 Table 1: 26–50 at II → D; Table 2-A: D/1.0 ↓ → E n 13, Ac 0 Re 1
    const readings = l.samples.flatMap((s: { id: string }, i: number) => goodCore(s.id, i < badCores ? 150.2 : 150.01));
    expect((await insp.put(`/api/lots/${l.id}/readings`, { readings })).status).toBe(200);
    return (await insp.get(`/api/lots/${l.id}`)).body;
  }

  it('proposes from the results and refuses to accept a lot the results reject', async () => {
    const { part } = await partWithPlan();
    const l = await inspectLot(part.id, 1);
    expect(l.sampling).toMatchObject({ sampleSize: 13, accept: 0, reject: 1 }); // ISO 2859-1 Table 2-A, arrow from D to E
    const prop = await insp.get(`/api/lots/${l.id}/proposal`);
    expect(prop.body).toMatchObject({ proposal: 'reject', nonconforming: 1 });
    const acc = await insp.post(`/api/lots/${l.id}/decision`, { decision: 'accept', comment: 'looks fine', version: l.version });
    expect(acc.status).toBe(409);
    const rej = await insp.post(`/api/lots/${l.id}/decision`, { decision: 'reject', comment: 'Bore oversize on core 1', version: l.version });
    expect(rej.status).toBe(200);
    expect(rej.body.status).toBe('on-hold');
    const again = await insp.put(`/api/lots/${l.id}/readings`, { readings: goodCore(l.samples[0].id) });
    expect(again.status).toBe(409);
  });

  it('will not accept a lot that is not fully inspected', async () => {
    const { part } = await partWithPlan();
    const l = await receive(part.id, 50);
    await insp.put(`/api/lots/${l.id}/readings`, { readings: goodCore(l.samples[0].id) });
    const r = await insp.post(`/api/lots/${l.id}/decision`, { decision: 'accept', comment: 'ok', version: l.version });
    expect(r.status).toBe(400);
    expect(r.body.message).toMatch(/not fully inspected/);
  });

  it('rejects on any critical failure, whatever Ac says', async () => {
    const { part } = await partWithPlan({ aql: 6.5 });
    const l = await receive(part.id, 50);
    const readings = l.samples.flatMap((s: { id: string }, i: number) =>
      goodCore(s.id).map((r) => (i === 0 && r.characteristicCode === 'PAPERS' ? { ...r, pass: false, note: 'No certificate in the pallet pouch' } : r)),
    );
    await insp.put(`/api/lots/${l.id}/readings`, { readings });
    const prop = await insp.get(`/api/lots/${l.id}/proposal`);
    expect(l.sampling.accept).toBeGreaterThanOrEqual(1);
    expect(prop.body).toMatchObject({ proposal: 'reject', criticalFailures: 1 });
  });

  it('switches to tightened after 2 of 5 lots are not accepted, and back after 5 accepted', async () => {
    const { part } = await partWithPlan();
    const decide = async (bad: number) => {
      const l = await inspectLot(part.id, bad);
      const r = await insp.post(`/api/lots/${l.id}/decision`, { decision: bad ? 'reject' : 'accept', comment: 'per results', version: l.version });
      expect(r.status).toBe(200);
    };
    await decide(1);
    await decide(0);
    await decide(1); // ISO 2859-1 §9.3.2: 2 of 5 or fewer consecutive lots not accepted → tightened
    let sw = await eng.get(`/api/suppliers/${supplierId}/switching?partId=${part.id}`);
    expect(sw.body.state.severity).toBe('tightened');
    expect(sw.body.history[0].event).toBe('to-tightened');
    const next = await receive(part.id, 50);
    expect(next.sampling.severity).toBe('tightened');
    expect(next.sampling.sampleSize).toBe(20); // ISO 2859-1 Table 2-B: D/1.0 ↓ → F, n 20, Ac 0 Re 1
    for (let i = 0; i < 5; i++) await decide(0); // ISO 2859-1 §9.3.3: 5 consecutive accepted on tightened → normal
    sw = await eng.get(`/api/suppliers/${supplierId}/switching?partId=${part.id}`);
    expect(sw.body.state.severity).toBe('normal');
  });
});

describe('photos', () => {
  it('strips all metadata, GPS included, and stores a web copy and a thumbnail', async () => {
    const { part } = await partWithPlan();
    const l = await receive(part.id, 20);
    const original = await sharp({ create: { width: 3000, height: 2000, channels: 3, background: '#6b7b78' } })
      .jpeg()
      .withExif({ IFD0: { Make: 'TabletCam', Model: 'Dock-7' }, IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '51/1 30/1 12/1', GPSLongitudeRef: 'W', GPSLongitude: '0/1 7/1 40/1' } })
      .toBuffer();
    const before = await sharp(original).metadata();
    expect(before.exif?.toString('latin1')).toContain('TabletCam');
    const form = new FormData();
    form.append('file', new Blob([original], { type: 'image/jpeg' }), 'core.jpg');
    form.append('caption', 'Burr on slot 12');
    form.append('sampleId', l.samples[0].id);
    const r = await insp.post(`/api/lots/${l.id}/photos`, form);
    expect(r.status).toBe(201);
    expect(r.body).toMatchObject({ width: 2048, height: 1365, caption: 'Burr on slot 12' });
    const web = await fetch(`${t.url}/api/photos/${r.body.id}`, { headers: { cookie: insp.cookieHeader() } });
    const bytes = Buffer.from(await web.arrayBuffer());
    const after = await sharp(bytes).metadata();
    expect(after.exif).toBeUndefined();
    expect(after.xmp).toBeUndefined();
    expect(bytes.includes(Buffer.from('TabletCam'))).toBe(false);
    const thumb = await fetch(`${t.url}/api/photos/${r.body.id}/thumbnail`, { headers: { cookie: insp.cookieHeader() } });
    expect((await sharp(Buffer.from(await thumb.arrayBuffer())).metadata()).width).toBe(320);
  });

  it('refuses a text file named .jpg with 415', async () => {
    const { part } = await partWithPlan();
    const l = await receive(part.id, 20);
    const form = new FormData();
    form.append('file', new Blob(['this is not an image'], { type: 'image/jpeg' }), 'evil.jpg');
    const r = await insp.post(`/api/lots/${l.id}/photos`, form);
    expect(r.status).toBe(415);
    const got = await insp.get(`/api/lots/${l.id}`);
    expect(got.body.photos).toHaveLength(0);
  });
});

describe('gauge CSV import', () => {
  const csv = (rows: string[]) => ['core,bore,b1,b2,b3,b4,papers', ...rows].join('\n');
  const mapping = () => JSON.stringify({ serialColumn: 'core', columns: { BORE: ['bore'], BURR: ['b1', 'b2', 'b3', 'b4'], PAPERS: ['papers'] }, gaugeIds: { BORE: boreGauge.id, BURR: burrGauge.id } });
  const upload = (lotId: string, text: string, name = 'cmm.csv') => {
    const form = new FormData();
    form.append('file', new Blob([text], { type: 'text/csv' }), name);
    form.append('mapping', mapping());
    return insp.post(`/api/lots/${lotId}/imports`, form);
  };

  it('imports all rows, and recognises the same file the second time', async () => {
    const { part } = await partWithPlan();
    const l = await receive(part.id, 6);
    const text = csv(l.samples.map((s: { serial: number }) => `${s.serial},150.01,20,21,19,22,ok`));
    const r = await upload(l.id, text);
    expect(r.status).toBe(201);
    expect(r.body).toMatchObject({ rows: 6, readings: 18 });
    expect(await t.db.select().from(reading).where(eq(reading.lotId, l.id))).toHaveLength(18);
    const again = await upload(l.id, text, 'renamed.csv');
    expect(again.status).toBe(409);
    expect(again.body.message).toMatch(/already imported/);
  });

  it('stores nothing when one row is bad, and names the line and reason', async () => {
    const { part } = await partWithPlan();
    const l = await receive(part.id, 6);
    const rows = l.samples.map((s: { serial: number }) => `${s.serial},150.01,20,21,19,22,ok`);
    rows[3] = '4,150.01,20,2x1,19,22,ok';
    const r = await upload(l.id, csv(rows));
    expect(r.status).toBe(400);
    expect(r.body.fields.rows).toContain('line 5: BURR column “b2” has “2x1”, not a number');
    expect(await t.db.select().from(reading).where(eq(reading.lotId, l.id))).toHaveLength(0);
  });
});

describe('calculators', () => {
  it('fits a circle and computes eccentricity, stacking factor and insulation', async () => {
    const pts = Array.from({ length: 8 }, (_, i) => [10 + 25 * Math.cos((i * Math.PI) / 4), -5 + 25 * Math.sin((i * Math.PI) / 4)]);
    const c = await insp.post('/api/calc/circle-fit', { points: pts });
    expect(c.body.centerX).toBeCloseTo(10, 9); // REFERENCES Geometry: 8 points at 45° on centre (10, −5), r 25 → exact
    expect(c.body.centerY).toBeCloseTo(-5, 9);
    expect(c.body.diameter).toBeCloseTo(50, 9);
    const od = pts.map(([x, y]) => [x + 0.03, y]);
    const e = await insp.post('/api/calc/eccentricity', { bore: pts, od });
    expect(e.body.eccentricity).toBeCloseTo(0.03, 9);
    expect(e.body.coaxiality).toBeCloseTo(0.06, 9); // ISO 1101: coaxiality zone = 2 × offset
    const sf = await insp.post('/api/calc/stacking-factor', { massG: 5900, densityGcm3: 7.65, areaCm2: 80, stackLengthMm: 100 });
    expect(sf.body.stackingFactor).toBeCloseTo(0.964, 3); // ASTM A719 / IEC 60404-13 worked core check in REFERENCES
    // Common practice: S = n · t / L; 233 laminations of 0.50 mm in a 120 mm stack = 116.5 / 120.
    const byCount = await insp.post('/api/calc/stacking-factor/by-count', { laminationCount: 233, thicknessMm: 0.5, stackLengthMm: 120 });
    expect(byCount.status).toBe(200);
    expect(byCount.body.stackingFactor).toBeCloseTo(116.5 / 120, 12);
    const halfLamination = await insp.post('/api/calc/stacking-factor/by-count', { laminationCount: 232.5, thicknessMm: 0.5, stackLengthMm: 120 });
    expect(halfLamination.status).toBe(400);
    expect(halfLamination.body.fields).toMatchObject({ laminationCount: 'laminationCount must be a whole number' });
    const ins = await insp.post('/api/calc/insulation', { currentsA: [0.1, 0.1] });
    expect(ins.body.resistanceOhmCm2).toBeCloseTo(58.05, 2); // ASTM A717: 6.45 (1/0.10 − 1)
    const bad = await insp.post('/api/calc/circle-fit', { points: [[0, 0], [1, 1]] });
    expect(bad.status).toBe(400);
  });
});
