import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { and, eq } from 'drizzle-orm';
import sharp from 'sharp';
import { startTestApp, type TestApp } from '../support/test-app';
import { DEMO, signedIn, type Http } from '../support/http';
import { makeSupplier } from '../support/factories';
import { COSIGN_MEANING, SIGN, disposition, ncrBody, partWithBorePlan, raise, receiveLot, rejectLot, rejectedLot, scrap, sort, startReview, supplierIdOf } from '../support/ncr-fixtures';
import { appUser, disposition as dispositionTable, documentCounter, eSignature, lot, ncr } from '../../src-api/db/schema';
import { canonicalJson } from '../../src-api/audit/audit-hash';
import { NCR_MANUAL_TRANSITIONS, NCR_STATUSES, type NcrStatus } from '../../shared/compute/workflow';

let t: TestApp;
let eng: Http;
let insp: Http;
let admin: Http;
let eng2Email: string;

beforeAll(async () => {
  t = await startTestApp();
  eng = await signedIn(t.url, DEMO.engineer);
  insp = await signedIn(t.url, DEMO.inspector);
  admin = await signedIn(t.url, DEMO.admin);
  eng2Email = 'second.engineer@harrowgate.test';
  const made = await admin.post('/api/users', { email: eng2Email, name: 'Rosa Quint', role: 'engineer', password: 'second-engineer-pass' });
  expect(made.status).toBe(201);
});
afterAll(async () => {
  await t?.close();
});

const YEAR = new Date().getUTCFullYear();

