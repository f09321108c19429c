import { ConflictException, Inject, Injectable } from '@nestjs/common';
import { and, asc, count, desc, eq, ilike, inArray, ne, or, sql, type SQL } from 'drizzle-orm';
import { CONFIG, type AppConfig } from '../config';
import { DB, type Db, type DbOrTx, type Tx } from '../db/client';
import { appUser, auditEvent, correctiveAction, disposition, driftSignal, eSignature, lot, lotSample, ncr, ncrPhoto, part, photo, planCharacteristic, reading, supplier } from '../db/schema';
import { AuditRepository } from '../audit/audit.repository';
import { UsersRepository } from '../users/users.repository';
import { notFound, stale } from '../common/errors';
import { likeEscape, offsetOf, orderFrom } from '../common/paging';
import { ValidationFailed } from '../common/zod.pipe';
import { now } from '../common/clock';
import { checkSplit, lineCost, lotStatusAfter, outcomeQuantities } from '../../shared/compute/disposition';
import { NCR_MANUAL_TRANSITIONS, canMoveNcr, type NcrStatus } from '../../shared/compute/workflow';
import { NCR_STATUS_LABELS, SIGNATURE_MEANINGS, type CreateDispositionsInput, type CreateNcrInput, type HeldLot, type Ncr, type NcrForSupplier, type NcrListQuery, type NcrSummary, type NcrTransitionInput, type UpdateNcrInput } from '../../shared/schemas/ncr';
import type { SessionUser } from '../../shared/schemas/auth';
import { noteNcrForCorrectiveActions } from '../corrective-actions/effectiveness';
import { DefectCodesService } from './defect-codes.service';
import { nextDocumentNumber } from './numbering';
import { signatureHash, verifySigner } from './e-signature';
import { toDisposition, toNcrPhoto, toNcrSummary, toSignature, toSupplierNcr, type NcrJoins } from './ncr-views';
import { judgesEachReading } from '../../shared/compute/evaluate';

const NO_SUPPLIER = '00000000-0000-0000-0000-000000000000';
const INSPECTING = ['received', 'inspecting'];
const GONE = ['scrapped', 'returned', 'closed'];
type NcrRow = typeof ncr.$inferSelect;

const uniq = <T>(xs: readonly T[] | undefined): T[] => [...new Set(xs ?? [])];

export const illegalTransition = (message: string) => new ConflictException({ error: 'illegal_transition', message });

@Injectable()
export class NcrsService {
  constructor(
    @Inject(DB) private readonly db: Db,
    @Inject(CONFIG) private readonly cfg: AppConfig,
    private readonly audit: AuditRepository,
    private readonly codes: DefectCodesService,
    private readonly users: UsersRepository,
  ) {}

  /** A supplier user reaches its own company's NCRs only; anything else is "not found". */
  scope(user: SessionUser): SQL | undefined {
    return user.role === 'supplier' ? eq(ncr.supplierId, user.supplierId ?? NO_SUPPLIER) : undefined;
  }

  private selectJoined(tx: DbOrTx) {
    return tx
      .select({
        n: ncr,
        s: { code: supplier.code, name: supplier.name },
        p: { partNumber: part.partNumber, revision: part.revision, description: part.description },
        l: { ref: lot.ref, supplierLotNumber: lot.supplierLotNumber },
        raisedByName: appUser.name,
      })
      .from(ncr)
      .leftJoin(supplier, eq(supplier.id, ncr.supplierId))
      .leftJoin(part, eq(part.id, ncr.partId))
      .leftJoin(lot, eq(lot.id, ncr.lotId))
      .leftJoin(appUser, eq(appUser.id, ncr.raisedBy));
  }

