import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq, sql } from 'drizzle-orm';
import { startTestApp, type TestApp } from '../support/test-app';
import { DEMO, Http, signedIn } from '../support/http';
import { makeGauge, makeSupplier } from '../support/factories';
import { acceptLot, disposition, partWithBorePlan, raise, receiveLot, rejectLot, scrap, sort, startReview, supplierIdOf } from '../support/ncr-fixtures';
import { appUser, auditEvent, correctiveAction, correctiveActionStep } from '../../src-api/db/schema';
import { SupplierNoticesService } from '../../src-api/supplier-desk/supplier-notices.service';
import { dashboardSchema } from '../../shared/schemas/dashboard';
import { scorecardListSchema, scorecardOneSchema, type SupplierScorecard } from '../../shared/schemas/scorecard';
import { addCalendarDays } from '../../shared/compute/working-days';

let t: TestApp;
let eng: Http;
let insp: Http;
let aud: Http;
let admin: Http;
let ngl: Http;
let nglId: string;
/** Supplier S: lots of 500, 300 and 200, the 300 rejected (the hand-computed case). */
let s: { id: string; partId: string; rejectedLotId: string; ncrId: string; scarId: string };
/** Supplier B: one clean lot. Supplier C: same PPM as S, more lots rejected. */
let b: { id: string };
let c: { id: string; partId: string; scarId: string };

const today = () => new Date().toISOString().slice(0, 10);
const cardOf = (items: SupplierScorecard[], id: string) => items.find((i) => i.supplierId === id)!;

async function issueScar(ncrId: string): Promise<string> {
  const r = await eng.post('/api/corrective-actions', { ncrId });
  if (r.status !== 201) throw new Error(`issue: ${r.status} ${JSON.stringify(r.body)}`);
  return r.body.id;
}

beforeAll(async () => {
  t = await startTestApp();
  [eng, insp, aud, admin, ngl] = await Promise.all([DEMO.engineer, DEMO.inspector, DEMO.auditor, DEMO.admin, DEMO.supplierNorthgate].map((e) => signedIn(t.url, e)));
  nglId = await supplierIdOf(eng, 'NGL');

  // S: 500 accepted, 300 rejected, 200 accepted; the rejected lot gets an NCR, signed dispositions and a SCAR.
  const sId = (await makeSupplier(eng, { name: 'Scorecard Stamping S' })).id;
  const sp = await partWithBorePlan(eng);
  const l500 = await receiveLot(insp, { supplierId: sId, partId: sp.partId, quantity: 500 });
  const l300 = await receiveLot(insp, { supplierId: sId, partId: sp.partId, quantity: 300 });
  const l200 = await receiveLot(insp, { supplierId: sId, partId: sp.partId, quantity: 200 });
  await acceptLot(insp, l500, sp.gaugeId);
  await rejectLot(insp, l300, sp.gaugeId);
  await acceptLot(insp, l200, sp.gaugeId);
  const n = await raise(eng, { lotId: l300.id, suspectQuantity: 300 });
  const reviewing = await startReview(eng, n);
  const d = await disposition(eng, reviewing, [scrap(100), sort(200)]);
  expect(d.status).toBe(201);
  const sScar = await issueScar(n.id);
  s = { id: sId, partId: sp.partId, rejectedLotId: l300.id, ncrId: n.id, scarId: sScar };

  const bId = (await makeSupplier(eng, { name: 'Scorecard Stamping B' })).id;
  const bp = await partWithBorePlan(eng);
  await acceptLot(insp, await receiveLot(insp, { supplierId: bId, partId: bp.partId, quantity: 400 }), bp.gaugeId);
  b = { id: bId };

  // C: 100 and 200 rejected, 700 accepted → 300 / 1000 rejected too, but in two lots.
  const cId = (await makeSupplier(eng, { name: 'Scorecard Stamping C' })).id;
  const cp = await partWithBorePlan(eng);
  const c100 = await receiveLot(insp, { supplierId: cId, partId: cp.partId, quantity: 100 });
  await rejectLot(insp, c100, cp.gaugeId);
  await rejectLot(insp, await receiveLot(insp, { supplierId: cId, partId: cp.partId, quantity: 200 }), cp.gaugeId);
  await acceptLot(insp, await receiveLot(insp, { supplierId: cId, partId: cp.partId, quantity: 700 }), cp.gaugeId);
  const cScar = await issueScar((await raise(eng, { lotId: c100.id })).id);
  c = { id: cId, partId: cp.partId, scarId: cScar };

  // Northgate (the signed-in supplier user's company): one lot of 50, rejected.
  const np = await partWithBorePlan(eng);
  await rejectLot(insp, await receiveLot(insp, { supplierId: nglId, partId: np.partId, quantity: 50 }), np.gaugeId);
}, 120_000);
afterAll(async () => {
  await t?.close();
});