describe('raising an NCR from a rejected lot', () => {
  it('numbers it NCR-<year>-<seq>, keeps the lot on hold and links the failed reading and its core', async () => {
    const { lot: l } = await rejectedLot(eng);
    expect(l.status).toBe('on-hold');
    const n = await raise(insp, { lotId: l.id });
    expect(n.number).toMatch(new RegExp(`^NCR-${YEAR}-\\d{4}$`));
    expect(n).toMatchObject({ status: 'open', source: 'lot', lotId: l.id, supplierId: l.supplierId, partId: l.partId, suspectQuantity: 100, defectCodes: ['BORE'] });
    expect(n.readings).toHaveLength(1);
    expect(n.readings[0]).toMatchObject({ characteristicCode: 'BORE', value: 150.21, conforming: false, serial: 1 });
    // With the plan's limits it was judged against, so the review board sees why it failed.
    expect(n.readings[0]).toMatchObject({ name: 'Bore diameter', unit: 'mm', lsl: 149.95, usl: 150.05, eachReadingJudged: true });
    expect(n.cores.map((c: { serial: number }) => c.serial)).toEqual([1]);
    const [row] = await t.db.select().from(lot).where(eq(lot.id, l.id));
    expect(row.status).toBe('on-hold');
    expect(n.history.map((h: { action: string }) => h.action)).toEqual(['ncr.raised']);
  });

  it('holds a released lot when an NCR is raised on one of its cores', async () => {
    const { partId, gaugeId } = await partWithBorePlan(eng);
    const s = await makeSupplier(eng);
    const received = await receiveLot(eng, { supplierId: s.id, partId });
    await eng.put(`/api/lots/${received.id}/readings`, { readings: received.samples.map((x: { id: string }) => ({ sampleId: x.id, characteristicCode: 'BORE', values: [150.01], gaugeId })) });
    const cur = await eng.get(`/api/lots/${received.id}`);
    const acc = await eng.post(`/api/lots/${received.id}/decision`, { decision: 'accept', comment: 'Good', version: cur.body.version });
    expect(acc.body.status).toBe('released');
    const n = await raise(eng, { lotId: received.id, sampleIds: [received.samples[2].id], suspectQuantity: 5, title: 'Lifted lamination found at winding' });
    expect(n.source).toBe('core');
    expect(n.cores.map((c: { serial: number }) => c.serial)).toEqual([3]);
    const after = await eng.get(`/api/lots/${received.id}`);
    expect(after.body.status).toBe('on-hold');
    expect(after.body.version).toBe(acc.body.version + 1);
  });

  it('lists the rejected lot in the review board in-tray until its NCR is raised', async () => {
    const { lot: l } = await rejectedLot(eng);
    const before = await eng.get('/api/ncrs/held-lots');
    const entry = before.body.items.find((x: { id: string }) => x.id === l.id);
    expect(entry.failures).toEqual([expect.objectContaining({ characteristicCode: 'BORE', value: 150.21, serial: 1, usl: 150.05 })]);
    expect(entry.photoIds).toEqual([]);
    await raise(eng, { lotId: l.id });
    const after = await eng.get('/api/ncrs/held-lots');
    expect(after.body.items.map((x: { id: string }) => x.id)).not.toContain(l.id);
  });

  it('refuses a lot still being inspected, a second NCR on the same lot, and too many suspect cores', async () => {
    const { partId, gaugeId } = await partWithBorePlan(eng);
    const s = await makeSupplier(eng);
    const open = await receiveLot(eng, { supplierId: s.id, partId, quantity: 40 });
    const r1 = await eng.post('/api/ncrs', ncrBody({ lotId: open.id, suspectQuantity: 10 }));
    expect(r1.status).toBe(409);
    expect(r1.body.message).toMatch(/still being inspected/);
    const held = await rejectLot(eng, open, gaugeId);
    const tooMany = await eng.post('/api/ncrs', ncrBody({ lotId: held.id, suspectQuantity: 41 }));
    expect(tooMany.status).toBe(400);
    expect(tooMany.body.fields.suspectQuantity).toMatch(/40 cores/);
    const first = await raise(eng, { lotId: held.id, suspectQuantity: 40 });
    const second = await eng.post('/api/ncrs', ncrBody({ lotId: held.id, suspectQuantity: 40 }));
    expect(second.status).toBe(409);
    expect(second.body.message).toContain(first.number);
  });

  it('raises by hand, refuses a drift signal that does not exist, and checks defect codes against the list', async () => {
    // Taking a real signal into an NCR is tested with the charts that raise them (spc.test.ts).
    const s = await makeSupplier(eng);
    const signalId = '7d1c4a52-3f7e-4b8e-9a61-2f0c1d9e8b77';
    const noSignal = await eng.post('/api/ncrs', ncrBody({ signalId, supplierId: s.id, characteristicCode: 'burr', suspectQuantity: 12, defectCodes: ['BURR'] }));
    expect(noSignal.status).toBe(400);
    expect(noSignal.body.fields.signalId).toBe('No such drift signal');
    const byHand = await raise(eng, { suspectQuantity: 3 });
    expect(byHand.source).toBe('manual');
    const unknown = await eng.post('/api/ncrs', ncrBody({ defectCodes: ['NOPE'] }));
    expect(unknown.status).toBe(400);
    expect(unknown.body.fields.defectCodes).toMatch(/Unknown defect code: NOPE/);
    const orphan = await eng.post('/api/ncrs', ncrBody({ sampleIds: [signalId] }));
    expect(orphan.status).toBe(400);
    expect(orphan.body.fields.lotId).toBeTruthy();
  });

  it('refuses raising to auditors, admins and suppliers', async () => {
    for (const email of [DEMO.auditor, DEMO.admin, DEMO.supplierNorthgate]) {
      const h = await signedIn(t.url, email);
      expect((await h.post('/api/ncrs', ncrBody())).status).toBe(403);
    }
  });
});