  /** The corrective action of each NCR (the one in progress, else the latest). */
  private async scarsOf(tx: DbOrTx, ncrIds: string[]): Promise<Map<string, { id: string; number: string }>> {
    if (!ncrIds.length) return new Map();
    const rows = await tx
      .select({ id: correctiveAction.id, number: correctiveAction.number, ncrId: correctiveAction.ncrId, status: correctiveAction.status })
      .from(correctiveAction)
      .where(inArray(correctiveAction.ncrId, ncrIds))
      .orderBy(desc(correctiveAction.issuedAt));
    const m = new Map<string, { id: string; number: string }>();
    // Rows come newest first: keep the first in progress, else the newest.
    for (const r of rows) if (r.status !== 'closed' && !m.has(r.ncrId)) m.set(r.ncrId, { id: r.id, number: r.number });
    for (const r of rows) if (!m.has(r.ncrId)) m.set(r.ncrId, { id: r.id, number: r.number });
    return m;
  }

  private joinsOf(r: { s: { code: string; name: string } | null; p: { partNumber: string; revision: string } | null; l: { ref: number; supplierLotNumber: string } | null; raisedByName: string | null }, scar: { id: string; number: string } | undefined): NcrJoins {
    return { s: r.s, p: r.p, l: r.l, raisedByName: r.raisedByName, scar: scar ?? null };
  }

  async list(user: SessionUser, q: NcrListQuery): Promise<{ items: NcrSummary[]; total: number }> {
    const digits = q.q?.replace(/\D/g, '');
    const where = and(
      this.scope(user),
      q.status === 'active' ? ne(ncr.status, 'closed') : q.status ? eq(ncr.status, q.status) : undefined,
      q.supplierId ? eq(ncr.supplierId, q.supplierId) : undefined,
      q.lotId ? eq(ncr.lotId, q.lotId) : undefined,
      q.q
        ? or(ilike(ncr.number, likeEscape(q.q)), ilike(ncr.title, likeEscape(q.q)), ilike(lot.supplierLotNumber, likeEscape(q.q)), digits ? sql`${lot.ref}::text = ${digits}` : undefined, sql`${ncr.defectCodes}::text ilike ${likeEscape(q.q)}`)
        : undefined,
    );
    const rows = await this.selectJoined(this.db)
      .where(where)
      .orderBy(...orderFrom(q.sort, { raisedAt: ncr.raisedAt, number: ncr.number, status: ncr.status }, desc(ncr.raisedAt)))
      .limit(q.pageSize)
      .offset(offsetOf(q.page, q.pageSize));
    const [{ n }] = await this.db.select({ n: count() }).from(ncr).leftJoin(lot, eq(lot.id, ncr.lotId)).where(where);
    const scars = await this.scarsOf(this.db, rows.map((r) => r.n.id));
    return {
      items: rows.map((r) => {
        const s = toNcrSummary(r.n, this.joinsOf(r, scars.get(r.n.id)));
        return user.role === 'supplier' ? { ...s, raisedByName: null } : s;
      }),
      total: n,
    };
  }

  async get(user: SessionUser, id: string): Promise<Ncr | NcrForSupplier> {
    const full = await this.getFull(id, this.db, this.scope(user));
    if (user.role !== 'supplier') return full;
    const [row] = await this.db.select().from(ncr).where(eq(ncr.id, id));
    return toSupplierNcr(full, row, full.dispositions, full.photos, full.readings);
  }

