import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { startTestApp, type TestApp } from '../support/test-app';
import { DEMO, Http, signedIn } from '../support/http';
import { makeActivePlan, makeGauge, makePart, makeSupplier, simpleCharacteristic, weldedPart } from '../support/factories';
import { auditEvent, inspectionPlan } from '../../src-api/db/schema';

let t: TestApp;
let eng: Http;
let insp: Http;
beforeAll(async () => {
  t = await startTestApp();
  eng = await signedIn(t.url, DEMO.engineer);
  insp = await signedIn(t.url, DEMO.inspector);
});
afterAll(async () => {
  await t?.close();
});

describe('suppliers', () => {
  it('creates, lists with paging and search, and audits', async () => {
    const s = await makeSupplier(eng, { name: 'Quillfield Laminations' });
    const list = await insp.get('/api/suppliers?q=quillfield&pageSize=5');
    expect(list.status).toBe(200);
    expect(list.body.items.map((x: { id: string }) => x.id)).toEqual([s.id]);
    const [ev] = await t.db.select().from(auditEvent).where(eq(auditEvent.entityId, s.id));
    expect(ev.action).toBe('supplier.created');
  });

  it.each([
    [{ code: 'x', name: 'N', contactEmails: ['a@b.test'] }, 'code'],
    [{ code: 'GOOD1', name: '', contactEmails: ['a@b.test'] }, 'name'],
    [{ code: 'GOOD2', name: 'N', contactEmails: [] }, 'contactEmails'],
    [{ code: 'GOOD3', name: 'N', contactEmails: ['not-mail'] }, 'contactEmails.0'],
    [{ code: 'GOOD4', name: 'N', contactEmails: ['a@b.test'], approvalStatus: 'maybe' }, 'approvalStatus'],
    [{ code: 'GOOD5', name: 'N', contactEmails: ['a@b.test'], extra: 1 }, '_'],
  ])('refuses %j with a message on %s', async (body, field) => {
    const r = await eng.post('/api/suppliers', body);
    expect(r.status).toBe(400);
    expect(Object.keys(r.body.fields)).toContain(field);
  });

  it('refuses a duplicate code with 409', async () => {
    const s = await makeSupplier(eng);
    const r = await eng.post('/api/suppliers', { code: s.code, name: 'Twin', contactEmails: ['a@b.test'] });
    expect(r.status).toBe(409);
    expect(r.body.fields.code).toBeTruthy();
  });

  it('needs a reason to change approval status, and refuses a stale version', async () => {
    const s = await makeSupplier(eng);
    const noReason = await eng.patch(`/api/suppliers/${s.id}`, { approvalStatus: 'disapproved', version: s.version });
    expect(noReason.status).toBe(400);
    expect(noReason.body.fields.approvalReason).toBeTruthy();
    const ok = await eng.patch(`/api/suppliers/${s.id}`, { approvalStatus: 'disapproved', approvalReason: 'Two rejected lots for burr', version: s.version });
    expect(ok.status).toBe(200);
    expect(ok.body.approvalStatus).toBe('disapproved');
    const again = await eng.patch(`/api/suppliers/${s.id}`, { name: 'Renamed', version: s.version });
    expect(again.status).toBe(409);
    expect(again.body.error).toBe('stale');
  });

  it('lets a supplier user read only its own record (404 for another)', async () => {
    const sup = await signedIn(t.url, DEMO.supplierNorthgate);
    const mine = await sup.get('/api/suppliers');
    expect(mine.body.total).toBe(1);
    expect(mine.body.items[0].code).toBe('NGL');
    const other = await eng.get('/api/suppliers?q=SPW');
    const r = await sup.get(`/api/suppliers/${other.body.items[0].id}`);
    expect(r.status).toBe(404);
    expect(JSON.stringify(r.body)).not.toContain('Selby');
  });

  it('refuses writes to inspectors and auditors', async () => {
    const aud = await signedIn(t.url, DEMO.auditor);
    for (const h of [insp, aud]) {
      const r = await h.post('/api/suppliers', { code: 'NOPE', name: 'N', contactEmails: ['a@b.test'] });
      expect(r.status).toBe(403);
    }
  });
});