describe('NCR numbering', () => {
  it('gives 20 concurrent creations 20 distinct, consecutive numbers with no gap', async () => {
    const results = await Promise.all(Array.from({ length: 20 }, (_, i) => eng.post('/api/ncrs', ncrBody({ title: `Concurrent ${i}`, suspectQuantity: 1 }))));
    expect(results.map((r) => r.status)).toEqual(Array(20).fill(201));
    const seqs = results.map((r) => Number(r.body.number.split('-')[2])).sort((a, b) => a - b);
    expect(new Set(seqs).size).toBe(20);
    expect(seqs[19] - seqs[0]).toBe(19);
    const all = await t.db.select({ seq: ncr.seq }).from(ncr).where(eq(ncr.year, YEAR));
    const every = all.map((r) => r.seq).sort((a, b) => a - b);
    // Gapless over the whole year: 1, 2, …, n.
    expect(every).toEqual(Array.from({ length: every.length }, (_, i) => i + 1));
    const [counter] = await t.db.select().from(documentCounter).where(and(eq(documentCounter.kind, 'ncr'), eq(documentCounter.year, YEAR)));
    expect(counter.last).toBe(every.length);
  });

  it('uses no number for a creation that is refused', async () => {
    const before = (await t.db.select().from(documentCounter).where(and(eq(documentCounter.kind, 'ncr'), eq(documentCounter.year, YEAR))))[0]?.last ?? 0;
    expect((await eng.post('/api/ncrs', ncrBody({ defectCodes: ['NOPE'] }))).status).toBe(400);
    const next = await raise(eng, { suspectQuantity: 1 });
    expect(next.number).toBe(`NCR-${YEAR}-${String(before + 1).padStart(4, '0')}`);
  });
});

describe('NCR state machine', () => {
  /** Every (from, to) pair the table does not allow is refused with 409, and nothing changes. */
  async function refusesAllIllegalFrom(n: { id: string; version: number; status: NcrStatus }) {
    for (const to of NCR_STATUSES) {
      if (NCR_MANUAL_TRANSITIONS[n.status].includes(to)) continue;
      const r = await eng.post(`/api/ncrs/${n.id}/transition`, { to, version: n.version });
      expect(r.status, `${n.status} → ${to}`).toBe(409);
      expect(r.body.error).toBe('illegal_transition');
    }
    const [row] = await t.db.select().from(ncr).where(eq(ncr.id, n.id));
    expect(row).toMatchObject({ status: n.status, version: n.version });
  }

  it('walks open → in review → dispositioned → closed and refuses every other move', async () => {
    const { lot: l } = await rejectedLot(eng);
    const n0 = await raise(eng, { lotId: l.id });
    await refusesAllIllegalFrom(n0);
    const n1 = await startReview(eng, n0);
    expect(n1.status).toBe('in-review');
    await refusesAllIllegalFrom(n1);
    const viaTransition = await eng.post(`/api/ncrs/${n1.id}/transition`, { to: 'dispositioned', version: n1.version });
    expect(viaTransition.body.message).toMatch(/signed dispositions/);
    const d = await disposition(eng, n1, [scrap(100)]);
    expect(d.status).toBe(201);
    expect(d.body.status).toBe('dispositioned');
    await refusesAllIllegalFrom(d.body);
    const closed = await eng.post(`/api/ncrs/${n1.id}/transition`, { to: 'closed', version: d.body.version, note: 'Scrapped and recorded' });
    expect(closed.status).toBe(200);
    expect(closed.body).toMatchObject({ status: 'closed' });
    expect(closed.body.closedAt).toBeTruthy();
    await refusesAllIllegalFrom(closed.body);
    expect(closed.body.history.map((h: { action: string }) => h.action)).toEqual(['ncr.raised', 'ncr.review_started', 'ncr.dispositioned', 'ncr.closed']);
  });

  it('refuses a stale version with 409 stale', async () => {
    const n = await raise(eng, { suspectQuantity: 2 });
    await startReview(eng, n);
    const r = await eng.post(`/api/ncrs/${n.id}/transition`, { to: 'in-review', version: n.version });
    expect(r.status).toBe(409);
    expect(r.body.error).toBe('stale');
  });

  it('refuses disposition before the review starts', async () => {
    const n = await raise(eng, { suspectQuantity: 2 });
    const r = await disposition(eng, n, [scrap(2)]);
    expect(r.status).toBe(409);
    expect(r.body.message).toMatch(/start the review/);
  });
});