  /** The whole record for internal roles. */
  async getFull(id: string, tx: DbOrTx = this.db, scope?: SQL): Promise<Ncr> {
    const [r] = await this.selectJoined(tx).where(and(eq(ncr.id, id), scope));
    if (!r) throw notFound('NCR');
    const n = r.n;
    const [scars, lotRow, cores, readings, photos, lines, sigs, history] = await Promise.all([
      this.scarsOf(tx, [id]),
      n.lotId ? tx.select().from(lot).where(eq(lot.id, n.lotId)).then((x) => x[0]) : Promise.resolve(undefined),
      n.sampleIds.length ? tx.select().from(lotSample).where(inArray(lotSample.id, n.sampleIds)).orderBy(asc(lotSample.serial)) : Promise.resolve([]),
      n.readingIds.length
        ? tx
            .select({ r: reading, serial: lotSample.serial, c: { name: planCharacteristic.name, unit: planCharacteristic.unit, lsl: planCharacteristic.lsl, usl: planCharacteristic.usl, layout: planCharacteristic.layout } })
            .from(reading)
            .leftJoin(lotSample, eq(lotSample.id, reading.sampleId))
            .leftJoin(lot, eq(lot.id, reading.lotId))
            .leftJoin(planCharacteristic, and(eq(planCharacteristic.planId, lot.planId), eq(planCharacteristic.code, reading.characteristicCode)))
            .where(inArray(reading.id, n.readingIds))
            .orderBy(asc(lotSample.serial), asc(reading.characteristicCode))
        : Promise.resolve([]),
      tx.select().from(ncrPhoto).where(eq(ncrPhoto.ncrId, id)).orderBy(asc(ncrPhoto.createdAt)),
      tx.select().from(disposition).where(eq(disposition.ncrId, id)).orderBy(asc(disposition.seq)),
      tx.select().from(eSignature).where(and(eq(eSignature.entity, 'ncr'), eq(eSignature.entityId, id))).orderBy(asc(eSignature.signedAt), desc(eSignature.purpose)), // the disposition before its concession co-signature
      tx.select({ at: auditEvent.at, action: auditEvent.action, actorEmail: auditEvent.actorEmail, reason: auditEvent.reason }).from(auditEvent).where(and(eq(auditEvent.entity, 'ncr'), eq(auditEvent.entityId, id))).orderBy(asc(auditEvent.id)),
    ]);
    const dispositions = lines.map(toDisposition);
    return {
      ...toNcrSummary(n, this.joinsOf(r, scars.get(id))),
      requirement: n.requirement,
      found: n.found,
      characteristicCode: n.characteristicCode,
      signalId: n.signalId,
      lot: lotRow ? { id: lotRow.id, ref: lotRow.ref, status: lotRow.status, quantity: lotRow.quantity, supplierLotNumber: lotRow.supplierLotNumber, version: lotRow.version } : null,
      cores: cores.map((c) => ({ id: c.id, serial: c.serial })),
      readings: readings.map(({ r: x, serial, c }) => ({ id: x.id, sampleId: x.sampleId, serial, characteristicCode: x.characteristicCode, name: c?.name ?? x.characteristicCode, unit: c?.unit ?? null, lsl: c?.lsl ?? null, usl: c?.usl ?? null, eachReadingJudged: c ? judgesEachReading(c.layout) : false, value: x.value, values: x.values, pass: x.pass, conforming: x.conforming, note: x.note })),
      photos: photos.map(toNcrPhoto),
      dispositions,
      signatures: sigs.map(toSignature),
      totalCost: Math.round(dispositions.reduce((s, d) => s + d.cost, 0) * 100) / 100,
      closedAt: n.closedAt?.toISOString() ?? null,
      history: history.map((h) => ({ at: h.at.toISOString(), action: h.action, actorEmail: h.actorEmail, reason: h.reason, detail: null })),
      reviewBoard: { countersignUseAsIs: this.cfg.USE_AS_IS_COUNTERSIGN },
    };
  }