describe('parts', () => {
  it('parses the grade and defaults the density from it', async () => {
    const p = await makePart(eng, { steelGrade: 'm270-35a', laminationThicknessMm: 0.35 });
    expect(p.steelGrade).toBe('M270-35A');
    expect(p.lossWPerKg).toBe(2.7); // IEC 60404-8-4 designation: M270 → 2.70 W/kg at 1.5 T 50 Hz
    expect(p.gradeThicknessMm).toBe(0.35); // IEC 60404-8-4 designation: -35 → 0.35 mm
    expect(p.densityGcm3).toBeCloseTo(7.65, 2); // (memory) IEC 60404-8-4 conventional density for M270-35A
    const own = await makePart(eng, { densityGcm3: 7.72 });
    expect(own.densityGcm3).toBe(7.72);
    expect(own.densitySource).toBe('set by engineer');
  });

  it.each([
    [{ steelGrade: 'X400-50' }, 'steelGrade'],
    [{ steelGrade: 'M400-50' }, 'steelGrade'],
    [{ nominalBoreMm: 0 }, 'nominalBoreMm'],
    [{ nominalOdMm: -5 }, 'nominalOdMm'],
    [{ nominalBoreMm: 260 }, 'nominalBoreMm'],
    [{ slotCount: 4.5 }, 'slotCount'],
    [{ construction: 'glued' }, 'construction'],
    [{ laminationThicknessMm: 'thin' }, 'laminationThicknessMm'],
    [{ designToothT: 3.1 }, 'designToothT'],
  ])('refuses %j', async (over, field) => {
    const r = await eng.post('/api/parts', weldedPart(over));
    expect(r.status).toBe(400);
    expect(r.body.fields[field]).toBeTruthy();
  });

  it('refuses a duplicate part number + revision', async () => {
    const p = await makePart(eng);
    const r = await eng.post('/api/parts', weldedPart({ partNumber: p.partNumber, revision: 'A' }));
    expect(r.status).toBe(409);
    const b = await eng.post('/api/parts', weldedPart({ partNumber: p.partNumber, revision: 'B' }));
    expect(b.status).toBe(201);
  });

  it('stores a drawing PDF and refuses a non-PDF', async () => {
    const p = await makePart(eng);
    const pdf = new FormData();
    pdf.append('file', new Blob([Buffer.from('%PDF-1.4\n% test drawing\n%%EOF\n')], { type: 'application/pdf' }), 'core.pdf');
    const ok = await eng.post(`/api/parts/${p.id}/drawing`, pdf);
    expect(ok.status).toBe(201);
    expect(ok.body.drawing.name).toBe('core.pdf');
    const back = await insp.get(`/api/parts/${p.id}/drawing`);
    expect(back.status).toBe(200);
    expect(String(back.body)).toContain('%PDF-1.4');
    const txt = new FormData();
    txt.append('file', new Blob(['just text']), 'fake.pdf');
    const bad = await eng.post(`/api/parts/${p.id}/drawing`, txt);
    expect(bad.status).toBe(415);
  });
});