describe('review board dispositions', () => {
  it('splits by quantity, e-signs with a hash of exactly what was signed, and updates the lot', async () => {
    const { lot: l } = await rejectedLot(eng);
    const n = await startReview(eng, await raise(eng, { lotId: l.id }));
    const r = await disposition(eng, n, [scrap(10), sort(90)]);
    expect(r.status).toBe(201);
    expect(r.body.dispositions.map((d: { kind: string; quantity: number; cost: number }) => [d.kind, d.quantity, d.cost])).toEqual([
      ['scrap', 10, 125],
      ['sort', 90, 252], // 6 h × 42
    ]);
    expect(r.body.totalCost).toBe(377);
    expect(r.body.lot.status).toBe('released');
    expect(r.body.signatures).toHaveLength(1);
    const [sig] = await t.db.select().from(eSignature).where(eq(eSignature.entityId, n.id));
    const [me] = await t.db.select().from(appUser).where(eq(appUser.email, DEMO.engineer));
    expect(sig).toMatchObject({ signerId: me.id, signerEmail: DEMO.engineer, meaning: SIGN.meaning, purpose: 'disposition' });
    expect(Math.abs(sig.signedAt.getTime() - Date.now())).toBeLessThan(60_000);
    // The stored hash is SHA-256 of the canonical JSON of the stored content, which names the lines.
    expect(sig.contentHash).toBe(createHash('sha256').update(canonicalJson(sig.content)).digest('hex'));
    expect(sig.content).toMatchObject({ ncr: { id: n.id, number: n.number, version: n.version }, signer: { email: DEMO.engineer }, meaning: SIGN.meaning, lines: [{ kind: 'scrap', quantity: 10 }, { kind: 'sort', quantity: 90 }] });
    const [lotRow] = await t.db.select().from(lot).where(eq(lot.id, l.id));
    expect(lotRow.status).toBe('released');
  });

  it.each([
    [[{ kind: 'scrap', quantity: 100 }], 'scrapped'],
    [[{ kind: 'return-to-supplier', quantity: 60 }, { kind: 'scrap', quantity: 40 }], 'returned'],
  ])('a lot whose lines are %j becomes %s', async (lines, status) => {
    const { lot: l } = await rejectedLot(eng);
    const n = await startReview(eng, await raise(eng, { lotId: l.id }));
    const r = await disposition(eng, n, lines.map((x) => ({ ...x, rationale: 'Board decision', freight: 80 })));
    expect(r.status).toBe(201);
    expect(r.body.lot.status).toBe(status);
  });

  it('refuses quantities that do not add up, and use as is without a concession, with clear messages', async () => {
    const n = await startReview(eng, await raise(eng, { suspectQuantity: 100 }));
    const short = await disposition(eng, n, [scrap(10), sort(80)]);
    expect(short.status).toBe(400);
    expect(short.body.fields.lines).toBe('90 of 100 cores assigned: 10 still need a disposition');
    const over = await disposition(eng, n, [scrap(20), sort(90)]);
    expect(over.body.fields.lines).toBe('110 cores assigned but only 100 are suspect: 10 too many');
    const noConcession = await disposition(eng, n, [{ kind: 'use-as-is', quantity: 100, rationale: 'Within functional margin' }]);
    expect(noConcession.status).toBe(400);
    expect(noConcession.body.fields['lines.0.concessionRef']).toMatch(/concession reference/);
    const noSecond = await disposition(eng, n, [{ kind: 'use-as-is', quantity: 100, rationale: 'Within functional margin', concessionRef: 'CON-0042' }]);
    expect(noSecond.status).toBe(400);
    expect(noSecond.body.fields.countersignature).toMatch(/second engineer/);
    const [row] = await t.db.select().from(ncr).where(eq(ncr.id, n.id));
    expect(row).toMatchObject({ status: 'in-review', version: n.version });
  });

  it('takes a concession with a second engineer’s signature, never the same person or a non-engineer', async () => {
    const n = await startReview(eng, await raise(eng, { suspectQuantity: 100 }));
    const line = { kind: 'use-as-is', quantity: 100, rationale: 'Bore within functional margin per design', concessionRef: 'CON-0042' };
    const self = await disposition(eng, n, [line], { countersignature: { email: DEMO.engineer, password: SIGN.password, meaning: COSIGN_MEANING } });
    expect(self.status).toBe(400);
    const byAdmin = await disposition(eng, n, [line], { countersignature: { email: DEMO.admin, password: SIGN.password, meaning: COSIGN_MEANING } });
    expect(byAdmin.status).toBe(400);
    expect(byAdmin.body.fields['countersignature.email']).toMatch(/quality engineer/);
    const wrong = await disposition(eng, n, [line], { countersignature: { email: eng2Email, password: 'not-their-password', meaning: COSIGN_MEANING } });
    expect(wrong.status).toBe(401);
    const ok = await disposition(eng, n, [line], { countersignature: { email: eng2Email, password: 'second-engineer-pass', meaning: COSIGN_MEANING } });
    expect(ok.status).toBe(201);
    expect(ok.body.signatures.map((s: { purpose: string; signerEmail: string }) => [s.purpose, s.signerEmail])).toEqual([
      ['disposition', DEMO.engineer],
      ['concession', eng2Email],
    ]);
  });

  it('a wrong password answers 401 and saves nothing', async () => {
    const { lot: l } = await rejectedLot(eng);
    const n = await startReview(eng, await raise(eng, { lotId: l.id }));
    const r = await eng.post(`/api/ncrs/${n.id}/dispositions`, { version: n.version, lines: [scrap(100)], signature: { ...SIGN, password: 'wrong-password' } });
    expect(r.status).toBe(401);
    expect(r.body.message).toMatch(/Nothing was signed/);
    expect(await t.db.select().from(eSignature).where(eq(eSignature.entityId, n.id))).toEqual([]);
    expect(await t.db.select().from(dispositionTable).where(eq(dispositionTable.ncrId, n.id))).toEqual([]);
    const [row] = await t.db.select().from(ncr).where(eq(ncr.id, n.id));
    expect(row).toMatchObject({ status: 'in-review', version: n.version });
    const [lotRow] = await t.db.select().from(lot).where(eq(lot.id, l.id));
    expect(lotRow.status).toBe('on-hold');
    // The engineer is still signed in (a failed signature is not a sign-out).
    expect((await eng.get('/api/auth/me')).status).toBe(200);
  });

  it('two concurrent dispositions on the same version: one wins, the other gets 409', async () => {
    const { lot: l } = await rejectedLot(eng);
    const n = await startReview(eng, await raise(eng, { lotId: l.id }));
    const other = await signedIn(t.url, eng2Email, 'second-engineer-pass');
    const [a, b] = await Promise.all([disposition(eng, n, [scrap(100)]), other.post(`/api/ncrs/${n.id}/dispositions`, { version: n.version, lines: [sort(100)], signature: { ...SIGN, password: 'second-engineer-pass' } })]);
    expect([a.status, b.status].sort()).toEqual([201, 409]);
    const loser = a.status === 409 ? a : b;
    expect(loser.body.error).toBe('stale');
    expect(await t.db.select().from(eSignature).where(eq(eSignature.entityId, n.id))).toHaveLength(1);
    const lines = await t.db.select().from(dispositionTable).where(eq(dispositionTable.ncrId, n.id));
    expect(lines).toHaveLength(1);
  });

  it('keeps signed records append-only in the database', async () => {
    const n = await startReview(eng, await raise(eng, { suspectQuantity: 4 }));
    expect((await disposition(eng, n, [scrap(4)])).status).toBe(201);
    await expect(t.db.update(eSignature).set({ meaning: 'changed' }).where(eq(eSignature.entityId, n.id))).rejects.toThrow();
    await expect(t.db.delete(dispositionTable).where(eq(dispositionTable.ncrId, n.id))).rejects.toThrow();
  });

  it('refuses dispositions to an administrator (separation of duties) and to an inspector', async () => {
    const n = await startReview(eng, await raise(eng, { suspectQuantity: 3 }));
    for (const h of [admin, insp]) {
      const r = await disposition(h, n, [scrap(3)]);
      expect(r.status).toBe(403);
    }
  });
});