  /** Lots held after rejection that have no NCR in progress yet, with their failed readings. */
  async heldLots(): Promise<HeldLot[]> {
    const lots = await this.db
      .select({ l: lot, s: { code: supplier.code }, p: { partNumber: part.partNumber, revision: part.revision } })
      .from(lot)
      .innerJoin(supplier, eq(supplier.id, lot.supplierId))
      .innerJoin(part, eq(part.id, lot.partId))
      .where(and(eq(lot.status, 'on-hold'), sql`not exists (select 1 from ${ncr} where ${ncr.lotId} = ${lot.id} and ${ncr.status} <> 'closed')`))
      .orderBy(asc(lot.decidedAt))
      .limit(50);
    if (!lots.length) return [];
    const fails = await this.db
      .select({ r: reading, serial: lotSample.serial, lotId: reading.lotId, c: { name: planCharacteristic.name, unit: planCharacteristic.unit, lsl: planCharacteristic.lsl, usl: planCharacteristic.usl } })
      .from(reading)
      .innerJoin(lotSample, eq(lotSample.id, reading.sampleId))
      .innerJoin(lot, eq(lot.id, reading.lotId))
      .leftJoin(planCharacteristic, and(eq(planCharacteristic.planId, lot.planId), eq(planCharacteristic.code, reading.characteristicCode)))
      .where(and(inArray(reading.lotId, lots.map((x) => x.l.id)), eq(reading.conforming, false)))
      .orderBy(asc(lotSample.serial), asc(reading.characteristicCode));
    const photos = await this.db.select({ id: photo.id, lotId: photo.lotId }).from(photo).where(inArray(photo.lotId, lots.map((x) => x.l.id))).orderBy(asc(photo.createdAt));
    return lots.map(({ l, s, p }) => ({
      id: l.id,
      ref: l.ref,
      supplierId: l.supplierId,
      supplierCode: s.code,
      partId: l.partId,
      partNumber: p.partNumber,
      partRevision: p.revision,
      supplierLotNumber: l.supplierLotNumber,
      quantity: l.quantity,
      decidedAt: l.decidedAt?.toISOString() ?? null,
      decisionComment: l.decisionComment,
      nonconformingCount: l.nonconformingCount,
      failures: fails
        .filter((f) => f.lotId === l.id)
        .slice(0, 50)
        .map((f) => ({ readingId: f.r.id, sampleId: f.r.sampleId, serial: f.serial, characteristicCode: f.r.characteristicCode, name: f.c?.name ?? f.r.characteristicCode, value: f.r.value, unit: f.c?.unit ?? null, lsl: f.c?.lsl ?? null, usl: f.c?.usl ?? null, pass: f.r.pass, note: f.r.note })),
      photoIds: photos.filter((x) => x.lotId === l.id).slice(0, 50).map((x) => x.id),
    }));
  }