describe('gauges', () => {
  it('flags overdue and due-soon gauges', async () => {
    const past = new Date(Date.now() - 2 * 86_400_000).toISOString().slice(0, 10);
    const soon = new Date(Date.now() + 10 * 86_400_000).toISOString().slice(0, 10);
    const overdue = await makeGauge(eng, { calibrationDueOn: past });
    const dueSoon = await makeGauge(eng, { calibrationDueOn: soon });
    expect(overdue.calibrationOverdue).toBe(true);
    expect(overdue.dueInDays).toBe(-2);
    expect(dueSoon.calibrationOverdue).toBe(false);
    const list = await insp.get('/api/gauges?calibration=due-soon&pageSize=200');
    const ids = list.body.items.map((g: { id: string }) => g.id);
    expect(ids).toContain(dueSoon.id);
    expect(ids).not.toContain(overdue.id);
    const od = await insp.get('/api/gauges?calibration=overdue&pageSize=200');
    expect(od.body.items.map((g: { id: string }) => g.id)).toContain(overdue.id);
  });

  it.each([
    [{ assetTag: '' }, 'assetTag'],
    [{ kind: 'ruler' }, 'kind'],
    [{ resolution: 0 }, 'resolution'],
    [{ unit: 'inch' }, 'unit'],
    [{ calibrationDueOn: '31/12/2026' }, 'calibrationDueOn'],
    [{ rangeMin: 10, rangeMax: 5 }, 'rangeMax'],
  ])('refuses %j', async (over, field) => {
    const r = await eng.post('/api/gauges', { assetTag: 'G-VALID', kind: 'micrometer', description: 'd', resolution: 0.001, unit: 'mm', calibrationDueOn: '2027-01-31', ...over });
    expect(r.status).toBe(400);
    expect(r.body.fields[field]).toBeTruthy();
  });
});