describe('hold tag', () => {
  it('prints number, part, lot, quantity, date, HOLD — DO NOT USE and a QR code of the NCR address, escaping stored text', async () => {
    const { lot: l } = await rejectedLot(eng);
    const n = await raise(eng, { lotId: l.id, title: '<script>alert(1)</script> bore', suspectQuantity: 80 });
    const r = await insp.request('GET', `/api/ncrs/${n.id}/hold-tag`);
    expect(r.status).toBe(200);
    expect(r.headers.get('content-type')).toMatch(/text\/html/);
    const html = r.body as string;
    expect(html).toContain('HOLD — DO NOT USE');
    expect(html).toContain(n.number);
    expect(html).toContain(n.partNumber);
    expect(html).toContain(`#${l.ref}`);
    expect(html).toContain('80 cores');
    expect(html).toContain(n.raisedAt.slice(0, 10));
    expect(html).toContain('size: 105mm 148mm'); // A6 (ISO 216), named by its size: Chromium knows no "A6" keyword
    expect(html).toMatch(/<svg[^>]*viewBox/);
    expect(html).toContain(`${t.config.PUBLIC_URL}/nonconformances/${n.id}`);
    expect(html).not.toContain('<script>alert(1)</script>');
    expect(html).toContain('&lt;script&gt;');
    const qr = await insp.request('GET', `/api/ncrs/${n.id}/qr.svg`);
    expect(qr.headers.get('content-type')).toMatch(/image\/svg\+xml/);
    const sup = await signedIn(t.url, DEMO.supplierNorthgate);
    expect((await sup.request('GET', `/api/ncrs/${n.id}/hold-tag`)).status).toBe(403);
  });
});