  async create(actor: SessionUser, input: CreateNcrInput): Promise<Ncr> {
    const id = await this.db.transaction(async (tx) => {
      const fields: Record<string, string> = {};
      let supplierId = input.supplierId ?? null;
      let partId = input.partId ?? null;
      let sampleIds = uniq(input.sampleIds);
      let readingIds = uniq(input.readingIds);
      const photoIds = uniq(input.photoIds);
      let lotRow: typeof lot.$inferSelect | undefined;
      let photos: (typeof photo.$inferSelect)[] = [];
      if (input.lotId) {
        // The lot row lock also serialises two people raising an NCR for the same lot.
        [lotRow] = await tx.select().from(lot).where(eq(lot.id, input.lotId)).for('update');
        if (!lotRow) throw new ValidationFailed({ lotId: 'No such lot' });
        if (INSPECTING.includes(lotRow.status)) throw illegalTransition(`Lot ${lotRow.ref} is still being inspected. Decide it first (a rejected lot is held for its NCR), or raise the NCR by hand.`);
        if (GONE.includes(lotRow.status)) throw illegalTransition(`Lot ${lotRow.ref} is already ${lotRow.status}; there is nothing left to hold.`);
        const [open] = await tx.select({ number: ncr.number }).from(ncr).where(and(eq(ncr.lotId, lotRow.id), ne(ncr.status, 'closed')));
        if (open) throw new ConflictException({ error: 'conflict', message: `Lot ${lotRow.ref} already has ${open.number} in progress; add to that report instead.` });
        if (supplierId && supplierId !== lotRow.supplierId) fields.supplierId = 'This is not the supplier of the lot';
        if (partId && partId !== lotRow.partId) fields.partId = 'This is not the part of the lot';
        supplierId = lotRow.supplierId;
        partId = lotRow.partId;
        if (input.suspectQuantity > lotRow.quantity) fields.suspectQuantity = `The lot has ${lotRow.quantity} cores; at most that many can be suspect`;
        if (sampleIds.length) {
          const found = await tx.select({ id: lotSample.id }).from(lotSample).where(and(eq(lotSample.lotId, lotRow.id), inArray(lotSample.id, sampleIds)));
          if (found.length !== sampleIds.length) fields.sampleIds = 'Some cores are not sampled cores of this lot';
        }
        if (readingIds.length) {
          const found = await tx.select({ id: reading.id, sampleId: reading.sampleId }).from(reading).where(and(eq(reading.lotId, lotRow.id), inArray(reading.id, readingIds)));
          if (found.length !== readingIds.length) fields.readingIds = 'Some readings are not readings of this lot';
          sampleIds = uniq([...sampleIds, ...found.map((f) => f.sampleId)]);
        } else if (!sampleIds.length) {
          // Raised from the lot as a whole: link the readings that failed, and their cores.
          const failed = await tx.select({ id: reading.id, sampleId: reading.sampleId }).from(reading).where(and(eq(reading.lotId, lotRow.id), eq(reading.conforming, false))).limit(500);
          readingIds = failed.map((f) => f.id);
          sampleIds = uniq(failed.map((f) => f.sampleId));
        }
        if (photoIds.length) {
          photos = await tx.select().from(photo).where(and(eq(photo.lotId, lotRow.id), inArray(photo.id, photoIds)));
          if (photos.length !== photoIds.length) fields.photoIds = 'Some photos are not photos of this lot';
        }
      } else {
        if (supplierId && !(await tx.select({ id: supplier.id }).from(supplier).where(eq(supplier.id, supplierId))).length) fields.supplierId = 'No such supplier';
        if (partId && !(await tx.select({ id: part.id }).from(part).where(eq(part.id, partId))).length) fields.partId = 'No such part';
      }
      // Taken from a drift signal: the signal names the supplier, part and characteristic; its row
      // lock serialises two engineers opening an NCR from the same signal.
      let signalRow: typeof driftSignal.$inferSelect | undefined;
      let characteristicCode = input.characteristicCode ?? null;
      if (input.signalId) {
        [signalRow] = await tx.select().from(driftSignal).where(eq(driftSignal.id, input.signalId)).for('update');
        if (!signalRow) fields.signalId = 'No such drift signal';
        else {
          if (signalRow.status === 'ncr-opened') {
            const [taken] = signalRow.ncrId ? await tx.select({ number: ncr.number }).from(ncr).where(eq(ncr.id, signalRow.ncrId)) : [];
            throw new ConflictException({ error: 'conflict', message: `This signal was already taken into ${taken?.number ?? 'a nonconformance'}; add to that report instead.` });
          }
          if (supplierId && supplierId !== signalRow.supplierId) fields.supplierId = 'This is not the supplier of the signal';
          if (partId && partId !== signalRow.partId) fields.partId = 'This is not the part of the signal';
          if (characteristicCode && characteristicCode !== signalRow.characteristicCode) fields.characteristicCode = 'This is not the characteristic of the signal';
          supplierId = signalRow.supplierId;
          partId = signalRow.partId;
          characteristicCode = signalRow.characteristicCode;
        }
      }
      if (Object.keys(fields).length) throw new ValidationFailed(fields);
      await this.codes.assertUsable(tx, input.defectCodes);

      const at = now();
      const { seq, number } = await nextDocumentNumber(tx, 'ncr', at.getUTCFullYear());
      const source = input.signalId ? 'signal' : input.sampleIds?.length ? 'core' : input.lotId ? 'lot' : 'manual';
      const [row] = await tx
        .insert(ncr)
        .values({
          number,
          year: at.getUTCFullYear(),
          seq,
          source,
          title: input.title,
          requirement: input.requirement,
          found: input.found,
          defectCodes: uniq(input.defectCodes),
          suspectQuantity: input.suspectQuantity,
          lotId: lotRow?.id ?? null,
          supplierId,
          partId,
          characteristicCode,
          signalId: input.signalId ?? null,
          sampleIds,
          readingIds,
          raisedBy: actor.id,
          raisedAt: at,
          createdAt: at,
          updatedAt: at,
        })
        .returning();
      if (photos.length) {
        await tx.insert(ncrPhoto).values(photos.map((p) => ({ ncrId: row.id, photoId: p.id, caption: p.caption, webKey: p.webKey, thumbKey: p.thumbKey, width: p.width, height: p.height, bytes: p.bytes, uploadedBy: actor.id, createdAt: at })));
      }
      if (lotRow && lotRow.status !== 'on-hold') {
        await tx.update(lot).set({ status: 'on-hold', version: lotRow.version + 1, updatedAt: at }).where(eq(lot.id, lotRow.id));
        await this.audit.record(tx, { actorId: actor.id, actorEmail: actor.email, action: 'lot.held', entity: 'lot', entityId: lotRow.id, before: { status: lotRow.status }, after: { status: 'on-hold', ncr: number }, reason: `Held for ${number}` });
      }
      await this.audit.record(tx, {
        actorId: actor.id,
        actorEmail: actor.email,
        action: 'ncr.raised',
        entity: 'ncr',
        entityId: row.id,
        after: { number, source, lotId: row.lotId, supplierId, partId, defectCodes: row.defectCodes, suspectQuantity: row.suspectQuantity, signalId: row.signalId, cores: sampleIds.length, readings: readingIds.length, photos: photos.length },
      });
      if (signalRow) {
        await tx.update(driftSignal).set({ status: 'ncr-opened', ncrId: row.id }).where(eq(driftSignal.id, signalRow.id));
        await this.audit.record(tx, {
          actorId: actor.id,
          actorEmail: actor.email,
          action: 'spc.signal_taken_into_ncr',
          entity: 'drift_signal',
          entityId: signalRow.id,
          before: { status: signalRow.status },
          after: { status: 'ncr-opened', ncr: number, rule: signalRow.rule, lot: signalRow.lotRef, code: signalRow.characteristicCode },
        });
      }
      await noteNcrForCorrectiveActions(tx, row, actor);
      return row.id;
    });
    return this.getFull(id);
  }

