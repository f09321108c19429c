import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import net, { type AddressInfo } from 'node:net';
import { and, eq, inArray } from 'drizzle-orm';
import { startTestApp, type TestApp } from '../support/test-app';
import { DEMO, signedIn, type Http } from '../support/http';
import { MAIL_CAPTURE_URL, SMTP_PORT } from '../support/env';
import { acceptLot, partWithBorePlan, raise, receiveLot, rejectedLot, supplierIdOf } from '../support/ncr-fixtures';
import { correctiveActionStep, outboxMessage } from '../../src-api/db/schema';
import { OutboxWorker } from '../../src-api/mail/outbox.worker';
import { CorrectiveActionsService } from '../../src-api/corrective-actions/corrective-actions.service';
import { DueDatesService } from '../../src-api/corrective-actions/due-dates.service';
import { SupplierNoticesService } from '../../src-api/supplier-desk/supplier-notices.service';
import { SCAR_MANUAL_TRANSITIONS, SCAR_STATUSES, type ScarStatus } from '../../shared/compute/workflow';
import { addCalendarDays, addWorkingDays, previousWorkingDay } from '../../shared/compute/working-days';

/** A loopback port nobody listens on: SMTP "down". */
async function closedPort(): Promise<number> {
  return new Promise((resolve) => {
    const s = net.createServer();
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

let t: TestApp;
let eng: Http;
let sup: Http;
let other: Http;
let ngl: string;
let part: { partId: string; gaugeId: string };
let down: OutboxWorker;
let up: OutboxWorker;

beforeAll(async () => {
  // This app's own mail target is a closed port: whatever it delivers fails until the test
  // points delivery at the real capture server.
  t = await startTestApp({ config: { SMTP_PORT: await closedPort(), MAIL_MAX_ATTEMPTS: 4, PUBLIC_URL: 'http://desk.harrowgate.test:3000' } });
  eng = await signedIn(t.url, DEMO.engineer);
  sup = await signedIn(t.url, DEMO.supplierNorthgate);
  other = await signedIn(t.url, DEMO.supplierSelby);
  ngl = await supplierIdOf(eng, 'NGL');
  const made = await rejectedLot(eng, { supplierId: ngl });
  part = { partId: made.partId, gaugeId: made.gaugeId };
  down = t.app.get(OutboxWorker);
  up = new OutboxWorker(t.db, { ...t.config, SMTP_PORT });
});
afterAll(async () => {
  await t?.close();
});

const today = () => new Date().toISOString().slice(0, 10);

/** A rejected Northgate lot of the given part (a fresh part by default: the switching rules stop a part after repeated rejections). */
async function ncrForNgl(over: Record<string, unknown> = {}, p?: { partId: string; gaugeId: string }) {
  const { lot } = await rejectedLot(eng, { supplierId: ngl, ...(p ?? (await partWithBorePlan(eng))) });
  return raise(eng, { lotId: lot.id, ...over });
}

async function issue(over: Record<string, unknown> = {}) {
  const p = await partWithBorePlan(eng);
  const n = await ncrForNgl({}, p);
  const r = await eng.post('/api/corrective-actions', { ncrId: n.id, ...over });
  if (r.status !== 201) throw new Error(`issue: ${r.status} ${JSON.stringify(r.body)}`);
  return { ...r.body, part: p };
}

const ANSWERS: Record<string, Record<string, unknown>> = {
  D1: { members: [{ name: 'Mara Lind', role: 'Quality manager' }, { name: 'Ole Brandt', role: 'Die shop lead' }] },
  D2: { description: 'Bore oversize on lot shipped from press 4' },
  D3: { actions: 'Stock quarantined, 100 % bore check', atSupplier: { checked: 1200, nonconforming: 14 }, inTransit: { checked: 300, nonconforming: 0 }, cleanMark: 'Green dot on pallet label' },
  D4: { rootCause: 'Worn pilot on die 4B', escapePoint: 'Bore checked once per coil instead of per hour', method: '5 why' },
  D5: { actions: [{ action: 'Replace pilot, add wear check', owner: 'Ole Brandt', dueOn: '2026-12-01' }] },
  D6: { actions: [{ action: 'Pilot replaced', owner: 'Ole Brandt', doneOn: '2026-11-20' }], validation: '3 coils measured, Cpk 1.8' },
  D7: { prevention: 'Pilot wear added to the die maintenance plan for all dies' },
  D8: { summary: 'Closed after three clean lots' },
};

async function answer(h: Http, id: string, step: string, submit = true, body: Record<string, unknown> = ANSWERS[step]) {
  const cur = await h.get(`/api/corrective-actions/${id}`);
  const s = cur.body.steps.find((x: { step: string }) => x.step === step);
  return h.put(`/api/corrective-actions/${id}/steps/${step}`, { answer: body, submit, version: s.version });
}

async function review(id: string, step: string, decision: 'accept' | 'return', comment?: string) {
  const cur = await eng.get(`/api/corrective-actions/${id}`);
  const s = cur.body.steps.find((x: { step: string }) => x.step === step);
  return eng.post(`/api/corrective-actions/${id}/steps/${step}/review`, { decision, comment, version: s.version });
}

async function move(h: Http, id: string, to: ScarStatus, note?: string) {
  const cur = await eng.get(`/api/corrective-actions/${id}`);
  return h.post(`/api/corrective-actions/${id}/transition`, { to, version: cur.body.version, note });
}

async function captured(): Promise<{ to: string[]; subject: string; text: string; html: string | null }[]> {
  return (await fetch(`${MAIL_CAPTURE_URL}/messages`)).json();
}

/** Runs the real-port worker until nothing is due (mails in backoff included, via a later "now"). */
async function deliverAll(worker = up) {
  const later = new Date(Date.now() + 7 * 86_400_000);
  let sent = 0;
  for (let i = 0; i < 10; i++) {
    const r = await worker.deliverPending({ now: later });
    sent += r.sent;
    if (r.sent + r.retried + r.failed === 0) break;
  }
  return sent;
}

describe('issuing a corrective action from an NCR', () => {
  it('numbers it, opens D1–D3 with the default due dates, and queues the mail in the same transaction', async () => {
    const n = await ncrForNgl({ title: 'Bore <b>oversize</b> & burr' }, part);
    const r = await eng.post('/api/corrective-actions', { ncrId: n.id });
    expect(r.status).toBe(201);
    const ca = r.body;
    expect(ca.number).toMatch(/^SCAR-\d{4}-\d{4}$/);
    expect(ca).toMatchObject({ status: 'issued', ncrId: n.id, ncrNumber: n.number, supplierId: ngl, defectCodes: ['BORE'], nextDueStep: 'D1' });
    const due = Object.fromEntries(ca.steps.map((s: { step: string; dueOn: string }) => [s.step, s.dueOn]));
    const containment = addWorkingDays(today(), 1); // common practice: containment 24 h
    const rootCause = addWorkingDays(today(), 10); // common practice: root cause and plan in 10 working days
    const closure = addWorkingDays(addCalendarDays(today(), 45), 0); // within the common 30–60 days, on a working day
    expect(due).toEqual({ D1: containment, D2: containment, D3: containment, D4: rootCause, D5: rootCause, D6: closure, D7: closure, D8: closure });
    expect(ca.steps.map((s: { status: string }) => s.status)).toEqual(['open', 'open', 'open', 'locked', 'locked', 'locked', 'locked', 'locked']);
    expect(ca.recipients).toContain(DEMO.supplierNorthgate);
    expect(ca.mail).toEqual([expect.objectContaining({ kind: 'scar-issued', status: 'pending', attempts: 0, to: ca.recipients })]);
    const [m] = await t.db.select().from(outboxMessage).where(eq(outboxMessage.entityId, ca.id));
    const link = `http://desk.harrowgate.test:3000/supplier-desk/corrective-actions/${ca.id}`;
    expect(m.text).toContain(link);
    expect(m.text).toMatch(new RegExp(`Containment \\(D1–D3\\) due\\s+${containment}`));
    expect(m.html).toContain(`href="${link}"`);
    // Stored text is escaped in the HTML body.
    expect(m.html).not.toContain('<b>oversize</b>');
    expect(m.html).toContain('Bore &lt;b&gt;oversize&lt;/b&gt; &amp; burr');
    const ncrNow = await eng.get(`/api/ncrs/${n.id}`);
    expect(ncrNow.body).toMatchObject({ scarId: ca.id, scarNumber: ca.number });
  });

  it('refuses an NCR without a supplier, a second request for the same NCR, and non-engineers; refused issues queue no mail', async () => {
    const before = (await t.db.select().from(outboxMessage)).length;
    const byHand = await raise(eng, { suspectQuantity: 2 });
    const r = await eng.post('/api/corrective-actions', { ncrId: byHand.id });
    expect(r.status).toBe(400);
    expect(r.body.fields.ncrId).toMatch(/names no supplier/);
    const n = await ncrForNgl({}, part);
    expect((await eng.post('/api/corrective-actions', { ncrId: n.id })).status).toBe(201);
    const twice = await eng.post('/api/corrective-actions', { ncrId: n.id });
    expect(twice.status).toBe(409);
    for (const email of [DEMO.inspector, DEMO.admin, DEMO.auditor]) {
      const h = await signedIn(t.url, email);
      expect((await h.post('/api/corrective-actions', { ncrId: n.id })).status).toBe(403);
    }
    expect((await t.db.select().from(outboxMessage)).length).toBe(before + 1);
  });

  it('takes its response times from the configuration', () => {
    const svc = t.app.get(CorrectiveActionsService);
    // 2026-01-02 is a Friday (ISO 8601 calendar).
    expect(svc.dueDates('2026-01-02')).toEqual({ containment: '2026-01-05', rootCause: '2026-01-16', closure: '2026-02-16' });
    const custom = new CorrectiveActionsService(t.db, { ...t.config, SCAR_CONTAINMENT_WORKING_DAYS: 2, SCAR_ROOT_CAUSE_WORKING_DAYS: 5, SCAR_CLOSURE_DAYS: 30 }, null as never, null as never);
    // 30 days after 2 January is Sunday 1 February: a closure date moves to the next working day.
    expect(custom.dueDates('2026-01-02')).toEqual({ containment: '2026-01-06', rootCause: '2026-01-09', closure: '2026-02-02' });
  });
});

describe('8D answers and reviews', () => {
  it('keeps drafts incomplete, checks a submission in full, and refuses steps that are not open with 409', async () => {
    const ca = await issue();
    const draft = await answer(sup, ca.id, 'D3', false, { actions: 'Quarantine started' });
    expect(draft.status).toBe(200);
    const d3 = draft.body.steps.find((s: { step: string }) => s.step === 'D3');
    expect(d3).toMatchObject({ status: 'open', draft: { actions: 'Quarantine started' }, answer: null });
    expect(draft.body.status).toBe('issued');
    const incomplete = await answer(sup, ca.id, 'D3', true, { actions: 'Quarantine started', atSupplier: { checked: 10, nonconforming: 12 } });
    expect(incomplete.status).toBe(400);
    expect(incomplete.body.fields['answer.atSupplier.nonconforming']).toMatch(/More nonconforming cores than were checked/);
    expect(incomplete.body.fields['answer.inTransit']).toBeTruthy();
    const d4early = await answer(sup, ca.id, 'D4');
    expect(d4early.status).toBe(409);
    expect(d4early.body.message).toMatch(/D4 opens once the containment \(D3\) is submitted/);
    const d8early = await answer(sup, ca.id, 'D8');
    expect(d8early.status).toBe(409);
    expect((await answer(sup, ca.id, 'D3')).status).toBe(200);
    const again = await answer(sup, ca.id, 'D3');
    expect(again.status).toBe(409);
    expect(again.body.message).toMatch(/waits for the engineer/);
    expect((await review(ca.id, 'D3', 'accept')).status).toBe(200);
    const accepted = await answer(sup, ca.id, 'D3');
    expect(accepted.body.message).toMatch(/accepted; it no longer changes/);
    const stale = await sup.put(`/api/corrective-actions/${ca.id}/steps/D1`, { answer: ANSWERS.D1, submit: true, version: 99 });
    expect(stale.status).toBe(409);
    expect(stale.body.error).toBe('stale');
    expect((await eng.put(`/api/corrective-actions/${ca.id}/steps/D1`, { answer: ANSWERS.D1, submit: true, version: 1 })).status).toBe(403);
    const returnNoComment = await eng.post(`/api/corrective-actions/${ca.id}/steps/D1/review`, { decision: 'return', version: 1 });
    expect(returnNoComment.status).toBe(400);
    const notSubmitted = await review(ca.id, 'D1', 'accept');
    expect(notSubmitted.status).toBe(409);
  });

  it('walks every state and refuses every illegal manual move', async () => {
    const ca = await issue();
    const id = ca.id;
    const seen: ScarStatus[] = [];
    async function refusesIllegal() {
      const cur = await eng.get(`/api/corrective-actions/${id}`);
      const from = cur.body.status as ScarStatus;
      seen.push(from);
      for (const to of SCAR_STATUSES) {
        if (SCAR_MANUAL_TRANSITIONS[from].includes(to)) continue;
        for (const h of [eng, sup]) {
          const r = await h.post(`/api/corrective-actions/${id}/transition`, { to, version: cur.body.version });
          expect(r.status, `${from} → ${to}`).toBe(409);
          expect(r.body.error).toBe('illegal_transition');
        }
      }
      const after = await eng.get(`/api/corrective-actions/${id}`);
      expect(after.body).toMatchObject({ status: from, version: cur.body.version });
      return cur.body;
    }
    await refusesIllegal(); // issued
    expect((await move(eng, id, 'acknowledged')).status).toBe(403); // the supplier acknowledges
    expect((await move(sup, id, 'acknowledged')).status).toBe(200);
    await refusesIllegal(); // acknowledged
    for (const s of ['D1', 'D2', 'D3']) expect((await answer(sup, id, s)).status).toBe(200);
    await refusesIllegal(); // containment-in
    expect((await answer(sup, id, 'D4')).status).toBe(200);
    await refusesIllegal(); // root-cause-in
    for (const s of ['D5', 'D6', 'D7']) expect((await answer(sup, id, s)).status).toBe(200);
    await refusesIllegal(); // actions-in
    const ret = await review(id, 'D4', 'return', 'Show why the pilot wore: hours since last service?');
    expect(ret.body.status).toBe('returned');
    expect(ret.body.steps.find((s: { step: string }) => s.step === 'D4')).toMatchObject({ status: 'returned', reviewComment: 'Show why the pilot wore: hours since last service?' });
    await refusesIllegal(); // returned
    expect((await answer(sup, id, 'D4', true, { ...ANSWERS.D4, rootCause: 'Worn pilot: 1.2 M hits since service, limit 0.8 M' })).body.status).toBe('actions-in');
    for (const s of ['D1', 'D2', 'D3', 'D4', 'D5', 'D6', 'D7']) expect((await review(id, s, 'accept')).status).toBe(200);
    const acc = await refusesIllegal(); // accepted
    expect(acc.steps.find((s: { step: string }) => s.step === 'D8').status).toBe('open');
    expect((await move(sup, id, 'verifying')).status).toBe(403);
    expect((await move(eng, id, 'verifying')).body.status).toBe('verifying');
    await refusesIllegal(); // verifying (closed and returned are the legal moves)
    const early = await move(eng, id, 'closed');
    expect(early.status).toBe(409);
    expect(early.body.message).toMatch(/0 of 3 lots have passed/);
    for (let i = 0; i < 3; i++) await acceptLot(eng, await receiveLot(eng, { supplierId: ngl, partId: ca.part.partId }), ca.part.gaugeId);
    const v = await eng.get(`/api/corrective-actions/${id}`);
    expect(v.body.verification).toMatchObject({ required: 3, passed: 3, recurrence: null });
    const noD8 = await move(eng, id, 'closed');
    expect(noD8.body.message).toMatch(/D8/);
    expect((await answer(sup, id, 'D8')).status).toBe(200);
    expect((await review(id, 'D8', 'accept')).status).toBe(200);
    const closed = await move(eng, id, 'closed', 'Three clean lots');
    expect(closed.status).toBe(200);
    expect(closed.body.status).toBe('closed');
    await refusesIllegal(); // closed
    expect((await answer(sup, id, 'D8')).status).toBe(409);
    expect(seen).toEqual(['issued', 'acknowledged', 'containment-in', 'root-cause-in', 'actions-in', 'returned', 'accepted', 'verifying', 'closed']);
    const actions = closed.body.history.map((h: { action: string }) => h.action).filter((a: string) => !a.includes('step_') && !a.includes('verification_lot'));
    expect(actions).toEqual([
      'corrective_action.issued',
      'corrective_action.acknowledged',
      'corrective_action.containment-in',
      'corrective_action.root-cause-in',
      'corrective_action.actions-in',
      'corrective_action.returned',
      'corrective_action.actions-in',
      'corrective_action.accepted',
      'corrective_action.verifying',
      'corrective_action.closed',
    ]);
  });

  it('submitting D3 first acknowledges the request on the way (each hop recorded)', async () => {
    const ca = await issue();
    const r = await answer(sup, ca.id, 'D3');
    expect(r.body.status).toBe('containment-in');
    expect(r.body.acknowledgedAt).toBeTruthy();
    expect(r.body.steps.find((s: { step: string }) => s.step === 'D4').status).toBe('open');
    expect(r.body.history).toBeNull(); // the supplier's view carries no internal history
    const internal = await eng.get(`/api/corrective-actions/${ca.id}`);
    const hops = internal.body.history.map((h: { action: string }) => h.action).filter((a: string) => !a.includes('step_'));
    expect(hops).toEqual(['corrective_action.issued', 'corrective_action.acknowledged', 'corrective_action.containment-in']);
  });

  it('reopens when the same defect returns during verification, and will not close over it', async () => {
    const ca = await issue();
    for (const s of ['D1', 'D2', 'D3', 'D4', 'D5', 'D6', 'D7']) await answer(sup, ca.id, s);
    for (const s of ['D1', 'D2', 'D3', 'D4', 'D5', 'D6', 'D7']) await review(ca.id, s, 'accept');
    await move(eng, ca.id, 'verifying');
    await acceptLot(eng, await receiveLot(eng, { supplierId: ngl, partId: ca.part.partId }), ca.part.gaugeId);
    // A different defect on this supplier × part is not a recurrence; the same one is.
    await ncrForNgl({ defectCodes: ['RUST'] }, ca.part);
    expect((await eng.get(`/api/corrective-actions/${ca.id}`)).body.verification.recurrence).toBeNull();
    const again = await ncrForNgl({ defectCodes: ['BORE', 'DMG'] }, ca.part);
    const flagged = await eng.get(`/api/corrective-actions/${ca.id}`);
    expect(flagged.body.verification.recurrence).toMatchObject({ ncrId: again.id, ncrNumber: again.number });
    const close = await move(eng, ca.id, 'closed');
    expect(close.status).toBe(409);
    expect(close.body.message).toContain(again.number);
    expect((await move(eng, ca.id, 'returned')).status).toBe(400);
    const reopened = await move(eng, ca.id, 'returned', `Bore oversize again in ${again.number}`);
    expect(reopened.body.status).toBe('returned');
    expect(reopened.body.steps.map((s: { step: string; status: string }) => `${s.step}:${s.status}`)).toEqual(['D1:accepted', 'D2:accepted', 'D3:returned', 'D4:returned', 'D5:returned', 'D6:returned', 'D7:returned', 'D8:locked']);
    expect(reopened.body.mail.map((m: { subject: string }) => m.subject)).toContain(`${ca.number} reopened: the defect returned`);
    for (const s of ['D3', 'D4', 'D5', 'D6', 'D7']) await answer(sup, ca.id, s);
    expect((await eng.get(`/api/corrective-actions/${ca.id}`)).body.status).toBe('actions-in');
  });

  it('takes evidence as PDF or image only (415 otherwise), on open steps only', async () => {
    const ca = await issue();
    const pdf = new FormData();
    pdf.append('file', new Blob(['%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF'], { type: 'application/pdf' }), 'sort-report.pdf');
    const ok = await sup.post(`/api/corrective-actions/${ca.id}/steps/D3/evidence`, pdf);
    expect(ok.status).toBe(201);
    expect(ok.body).toMatchObject({ step: 'D3', name: 'sort-report.pdf', contentType: 'application/pdf' });
    const exe = new FormData();
    exe.append('file', new Blob(['MZ this is not a report'], { type: 'application/pdf' }), 'report.pdf');
    const bad = await sup.post(`/api/corrective-actions/${ca.id}/steps/D3/evidence`, exe);
    expect(bad.status).toBe(415);
    const locked = new FormData();
    locked.append('file', new Blob(['%PDF-1.4\n%%EOF'], { type: 'application/pdf' }), 'r.pdf');
    expect((await sup.post(`/api/corrective-actions/${ca.id}/steps/D4/evidence`, locked)).status).toBe(409);
    const file = await fetch(`${t.url}/api/corrective-actions/${ca.id}/evidence/${ok.body.id}`, { headers: { cookie: eng.cookieHeader() } });
    expect(file.headers.get('content-type')).toBe('application/pdf');
    expect((await file.text()).startsWith('%PDF-')).toBe(true);
    const theirs = await fetch(`${t.url}/api/corrective-actions/${ca.id}/evidence/${ok.body.id}`, { headers: { cookie: other.cookieHeader() } });
    expect(theirs.status).toBe(404);
  });
});

describe('supplier isolation', () => {
  it('another supplier’s SCAR answers 404 on every route, never its contents', async () => {
    const ca = await issue({ title: 'Northgate private matter' });
    const get = await other.get(`/api/corrective-actions/${ca.id}`);
    expect(get.status).toBe(404);
    expect(JSON.stringify(get.body)).not.toContain('Northgate');
    expect((await other.put(`/api/corrective-actions/${ca.id}/steps/D3`, { answer: ANSWERS.D3, submit: true, version: 1 })).status).toBe(404);
    expect((await other.post(`/api/corrective-actions/${ca.id}/transition`, { to: 'acknowledged', version: ca.version })).status).toBe(404);
    const list = await other.get('/api/corrective-actions?pageSize=200');
    expect(list.body.items.map((x: { id: string }) => x.id)).not.toContain(ca.id);
    const mine = await sup.get(`/api/corrective-actions/${ca.id}`);
    expect(mine.status).toBe(200);
    expect(mine.body).toMatchObject({ mail: null, history: null, recipients: [] });
    const steps = await sup.get('/api/corrective-actions/open-steps');
    expect(steps.body.items.map((x: { id: string }) => x.id)).toContain(ca.id);
    expect((await other.get('/api/corrective-actions/open-steps')).body.items.map((x: { id: string }) => x.id)).not.toContain(ca.id);
  });
});

describe('due-date reminders', () => {
  it('reminds one working day before, then says overdue, each once, grouping steps due together', async () => {
    const ca = await issue();
    const containment = ca.steps[0].dueOn as string;
    const scanner = t.app.get(DueDatesService);
    const subjects = async () => (await t.db.select().from(outboxMessage).where(eq(outboxMessage.entityId, ca.id))).map((m) => m.subject).sort();
    const first = await scanner.scan(previousWorkingDay(containment));
    expect(first.reminders).toBeGreaterThanOrEqual(1);
    expect(await subjects()).toContain(`${ca.number} D1, D2, D3 due ${containment}`);
    await scanner.scan(previousWorkingDay(containment));
    await scanner.scan(containment);
    expect((await subjects()).filter((s) => s.includes(' due '))).toHaveLength(1);
    // D3 answered in time: the overdue notice names only what is still owed.
    await answer(sup, ca.id, 'D3');
    const dayAfter = addCalendarDays(containment, 1);
    await scanner.scan(dayAfter);
    await scanner.scan(dayAfter);
    const overdue = (await subjects()).filter((s) => s.includes('overdue'));
    expect(overdue).toEqual([`${ca.number} D1, D2 overdue since ${containment}`]);
    const steps = await t.db.select().from(correctiveActionStep).where(and(eq(correctiveActionStep.correctiveActionId, ca.id), inArray(correctiveActionStep.step, ['D1', 'D3'])));
    expect(steps.map((s) => [s.step, s.reminderSentFor, s.overdueSentFor])).toEqual(expect.arrayContaining([['D1', containment, containment], ['D3', containment, null]]));
    const view = await sup.get(`/api/corrective-actions/${ca.id}`);
    expect(view.body.steps[0].overdue).toBe(false); // today is before the due date
  });
});

describe('outbox delivery', () => {
  it('with SMTP down keeps mails pending with attempts counted; back up, delivers each exactly once', async () => {
    const ca = await issue({ title: 'Outbox run' });
    await answer(sup, ca.id, 'D3');
    await review(ca.id, 'D3', 'return', 'Count the cores in transit too');
    const ids = (await t.db.select().from(outboxMessage).where(eq(outboxMessage.entityId, ca.id))).map((m) => m.id);
    expect(ids).toHaveLength(2);

    const r1 = await down.deliverPending();
    expect(r1.sent).toBe(0);
    expect(r1.retried).toBeGreaterThanOrEqual(2);
    await down.deliverPending({ now: new Date(Date.now() + 3600_000) });
    const rows = await t.db.select().from(outboxMessage).where(inArray(outboxMessage.id, ids));
    for (const m of rows) {
      expect(m).toMatchObject({ status: 'pending', attempts: 2 });
      expect(m.lastError).toBeTruthy();
      expect(m.nextAttemptAt.getTime()).toBeGreaterThan(Date.now());
    }
    // The engineer sees it on the request and in the outbox.
    const view = await eng.get(`/api/corrective-actions/${ca.id}`);
    expect(view.body.mail.map((m: { status: string; attempts: number }) => [m.status, m.attempts])).toEqual([['pending', 2], ['pending', 2]]);
    expect((await eng.get(`/api/mail/outbox?status=pending&entityId=${ca.id}`)).body.total).toBe(2);
    expect((await captured()).filter((m) => m.text.includes(ca.id))).toEqual([]);

    // Back up: two workers on the real port at once, then again; SKIP LOCKED keeps them apart.
    const second = new OutboxWorker(t.db, { ...t.config, SMTP_PORT });
    await Promise.all([deliverAll(up), deliverAll(second)]);
    await deliverAll(up);
    const after = await t.db.select().from(outboxMessage).where(inArray(outboxMessage.id, ids));
    expect(after.map((m) => m.status)).toEqual(['sent', 'sent']);
    // Numbers repeat across runs (each run has a fresh database); the id in the link does not.
    const mine = (await captured()).filter((m) => m.text.includes(ca.id));
    expect(mine.map((m) => m.subject).sort()).toEqual([`${ca.number} D3 returned: please revise`, `${ca.number} corrective action requested: Outbox run`].sort());
    expect(mine[0].to).toContain(DEMO.supplierNorthgate);
    const returned = mine.find((m) => m.subject.includes('returned'))!;
    expect(returned.text).toContain('Count the cores in transit too');
    expect(returned.text).toContain(`http://desk.harrowgate.test:3000/supplier-desk/corrective-actions/${ca.id}`);
    // The dev mailbox lists them too.
    const box = await eng.get('/api/dev/mailbox');
    expect(box.status).toBe(200);
    expect(box.body.items.some((m: { subject: string }) => m.subject.includes(ca.number))).toBe(true);
  });

  it('marks a mail failed after the configured attempts; the engineer queues it again', async () => {
    const ca = await issue({ title: 'Failing run' });
    const [m] = await t.db.select().from(outboxMessage).where(eq(outboxMessage.entityId, ca.id));
    for (let i = 0; i < 4; i++) await down.deliverPending({ now: new Date(Date.now() + (i + 1) * 86_400_000) });
    const [failed] = await t.db.select().from(outboxMessage).where(eq(outboxMessage.id, m.id));
    expect(failed).toMatchObject({ status: 'failed', attempts: 4 });
    expect((await deliverAll(up))).toBe(0);
    const retry = await eng.post(`/api/mail/outbox/${m.id}/retry`);
    expect(retry.status).toBe(200);
    expect(retry.body).toMatchObject({ status: 'pending', attempts: 0 });
    expect((await eng.post(`/api/mail/outbox/${m.id}/retry`)).status).toBe(409);
    await deliverAll(up);
    expect((await captured()).filter((x) => x.text.includes(ca.id))).toHaveLength(1);
  });
});

describe('die service notices', () => {
  it('puts a notice on the supplier’s desk with its mail, once per die in the quiet period', async () => {
    const notices = t.app.get(SupplierNoticesService);
    const first = await notices.dieServiceDue({ supplierId: ngl, partId: part.partId, characteristicCode: 'BURR', lotsRemaining: 2.6, detail: 'Burr rising 1.4 µm per lot <fast>' });
    expect(first.created).toBe(true);
    const again = await notices.dieServiceDue({ supplierId: ngl, partId: part.partId, characteristicCode: 'BURR', lotsRemaining: 2.1 });
    expect(again).toMatchObject({ created: false, noticeId: first.noticeId, mailId: null });
    const [mail] = await t.db.select().from(outboxMessage).where(eq(outboxMessage.id, first.mailId!));
    expect(mail.kind).toBe('die-service-due');
    expect(mail.to).toContain(DEMO.supplierNorthgate);
    expect(mail.text).toContain(`http://desk.harrowgate.test:3000/supplier-desk?notice=${first.noticeId}`);
    expect(mail.html).toContain('&lt;fast&gt;');
    const desk = await sup.get('/api/supplier-notices');
    expect(desk.body.items[0]).toMatchObject({ id: first.noticeId, kind: 'die-service-due', characteristicCode: 'BURR', lotsRemaining: 2.6 });
    expect(desk.body.items[0].body).toMatch(/about 2 lots/);
    expect((await other.get('/api/supplier-notices')).body.items).toEqual([]);
  });
});