describe('GET /api/scorecards', () => {
  it('computes lots, quantities and PPM for a hand-computed case', async () => {
    const r = await eng.get('/api/scorecards');
    expect(r.status).toBe(200);
    scorecardListSchema.parse(r.body);
    const sut = cardOf(r.body.items, s.id);
    expect(sut.lots).toEqual({ received: 3, accepted: 2, rejected: 1, undecided: 0 });
    expect(sut.quantity).toEqual({ received: 1000, rejected: 300 }); // 500 + 300 + 200 received; the rejected lot's 300
    expect(sut.ppm).toBe(300_000); // 300 ÷ (500 + 300 + 200) × 10⁶ = 300 000
    expect(sut.costOfPoorQuality).toBe(1502); // scrap 100 × 12.50 = 1 250 + sort 6 h × 42 = 252 → 1 502
    expect(cardOf(r.body.items, b.id).ppm).toBe(0); // 0 ÷ 400 × 10⁶
  });

  it('puts the figures in the current period of the trend, and nothing in the others', async () => {
    const r = await eng.get('/api/scorecards');
    expect(r.body.period).toBe('month');
    expect(r.body.periods).toHaveLength(6);
    const sut = cardOf(r.body.items, s.id).trend;
    expect(sut.map((p) => p.period)).toEqual(r.body.periods.map((p: { key: string }) => p.key));
    expect(sut[5]).toEqual({ period: today().slice(0, 7), lotsReceived: 3, lotsRejected: 1, quantityReceived: 1000, quantityRejected: 300, ppm: 300_000 });
    expect(sut.slice(0, 5).every((p) => p.lotsReceived === 0 && p.ppm === null)).toBe(true);
    const q = await eng.get('/api/scorecards?period=quarter');
    expect(q.body.periods).toHaveLength(4);
    expect(cardOf(q.body.items, s.id).trend[3]).toMatchObject({ lotsReceived: 3, ppm: 300_000 });
    // A range that ended before today's lots holds none of them.
    const past = await eng.get('/api/scorecards?from=2024-01-01&to=2024-06-30');
    expect(cardOf(past.body.items, s.id)).toMatchObject({ lots: { received: 0 }, ppm: null, rank: null, costOfPoorQuality: 0, scars: { issued: 0 } });
  });

  it('ranks by PPM, ties by lots rejected; suppliers with no lots are not ranked', async () => {
    const r = await eng.get('/api/scorecards');
    const rank = (id: string) => cardOf(r.body.items, id).rank!;
    expect(cardOf(r.body.items, c.id).ppm).toBe(300_000); // (100 + 200) ÷ (100 + 200 + 700) × 10⁶
    expect(rank(b.id)).toBeLessThan(rank(s.id)); // 0 PPM before 300 000
    expect(rank(s.id)).toBeLessThan(rank(c.id)); // same PPM: 1 lot rejected before 2
    const okaro = r.body.items.find((i: SupplierScorecard) => i.supplierCode === 'OKS');
    expect(okaro).toMatchObject({ rank: null, ppm: null });
    expect(r.body.rankedOf).toBe(4); // S, B, C and Northgate delivered
    expect(r.body.items.slice(0, 4).map((i: SupplierScorecard) => i.rank)).toEqual([...r.body.items.slice(0, 4).map((i: SupplierScorecard) => i.rank)].sort((x, y) => x - y));
  });

  it('counts corrective actions issued, overdue and closed on time', async () => {
    const before = cardOf((await eng.get('/api/scorecards')).body.items, s.id).scars;
    expect(before).toEqual({ issued: 1, closedOnTime: 0, closedLate: 0, open: 1, overdue: 0 });
    // Time passes: containment was due yesterday and is still owed.
    await t.db.update(correctiveActionStep).set({ dueOn: addCalendarDays(today(), -1) }).where(and(eq(correctiveActionStep.correctiveActionId, s.scarId), eq(correctiveActionStep.step, 'D3')));
    // C's request went through all eight steps (walked in tests/api/scar.test.ts); here it is only marked closed today, before its closure date.
    await t.db.update(correctiveAction).set({ status: 'closed', closedAt: new Date() }).where(eq(correctiveAction.id, c.scarId));
    const r = await eng.get('/api/scorecards');
    expect(cardOf(r.body.items, s.id).scars).toEqual({ issued: 1, closedOnTime: 0, closedLate: 0, open: 1, overdue: 1 });
    expect(cardOf(r.body.items, c.id).scars).toEqual({ issued: 1, closedOnTime: 1, closedLate: 0, open: 0, overdue: 0 });
    // Closed after every due date: late.
    await t.db.update(correctiveActionStep).set({ dueOn: addCalendarDays(today(), -2) }).where(eq(correctiveActionStep.correctiveActionId, c.scarId));
    expect(cardOf((await eng.get('/api/scorecards')).body.items, c.id).scars).toMatchObject({ closedOnTime: 0, closedLate: 1 });
  });

  it('shows the current switching state per part', async () => {
    const r = await eng.get('/api/scorecards');
    expect(cardOf(r.body.items, s.id).switching).toEqual([expect.objectContaining({ partId: s.partId, severity: 'normal', discontinued: false })]);
    // ISO 2859-1 §9.3.2: 2 of 5 or fewer consecutive lots not accepted on normal → tightened.
    expect(cardOf(r.body.items, c.id).switching).toEqual([expect.objectContaining({ partId: c.partId, severity: 'tightened' })]);
  });

  it('says in the OpenAPI description exactly what counts', () => {
    const op = (t.openapi.paths['/api/scorecards'] as { get: { description: string } }).get;
    expect(op.description).toMatch(/Rejected quantity is the whole quantity of every lot rejected/);
    expect(op.description).toMatch(/at most 3 years/);
  });
});