describe('photos', () => {
  it('uploads through the image checks, links lot photos, and refuses other types with 415', async () => {
    const { lot: l } = await rejectedLot(eng);
    const png = await sharp({ create: { width: 64, height: 48, channels: 3, background: '#b3261e' } }).png().toBuffer();
    const lp = new FormData();
    lp.append('file', new Blob([new Uint8Array(png)], { type: 'image/png' }), 'burr.png');
    const lotPhoto = await insp.post(`/api/lots/${l.id}/photos`, lp);
    expect(lotPhoto.status).toBe(201);
    const n = await raise(eng, { lotId: l.id, photoIds: [lotPhoto.body.id] });
    expect(n.photos).toEqual([expect.objectContaining({ fromLot: true, width: 64, height: 48 })]);
    const f = new FormData();
    f.append('file', new Blob([new Uint8Array(png)], { type: 'image/png' }), 'close-up.png');
    f.append('caption', 'Close-up of the burr');
    const up = await insp.post(`/api/ncrs/${n.id}/photos`, f);
    expect(up.status).toBe(201);
    expect(up.body).toMatchObject({ fromLot: false, caption: 'Close-up of the burr' });
    const img = await fetch(`${t.url}/api/ncrs/${n.id}/photos/${up.body.id}/thumbnail`, { headers: { cookie: insp.cookieHeader() } });
    expect(img.headers.get('content-type')).toBe('image/jpeg');
    const bad = new FormData();
    bad.append('file', new Blob(['not an image at all'], { type: 'image/png' }), 'fake.png');
    const r = await insp.post(`/api/ncrs/${n.id}/photos`, bad);
    expect(r.status).toBe(415);
    const again = await insp.post(`/api/ncrs/${n.id}/photo-links`, { photoIds: [lotPhoto.body.id] });
    expect(again.status).toBe(201);
    expect(again.body.items).toEqual([]);
  });
});