  async update(actor: SessionUser, id: string, input: UpdateNcrInput): Promise<Ncr> {
    await this.db.transaction(async (tx) => {
      const row = await this.lock(tx, id, input.version);
      if (row.status !== 'open' && row.status !== 'in-review') throw illegalTransition(`${row.number} is ${NCR_STATUS_LABELS[row.status].toLowerCase()}; its description can no longer change.`);
      if (input.defectCodes) await this.codes.assertUsable(tx, input.defectCodes);
      if (input.suspectQuantity !== undefined && row.lotId) {
        const [l] = await tx.select({ quantity: lot.quantity }).from(lot).where(eq(lot.id, row.lotId));
        if (input.suspectQuantity > l.quantity) throw new ValidationFailed({ suspectQuantity: `The lot has ${l.quantity} cores; at most that many can be suspect` });
      }
      const { version: _v, ...patch } = input;
      if (patch.defectCodes) patch.defectCodes = uniq(patch.defectCodes);
      const [saved] = await tx.update(ncr).set({ ...patch, version: row.version + 1, updatedAt: now() }).where(eq(ncr.id, id)).returning();
      const before = Object.fromEntries(Object.keys(patch).map((k) => [k, row[k as keyof NcrRow]]));
      await this.audit.record(tx, { actorId: actor.id, actorEmail: actor.email, action: 'ncr.updated', entity: 'ncr', entityId: id, before, after: patch });
      if (patch.defectCodes) await noteNcrForCorrectiveActions(tx, saved, actor);
    });
    return this.getFull(id);
  }