describe('GET /api/scorecards/:supplierId', () => {
  it('answers one supplier’s card with its rank', async () => {
    const r = await eng.get(`/api/scorecards/${s.id}`);
    expect(r.status).toBe(200);
    scorecardOneSchema.parse(r.body);
    expect(r.body.item).toMatchObject({ supplierId: s.id, ppm: 300_000, lots: { received: 3 } });
    const list = await eng.get('/api/scorecards');
    expect(r.body.item.rank).toBe(cardOf(list.body.items, s.id).rank);
    expect((await aud.get(`/api/scorecards/${s.id}`)).status).toBe(200);
    expect((await admin.get(`/api/scorecards/${s.id}`)).status).toBe(200);
    expect((await eng.get('/api/scorecards/7f1c9a52-0000-4000-8000-000000000000')).status).toBe(404);
    expect((await eng.get('/api/scorecards/not-an-id')).status).toBe(400);
  });
});

describe('a supplier user', () => {
  it('sees only its own card, without a rank, and another supplier’s is a 404', async () => {
    const r = await ngl.get('/api/scorecards');
    expect(r.status).toBe(200);
    expect(r.body.items).toHaveLength(1);
    expect(r.body.items[0]).toMatchObject({ supplierId: nglId, supplierCode: 'NGL', rank: null, lots: { received: 1, rejected: 1 }, ppm: 1_000_000 }); // 50 ÷ 50 × 10⁶
    expect(r.body.rankedOf).toBe(0);
    expect((await ngl.get(`/api/scorecards/${nglId}`)).body.item.ppm).toBe(1_000_000);
    expect((await ngl.get(`/api/scorecards/${s.id}`)).status).toBe(404);
  });

  it('is refused to inspectors (403)', async () => {
    expect((await insp.get('/api/scorecards')).status).toBe(403);
  });
});