describe('inspection plans', () => {
  it('draft → active → superseded, with one active plan per part', async () => {
    const p = await makePart(eng);
    const first = await makeActivePlan(eng, p.id);
    expect(first.status).toBe('active');
    expect(first.revision).toBe(1);
    const draft = await eng.post(`/api/plans/${first.id}/revise`);
    expect(draft.status).toBe(201);
    expect(draft.body).toMatchObject({ status: 'draft', revision: 2, basedOnPlanId: first.id });
    const edited = await eng.patch(`/api/plans/${draft.body.id}`, { version: draft.body.version, characteristics: [simpleCharacteristic({ usl: 150.04 })] });
    expect(edited.status).toBe(200);
    const act = await eng.post(`/api/plans/${draft.body.id}/activate`, { version: edited.body.version });
    expect(act.status).toBe(200);
    const old = await eng.get(`/api/plans/${first.id}`);
    expect(old.body.status).toBe('superseded');
    const changes = await insp.get(`/api/plans/${draft.body.id}/changes`);
    expect(changes.status).toBe(200);
    expect(changes.body.changes).toEqual([expect.objectContaining({ kind: 'changed', code: 'BORE', field: 'usl', before: 150.05, after: 150.04 })]);
    const actives = await t.db.select().from(inspectionPlan).where(eq(inspectionPlan.partId, p.id));
    expect(actives.filter((x) => x.status === 'active')).toHaveLength(1);
  });

  it('never edits an active plan (409 that says to revise)', async () => {
    const p = await makePart(eng);
    const plan = await makeActivePlan(eng, p.id);
    const r = await eng.patch(`/api/plans/${plan.id}`, { version: plan.version, notes: 'sneaky' });
    expect(r.status).toBe(409);
    expect(r.body.message).toMatch(/Revise/);
  });

  it('refuses to activate a plan with no characteristics', async () => {
    const p = await makePart(eng);
    const d = await eng.post('/api/plans', { partId: p.id, samplingKind: 'zero-acceptance', zeroSampleSize: 5, characteristics: [] });
    expect(d.status).toBe(201);
    const r = await eng.post(`/api/plans/${d.body.id}/activate`, { version: d.body.version });
    expect(r.status).toBe(400);
    expect(r.body.fields.characteristics).toBeTruthy();
  });

  it('lets exactly one of two concurrent activations of the same draft win', async () => {
    const p = await makePart(eng);
    const d = await eng.post('/api/plans', { partId: p.id, samplingKind: 'aql', inspectionLevel: 'II', aql: 1.0, characteristics: [simpleCharacteristic()] });
    const other = await signedIn(t.url, DEMO.engineer);
    const [a, b] = await Promise.all([
      eng.post(`/api/plans/${d.body.id}/activate`, { version: d.body.version }),
      other.post(`/api/plans/${d.body.id}/activate`, { version: d.body.version }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
  });

  it('keeps one active plan when two drafts of a part are activated at once', async () => {
    const p = await makePart(eng);
    const mk = () => eng.post('/api/plans', { partId: p.id, samplingKind: 'aql', inspectionLevel: 'II', aql: 1.0, characteristics: [simpleCharacteristic()] });
    const [d1, d2] = [await mk(), await mk()];
    const other = await signedIn(t.url, DEMO.engineer);
    const rs = await Promise.all([eng.post(`/api/plans/${d1.body.id}/activate`, { version: d1.body.version }), other.post(`/api/plans/${d2.body.id}/activate`, { version: d2.body.version })]);
    expect(rs.every((r) => r.status === 200)).toBe(true);
    const rows = await t.db.select().from(inspectionPlan).where(eq(inspectionPlan.partId, p.id));
    expect(rows.filter((x) => x.status === 'active')).toHaveLength(1);
    expect(rows.filter((x) => x.status === 'superseded')).toHaveLength(1);
  });

  it.each([
    [{ lsl: 150.1, usl: 150.0 }, 'characteristics.0.lsl'],
    [{ lsl: null, usl: null }, 'characteristics.0.usl'],
    [{ unit: 'furlong' }, 'characteristics.0.unit'],
    [{ readingsPerSample: 65 }, 'characteristics.0.readingsPerSample'],
    [{ layout: 'probed', angles: 2 }, 'characteristics.0.angles'],
    [{ kind: 'derived' }, 'characteristics.0.derivedFormula'],
  ])('validates characteristic %j', async (over, field) => {
    const p = await makePart(eng);
    const r = await eng.post('/api/plans', { partId: p.id, samplingKind: 'aql', inspectionLevel: 'II', aql: 1.0, characteristics: [simpleCharacteristic(over)] });
    expect(r.status).toBe(400);
    expect(r.body.fields[field]).toBeTruthy();
  });

  it('refuses duplicate codes, unknown AQLs and levels', async () => {
    const p = await makePart(eng);
    const dup = await eng.post('/api/plans', { partId: p.id, samplingKind: 'aql', inspectionLevel: 'II', aql: 1.0, characteristics: [simpleCharacteristic(), simpleCharacteristic()] });
    expect(dup.status).toBe(400);
    expect(dup.body.fields['characteristics.1.code']).toMatch(/twice/);
    const aql = await eng.post('/api/plans', { partId: p.id, samplingKind: 'aql', inspectionLevel: 'II', aql: 0.3, characteristics: [] });
    expect(aql.body.fields.aql).toMatch(/preferred/);
    const lvl = await eng.post('/api/plans', { partId: p.id, samplingKind: 'aql', inspectionLevel: 'IV', aql: 1.0, characteristics: [] });
    expect(lvl.body.fields.inspectionLevel).toBeTruthy();
  });

  it('creates a plan from the welded template, sized from the part', async () => {
    const p = await makePart(eng, { slotCount: 48 });
    const templates = await insp.get('/api/plan-templates');
    expect(templates.body.map((x: { id: string }) => x.id)).toEqual(expect.arrayContaining(['welded', 'interlocked', 'bonded', 'segmented']));
    const r = await eng.post('/api/plans/from-template', { partId: p.id, template: 'welded' });
    expect(r.status).toBe(201);
    const codes = r.body.characteristics.map((c: { code: string }) => c.code);
    expect(codes.length).toBeGreaterThan(10);
    expect(r.body.characteristics.some((c: { wearDriven: boolean }) => c.wearDriven)).toBe(true);
    expect(JSON.stringify(r.body.characteristics)).toMatch(/48/);
    const act = await eng.post(`/api/plans/${r.body.id}/activate`, { version: r.body.version });
    expect(act.status).toBe(200);
    const part = await insp.get(`/api/parts/${p.id}`);
    expect(part.body.activePlanId).toBe(r.body.id);
  });

  it('refuses plan writes to an inspector', async () => {
    const p = await makePart(eng);
    const r = await insp.post('/api/plans', { partId: p.id, samplingKind: 'aql', inspectionLevel: 'II', aql: 1.0, characteristics: [] });
    expect(r.status).toBe(403);
  });
});

void Http;