  /** The row locked for this transaction, at the version the caller saw. */
  private async lock(tx: Tx, id: string, version: number): Promise<NcrRow> {
    const [row] = await tx.select().from(ncr).where(eq(ncr.id, id)).for('update');
    if (!row) throw notFound('NCR');
    if (row.version !== version) throw stale('NCR');
    return row;
  }

  async transition(actor: SessionUser, id: string, body: NcrTransitionInput): Promise<Ncr> {
    await this.db.transaction(async (tx) => {
      const row = await this.lock(tx, id, body.version);
      const from = row.status;
      const to = body.to as NcrStatus;
      if (!NCR_MANUAL_TRANSITIONS[from].includes(to)) {
        const label = (s: NcrStatus) => NCR_STATUS_LABELS[s].toLowerCase();
        if (from === to) throw illegalTransition(`${row.number} is already ${label(to)}.`);
        if (canMoveNcr(from, to)) throw illegalTransition(`${row.number} becomes dispositioned when the review board records its signed dispositions, not by a plain status change.`);
        throw illegalTransition(`${row.number} cannot go from ${label(from)} to ${label(to)}. Allowed from ${label(from)}: ${NCR_MANUAL_TRANSITIONS[from].map(label).join(', ') || 'nothing (final)'}.`);
      }
      const at = now();
      await tx
        .update(ncr)
        .set({ status: to, version: row.version + 1, updatedAt: at, ...(to === 'in-review' ? { reviewStartedAt: at } : {}), ...(to === 'closed' ? { closedAt: at, closedBy: actor.id } : {}) })
        .where(eq(ncr.id, id));
      await this.audit.record(tx, { actorId: actor.id, actorEmail: actor.email, action: `ncr.${to === 'in-review' ? 'review_started' : to}`, entity: 'ncr', entityId: id, before: { status: from }, after: { status: to }, reason: body.note ?? null });
    });
    return this.getFull(id);
  }