describe('bad scorecard queries', () => {
  it.each([
    ['from=2026-03-01&to=2026-01-31', 'to', /inverted/],
    ['from=2020-01-01&to=2023-01-02', 'to', /at most 3 years.*2023-01-01 at the latest/],
    ['from=2001-01-01', 'to', /at most 3 years/],
    ['from=2026-02-30', 'from', /date/],
    ['to=yesterday', 'to', /date like/],
    ['period=week', 'period', /month or quarter/],
    ['supplier=NGL', '_', /supplier/],
  ])('refuses %s (400 on %s)', async (q, field, message) => {
    const r = await eng.get(`/api/scorecards?${q}`);
    expect(r.status).toBe(400);
    expect(r.body.error).toBe('validation');
    const fields = r.body.fields as Record<string, string>;
    expect(field in fields ? fields[field] : JSON.stringify(fields)).toMatch(message);
  });

  it('accepts exactly 3 years', async () => {
    const r = await eng.get('/api/scorecards?from=2020-01-01&to=2023-01-01&period=quarter');
    expect(r.status).toBe(200);
    expect(r.body.periods).toHaveLength(13);
  });

  it('refuses the same on one supplier’s card', async () => {
    expect((await eng.get(`/api/scorecards/${s.id}?from=2026-03-01&to=2026-01-01`)).status).toBe(400);
    expect((await eng.get(`/api/scorecards/${s.id}?page=2`)).status).toBe(400);
  });
});