describe('defect codes', () => {
  it('comes with a starter list the engineer extends, renames and retires', async () => {
    const list = await insp.get('/api/defect-codes');
    expect(list.body.items.map((c: { code: string }) => c.code)).toEqual(expect.arrayContaining(['BURR', 'BORE', 'INSUL', 'SF']));
    const made = await eng.post('/api/defect-codes', { code: 'skew', name: 'Skewed stack' });
    expect(made.status).toBe(201);
    expect(made.body.code).toBe('SKEW');
    expect((await eng.post('/api/defect-codes', { code: 'SKEW', name: 'Twin' })).status).toBe(409);
    expect((await insp.post('/api/defect-codes', { code: 'ZZ', name: 'No' })).status).toBe(403);
    const retired = await eng.patch(`/api/defect-codes/${made.body.id}`, { active: false, version: made.body.version });
    expect(retired.body.active).toBe(false);
    expect((await eng.patch(`/api/defect-codes/${made.body.id}`, { name: 'Stale', version: made.body.version })).status).toBe(409);
    const r = await eng.post('/api/ncrs', ncrBody({ defectCodes: ['SKEW'] }));
    expect(r.status).toBe(400);
    expect(r.body.fields.defectCodes).toMatch(/Retired/);
    const all = await eng.get('/api/defect-codes?includeInactive=true');
    expect(all.body.items.map((c: { code: string }) => c.code)).toContain('SKEW');
  });
});

describe('supplier isolation', () => {
  it('a supplier sees its own NCRs with reduced fields; another supplier’s answers 404 without its contents', async () => {
    const ngl = await supplierIdOf(eng, 'NGL');
    const spw = await supplierIdOf(eng, 'SPW');
    const mine = await rejectedLot(eng, { supplierId: ngl });
    const theirs = await rejectedLot(eng, { supplierId: spw, partId: mine.partId, gaugeId: mine.gaugeId });
    const nMine = await raise(eng, { lotId: mine.lot.id, title: 'Northgate bore' });
    const nTheirs = await raise(eng, { lotId: theirs.lot.id, title: 'Selby secret bore' });
    await startReview(eng, nMine).then((x) => disposition(eng, x, [scrap(100)]));
    const sup = await signedIn(t.url, DEMO.supplierNorthgate);
    const list = await sup.get('/api/ncrs?pageSize=200');
    expect(list.status).toBe(200);
    expect(list.body.items.every((x: { supplierId: string }) => x.supplierId === ngl)).toBe(true);
    expect(list.body.items.map((x: { id: string }) => x.id)).toContain(nMine.id);
    const own = await sup.get(`/api/ncrs/${nMine.id}`);
    expect(own.status).toBe(200);
    expect(own.body).toMatchObject({ number: nMine.number, dispositions: [{ kind: 'scrap', quantity: 100 }] });
    for (const hidden of ['signatures', 'history', 'totalCost', 'raisedByName', 'readings']) expect(own.body).not.toHaveProperty(hidden);
    expect(own.body.dispositions[0]).not.toHaveProperty('cost');
    // What was measured, so the supplier can work on the cause: values and limits, no notes or ids.
    expect(own.body.measured).toEqual([expect.objectContaining({ serial: 1, characteristicCode: 'BORE', value: 150.21, values: [150.21], lsl: 149.95, usl: 150.05, conforming: false })]);
    for (const hidden of ['note', 'id', 'sampleId']) expect(own.body.measured[0]).not.toHaveProperty(hidden);
    const other = await sup.get(`/api/ncrs/${nTheirs.id}`);
    expect(other.status).toBe(404);
    expect(JSON.stringify(other.body)).not.toContain('Selby');
    expect(JSON.stringify(other.body)).not.toContain(nTheirs.number);
    expect((await sup.get(`/api/ncrs?q=${nTheirs.number}`)).body.total).toBe(0);
    expect((await sup.get('/api/ncrs/held-lots')).status).toBe(403);
  });
});