  /**
   * The review board's decision: lines that account for every suspect core, e-signed by the
   * engineer (password re-entered, meaning stated) and, for a concession with the setting on,
   * by a second engineer. Verified before anything is written; all of it commits in one
   * transaction with the NCR's and the lot's new status, or none of it does.
   */
  async disposition(actor: SessionUser, id: string, body: CreateDispositionsInput): Promise<Ncr> {
    const [peek] = await this.db.select().from(ncr).where(eq(ncr.id, id));
    if (!peek) throw notFound('NCR');
    const lines = body.lines.map((l, i) => ({
      seq: i + 1,
      kind: l.kind,
      quantity: l.quantity,
      rationale: l.rationale,
      concessionRef: l.concessionRef ?? null,
      hours: l.hours ?? null,
      rate: l.rate ?? null,
      scrapValue: l.scrapValue ?? null,
      freight: l.freight ?? null,
      cost: lineCost(l),
    }));
    const split = checkSplit(lines, peek.suspectQuantity);
    if (!split.ok) throw new ValidationFailed({ lines: split.message ?? 'The quantities do not add up' }, split.message ?? undefined);
    const concession = lines.filter((l) => l.kind === 'use-as-is');
    const needSecond = concession.length > 0 && this.cfg.USE_AS_IS_COUNTERSIGN;
    if (needSecond && !body.countersignature) throw new ValidationFailed({ countersignature: 'Use as is needs a second engineer’s signature: they enter their e-mail and password' }, 'A concession needs a second engineer’s signature');
    if (!concession.length && body.countersignature) throw new ValidationFailed({ countersignature: 'Only a concession (use as is) takes a second signature' });

    // Re-authenticate before touching anything: a wrong password saves nothing.
    const signer = await verifySigner(this.users, this.cfg, await this.users.byId(actor.id), body.signature.password);
    let second: Awaited<ReturnType<typeof verifySigner>> | null = null;
    if (body.countersignature) {
      const other = await this.users.byEmail(String(body.countersignature.email));
      if (other && other.id === signer.id) throw new ValidationFailed({ 'countersignature.email': 'The second signature must come from another engineer' });
      if (other && other.role !== 'engineer') throw new ValidationFailed({ 'countersignature.email': 'Only a quality engineer may co-sign a concession' });
      second = await verifySigner(this.users, this.cfg, other, body.countersignature.password);
    }

    await this.db.transaction(async (tx) => {
      const row = await this.lock(tx, id, body.version);
      if (row.status !== 'in-review') {
        throw illegalTransition(row.status === 'open' ? `${row.number} is open: start the review before recording dispositions.` : `${row.number} is already ${NCR_STATUS_LABELS[row.status].toLowerCase()}.`);
      }
      const at = now();
      const subject = { id: row.id, number: row.number, version: row.version, suspectQuantity: row.suspectQuantity, lotId: row.lotId };
      const content = {
        kind: 'ncr-disposition',
        ncr: subject,
        lines,
        totalCost: split.totalCost,
        signer: { id: signer.id, email: signer.email, name: signer.name, role: signer.role },
        meaning: SIGNATURE_MEANINGS.disposition,
        signedAt: at.toISOString(),
      };
      const hash = signatureHash(content);
      const [sig] = await tx
        .insert(eSignature)
        .values({ entity: 'ncr', entityId: row.id, purpose: 'disposition', signerId: signer.id, signerName: signer.name, signerEmail: signer.email, signerRole: signer.role, meaning: content.meaning, signedAt: at, content, contentHash: hash })
        .returning();
      if (second) {
        const c2 = {
          kind: 'ncr-concession',
          ncr: subject,
          lines: lines.filter((l) => l.kind === 'use-as-is'),
          dispositionSignature: hash,
          signer: { id: second.id, email: second.email, name: second.name, role: second.role },
          meaning: SIGNATURE_MEANINGS.concession,
          signedAt: at.toISOString(),
        };
        await tx.insert(eSignature).values({ entity: 'ncr', entityId: row.id, purpose: 'concession', signerId: second.id, signerName: second.name, signerEmail: second.email, signerRole: second.role, meaning: c2.meaning, signedAt: at, content: c2, contentHash: signatureHash(c2) });
      }
      await tx.insert(disposition).values(lines.map((l) => ({ ...l, ncrId: row.id, signatureId: sig.id, createdAt: at })));
      await tx.update(ncr).set({ status: 'dispositioned', dispositionedAt: at, version: row.version + 1, updatedAt: at }).where(eq(ncr.id, id));
      await this.audit.record(tx, {
        actorId: actor.id,
        actorEmail: actor.email,
        action: 'ncr.dispositioned',
        entity: 'ncr',
        entityId: id,
        before: { status: row.status },
        after: { status: 'dispositioned', lines: lines.map((l) => ({ kind: l.kind, quantity: l.quantity, concessionRef: l.concessionRef, cost: l.cost })), totalCost: split.totalCost, signature: hash, countersignedBy: second?.email ?? null },
        reason: lines.map((l) => `${l.quantity} × ${l.kind}: ${l.rationale.replace(/[.;\s]+$/, '')}`).join('; ').slice(0, 2000),
      });
      if (row.lotId) {
        const [l] = await tx.select().from(lot).where(eq(lot.id, row.lotId)).for('update');
        const status = lotStatusAfter(lines);
        await tx.update(lot).set({ status, version: l.version + 1, updatedAt: at }).where(eq(lot.id, l.id));
        await this.audit.record(tx, {
          actorId: actor.id,
          actorEmail: actor.email,
          action: `lot.${status}`,
          entity: 'lot',
          entityId: l.id,
          before: { status: l.status },
          after: { status, ncr: row.number, quantities: outcomeQuantities(lines) },
          reason: `Dispositioned under ${row.number}`,
        });
      }
    });
    return this.getFull(id);
  }

  /** What the hold tag prints. */
  async tagData(id: string) {
    const [r] = await this.selectJoined(this.db).where(eq(ncr.id, id));
    if (!r) throw notFound('NCR');
    return { n: r.n, s: r.s, p: r.p, l: r.l };
  }
}