describe('GET /api/dashboard', () => {
  it('gives the inspector the Dock queue and today’s lots', async () => {
    const part = await partWithBorePlan(eng);
    const before = dashboardSchema.parse((await insp.get('/api/dashboard')).body);
    expect(before.role).toBe('inspector');
    const l = await receiveLot(insp, { supplierId: b.id, partId: part.partId, quantity: 20 });
    const mid = (await insp.get('/api/dashboard')).body;
    if (before.role !== 'inspector') throw new Error('not an inspector dashboard');
    expect(mid.dock.queue).toBe(before.dock.queue + 1);
    expect(mid.today.received).toBe(before.today.received + 1);
    expect(mid.dock.oldestReceivedAt).not.toBeNull();
    expect(mid.today.date).toBe(today());
    await rejectLot(insp, l, part.gaugeId);
    const after = (await insp.get('/api/dashboard')).body;
    expect(after.dock.queue).toBe(before.dock.queue);
    expect(after.today).toMatchObject({ decided: before.today.decided + 1, rejected: before.today.rejected + 1, accepted: before.today.accepted });
  });

  it('gives the engineer NCRs, drift signals, SCAR steps due and gauges falling due', async () => {
    const before = (await eng.get('/api/dashboard')).body;
    dashboardSchema.parse(before);
    expect(before.role).toBe('engineer');
    expect(before.driftSignals).toEqual({ open: expect.any(Number), latestAt: before.driftSignals.open ? expect.any(String) : null });
    // The S corrective action's containment step was moved to yesterday above: it is overdue.
    expect(before.scarSteps.overdue).toBeGreaterThanOrEqual(1);
    expect(before.scarSteps.items[0]).toMatchObject({ scarId: s.scarId, step: 'D3', title: 'Containment', overdue: true });
    const gDue = await makeGauge(eng, { calibrationDueOn: addCalendarDays(today(), 10) });
    await makeGauge(eng, { calibrationDueOn: addCalendarDays(today(), 45) });
    const part = await partWithBorePlan(eng);
    const held = await rejectLot(insp, await receiveLot(insp, { supplierId: b.id, partId: part.partId, quantity: 10 }), part.gaugeId);
    expect(((await eng.get('/api/dashboard')).body).ncrs.heldLotsWithoutNcr).toBe(before.ncrs.heldLotsWithoutNcr + 1);
    await raise(eng, { lotId: held.id, suspectQuantity: 10 });
    const after = (await eng.get('/api/dashboard')).body;
    expect(after.gauges.dueSoon).toBe(before.gauges.dueSoon + 1); // due in 10 days counts, in 45 days not (30-day window)
    expect(after.gauges.items.map((g: { id: string }) => g.id)).toContain(gDue.id);
    expect(after.ncrs.notClosed).toBe(before.ncrs.notClosed + 1);
    expect(after.ncrs.open).toBe(before.ncrs.open + 1);
  });

  it('gives a supplier its own open steps, notices and lots on hold only', async () => {
    const part = await partWithBorePlan(eng);
    const held = await rejectLot(insp, await receiveLot(insp, { supplierId: nglId, partId: part.partId, quantity: 30 }), part.gaugeId);
    const scarId = await issueScar((await raise(eng, { lotId: held.id, suspectQuantity: 30 })).id);
    const notices = t.app.get(SupplierNoticesService);
    const mine = await notices.dieServiceDue({ supplierId: nglId, partId: part.partId, characteristicCode: 'BURR', lotsRemaining: 3.2 });
    await notices.dieServiceDue({ supplierId: s.id, partId: s.partId, characteristicCode: 'BURR', lotsRemaining: 1.5 });
    const r = await ngl.get('/api/dashboard');
    dashboardSchema.parse(r.body);
    expect(r.body).toMatchObject({ role: 'supplier', supplierName: 'Northgate Lamination Ltd' });
    expect(r.body.lotsOnHold).toBe(2); // the 50 rejected in setup and this 30, both held
    expect(r.body.openSteps.length).toBeGreaterThan(0);
    expect(r.body.openSteps.every((x: { scarId: string; supplierCode: string }) => x.scarId === scarId && x.supplierCode === 'NGL')).toBe(true);
    expect(r.body.openSteps.every((x: { status: string }) => ['open', 'returned'].includes(x.status))).toBe(true);
    expect(r.body.notices.map((x: { id: string }) => x.id)).toEqual([mine.noticeId]);
  });

  it('gives the auditor the last 20 changes and the chain status, reused for a minute', async () => {
    const r = await aud.get('/api/dashboard');
    dashboardSchema.parse(r.body);
    const [{ last, n }] = await t.db.select({ last: sql<number>`max(${auditEvent.id})::float8`, n: sql<number>`count(*)::int` }).from(auditEvent);
    expect(r.body.recent).toHaveLength(20);
    expect(r.body.recent[0].id).toBe(last);
    expect(r.body.recent.map((e: { id: number }) => e.id)).toEqual([...r.body.recent.map((e: { id: number }) => e.id)].sort((x, y) => y - x));
    expect(r.body.chain).toMatchObject({ ok: true, count: n });
    const again = await aud.get('/api/dashboard');
    expect(again.body.chain).toMatchObject({ cached: true, checkedAt: r.body.chain.checkedAt });
  });

  it('gives the admin users by role and locked accounts', async () => {
    const email = 'locked-dash@harrowgate.test';
    expect((await admin.post('/api/users', { email, name: 'Lock Dash', role: 'auditor', password: 'a-long-enough-password' })).status).toBe(201);
    for (let i = 0; i < 10; i++) await new Http(t.url).login(email, 'wrong');
    const r = await admin.get('/api/dashboard');
    dashboardSchema.parse(r.body);
    const users = await t.db.select({ role: appUser.role }).from(appUser);
    expect(r.body.users.total).toBe(users.length);
    expect(r.body.users.byRole.auditor).toBe(users.filter((u) => u.role === 'auditor').length);
    expect(r.body.users.locked).toBe(1);
    expect(r.body.lockedAccounts).toEqual([expect.objectContaining({ email, role: 'auditor' })]);
  });
});
