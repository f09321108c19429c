import { BadRequestException, ConflictException, Inject, Injectable } from '@nestjs/common';
import { and, asc, count, desc, eq, gte, ilike, inArray, lte, or, sql } from 'drizzle-orm';
import { DB, type Db, type Tx } from '../db/client';
import { gauge, inspectionPlan, lot, lotSample, part, photo, planCharacteristic, reading, supplier, switchingEvent, switchingState, type StoredSampling } from '../db/schema';
import { AuditRepository } from '../audit/audit.repository';
import { SpcService } from '../spc/spc.service';
import { recordLotDecisionForCorrectiveActions } from '../corrective-actions/effectiveness';
import { conflict, notFound, stale } from '../common/errors';
import { likeEscape, offsetOf, orderFrom } from '../common/paging';
import { ValidationFailed } from '../common/zod.pipe';
import { todayIso } from '../gauges/gauges.service';
import { now as clockNow } from '../common/clock';
import { initialSwitchingState, nextSwitchingState, samplingPlan, zeroAcceptancePlan, type SwitchingState } from '../../shared/compute/sampling';
import { evaluateSample, expectedReadings, proposeDecision, type EvalCharacteristic, type EvalPart, type RawReading } from '../../shared/compute/evaluate';
import { ComputeError } from '../../shared/compute/errors';
import type { SessionUser } from '../../shared/schemas/auth';
import type { Lot, LotSummary, ReadingInput, lotListQuerySchema } from '../../shared/schemas/receiving';
import { forSupplier, toLot, toSummary } from './lot-views';
import type { z } from 'zod';

type CharRow = typeof planCharacteristic.$inferSelect;
interface Row {
  sampleId: string;
  code: string;
  values: number[];
  value: number | null;
  pass: boolean | null;
  conforming: boolean | null;
  note: string | null;
  gaugeId: string | null;
  gaugeDueOn: string | null;
}
type PartRow = typeof part.$inferSelect;
const OPEN_STATUSES = ['received', 'inspecting'] as const;

export const evalChar = (c: CharRow): EvalCharacteristic & { severity: string } => ({
  code: c.code,
  kind: c.kind,
  lsl: c.lsl,
  usl: c.usl,
  layout: c.layout as EvalCharacteristic['layout'],
  angles: c.angles,
  levels: c.levels,
  readingsPerSample: c.readingsPerSample,
  derivedFormula: c.derivedFormula,
  inputs: c.inputs ?? null,
  unit: c.unit,
  severity: c.severity,
});

export const evalPart = (p: PartRow): EvalPart => ({
  nominalOdMm: p.nominalOdMm,
  nominalStackLengthMm: p.nominalStackLengthMm,
  laminationAreaCm2: p.laminationAreaCm2,
  densityGcm3: p.densityGcm3,
  laminationThicknessMm: p.laminationThicknessMm,
  designStackingFactor: p.designStackingFactor,
  designToothT: p.designToothT,
  designYokeT: p.designYokeT,
});

export function computeSampling(plan: typeof inspectionPlan.$inferSelect, quantity: number, severity: SwitchingState['severity']): StoredSampling {
  if (plan.samplingKind === 'zero-acceptance') {
    const z = zeroAcceptancePlan({ lotSize: quantity, sampleSize: plan.zeroSampleSize ?? 1 });
    return { kind: 'zero-acceptance', codeLetter: null, planLetter: null, sampleSize: z.sampleSize, accept: 0, reject: 1, severity: 'normal', aql: null, level: null, inspectAll: z.inspectAll, table: 'Zero-acceptance plan (c = 0), fixed sample size', lotSize: quantity };
  }
  if (quantity < 2) {
    // ISO 2859-1 Table 1 starts at a lot of 2: a single core is simply inspected.
    return { kind: 'aql', codeLetter: null, planLetter: null, sampleSize: 1, accept: 0, reject: 1, severity, aql: plan.aql, level: plan.inspectionLevel, inspectAll: true, table: 'Lot of one core: 100 % inspection', lotSize: quantity };
  }
  const p = samplingPlan({ lotSize: quantity, level: plan.inspectionLevel as never, aql: plan.aql as never, severity });
  return { kind: 'aql', codeLetter: p.codeLetter, planLetter: p.planLetter, sampleSize: p.sampleSize, accept: p.accept, reject: p.reject, severity, aql: p.aql, level: p.level, inspectAll: p.inspectAll, table: p.table, plan: p as unknown as Record<string, unknown>, lotSize: quantity };
}

@Injectable()
export class LotsService {
  constructor(
    @Inject(DB) private readonly db: Db,
    private readonly audit: AuditRepository,
    private readonly spc: SpcService,
  ) {}

  /** The switching state row for supplier × part, locked for this transaction. */
  async lockSwitching(tx: Tx, supplierId: string, partId: string): Promise<SwitchingState> {
    await tx.insert(switchingState).values({ supplierId, partId, state: initialSwitchingState() }).onConflictDoNothing();
    const [row] = await tx.select().from(switchingState).where(and(eq(switchingState.supplierId, supplierId), eq(switchingState.partId, partId))).for('update');
    return row.state as SwitchingState;
  }

  async receive(actor: SessionUser, input: z.output<typeof import('../../shared/schemas/receiving').createLotSchema>): Promise<Lot> {
    const id = await this.db.transaction(async (tx) => {
      const [s] = await tx.select().from(supplier).where(eq(supplier.id, input.supplierId));
      if (!s) throw new ValidationFailed({ supplierId: 'No such supplier' });
      if (s.approvalStatus === 'disapproved') {
        throw new ValidationFailed({ supplierId: `${s.name} is disapproved${s.approvalReason ? ` (${s.approvalReason})` : ''}: no new lots may be received from them.` }, 'This supplier may not ship lots');
      }
      const [p] = await tx.select().from(part).where(eq(part.id, input.partId));
      if (!p) throw new ValidationFailed({ partId: 'No such part' });
      const [plan] = await tx.select().from(inspectionPlan).where(and(eq(inspectionPlan.partId, p.id), eq(inspectionPlan.status, 'active')));
      if (!plan) throw new ValidationFailed({ partId: `${p.partNumber} rev ${p.revision} has no active inspection plan yet; an engineer must activate one first.` });
      const sw = await this.lockSwitching(tx, s.id, p.id);
      if (sw.discontinued) {
        throw new ConflictException({ error: 'discontinued', message: `Acceptance from ${s.name} for ${p.partNumber} is stopped: 5 lots were not accepted on tightened inspection. An engineer must record the supplier's corrective action before new lots are received.` });
      }
      let sampling: StoredSampling;
      try {
        sampling = computeSampling(plan, input.quantity, sw.severity);
      } catch (err) {
        if (err instanceof ComputeError) throw new ValidationFailed({ quantity: err.message });
        throw err;
      }
      const [row] = await tx
        .insert(lot)
        .values({
          supplierId: s.id,
          partId: p.id,
          planId: plan.id,
          supplierLotNumber: input.supplierLotNumber,
          poNumber: input.poNumber ?? null,
          quantity: input.quantity,
          receivedAt: input.receivedAt ? new Date(input.receivedAt) : clockNow(),
          heatNumbers: input.heatNumbers ?? [],
          packagingCondition: input.packagingCondition,
          packagingNote: input.packagingNote ?? null,
          sampling,
          receivedBy: actor.id,
        })
        .returning();
      const samples = Array.from({ length: sampling.sampleSize }, (_, i) => ({ lotId: row.id, serial: i + 1 }));
      for (let i = 0; i < samples.length; i += 1000) await tx.insert(lotSample).values(samples.slice(i, i + 1000));
      await this.audit.record(tx, {
        actorId: actor.id,
        actorEmail: actor.email,
        action: 'lot.received',
        entity: 'lot',
        entityId: row.id,
        after: { ref: row.ref, supplier: s.code, part: `${p.partNumber}/${p.revision}`, planRevision: plan.revision, quantity: row.quantity, sampling: { ...sampling, plan: undefined } },
      });
      return row.id;
    });
    return this.get(actor, id);
  }

  private scope(user: SessionUser) {
    return user.role === 'supplier' ? eq(lot.supplierId, user.supplierId ?? '00000000-0000-0000-0000-000000000000') : undefined;
  }

  async list(user: SessionUser, q: z.infer<typeof lotListQuerySchema>): Promise<{ items: LotSummary[]; total: number }> {
    if (q.receivedFrom && q.receivedTo && q.receivedFrom > q.receivedTo) throw new ValidationFailed({ receivedTo: 'The end of the range is before its start' });
    const where = and(
      this.scope(user),
      q.status === 'waiting' ? inArray(lot.status, [...OPEN_STATUSES]) : q.status ? eq(lot.status, q.status) : undefined,
      q.supplierId ? eq(lot.supplierId, q.supplierId) : undefined,
      q.partId ? eq(lot.partId, q.partId) : undefined,
      q.q ? or(ilike(lot.supplierLotNumber, likeEscape(q.q)), ilike(lot.poNumber, likeEscape(q.q)), sql`${lot.heatNumbers}::text ilike ${likeEscape(q.q)}`, sql`${lot.ref}::text = ${q.q.replace(/\D/g, '') || '-1'}`) : undefined,
      q.receivedFrom ? gte(lot.receivedAt, new Date(`${q.receivedFrom}T00:00:00Z`)) : undefined,
      q.receivedTo ? lte(lot.receivedAt, new Date(`${q.receivedTo}T23:59:59.999Z`)) : undefined,
    );
    const rows = await this.db
      .select({ l: lot, s: { code: supplier.code, name: supplier.name }, p: { partNumber: part.partNumber, revision: part.revision } })
      .from(lot)
      .innerJoin(supplier, eq(supplier.id, lot.supplierId))
      .innerJoin(part, eq(part.id, lot.partId))
      .where(where)
      .orderBy(...orderFrom(q.sort, { receivedAt: lot.receivedAt, ref: lot.ref, status: lot.status }, q.status === 'waiting' ? asc(lot.receivedAt) : desc(lot.receivedAt)))
      .limit(q.pageSize)
      .offset(offsetOf(q.page, q.pageSize));
    const [{ n }] = await this.db.select({ n: count() }).from(lot).where(where);
    return { items: rows.map((r) => toSummary(r.l, r.s, r.p)), total: n };
  }

  async get(user: SessionUser, id: string, tx: Db | Tx = this.db): Promise<Lot> {
    const [row] = await tx
      .select({ l: lot, s: { code: supplier.code, name: supplier.name }, p: { partNumber: part.partNumber, revision: part.revision }, planRevision: inspectionPlan.revision })
      .from(lot)
      .innerJoin(supplier, eq(supplier.id, lot.supplierId))
      .innerJoin(part, eq(part.id, lot.partId))
      .innerJoin(inspectionPlan, eq(inspectionPlan.id, lot.planId))
      .where(and(eq(lot.id, id), this.scope(user)));
    if (!row) throw notFound('lot');
    const [samples, readings, photos] = await Promise.all([
      tx.select().from(lotSample).where(eq(lotSample.lotId, id)).orderBy(asc(lotSample.serial)),
      tx.select().from(reading).where(eq(reading.lotId, id)),
      tx.select().from(photo).where(eq(photo.lotId, id)).orderBy(asc(photo.createdAt)),
    ]);
    const l = toLot(row.l, row.s, row.p, row.planRevision, samples, readings, photos);
    return user.role === 'supplier' ? forSupplier(l) : l;
  }

  /** Everything needed to judge a lot's readings. */
  async context(tx: Db | Tx, lotId: string) {
    const [row] = await tx.select({ l: lot, p: part }).from(lot).innerJoin(part, eq(part.id, lot.partId)).where(eq(lot.id, lotId));
    if (!row) throw notFound('lot');
    const chars = await tx.select().from(planCharacteristic).where(eq(planCharacteristic.planId, row.l.planId)).orderBy(asc(planCharacteristic.seq));
    const samples = await tx.select().from(lotSample).where(eq(lotSample.lotId, lotId)).orderBy(asc(lotSample.serial));
    return { lot: row.l, part: row.p, chars, samples };
  }

  /**
   * Stores readings (last write wins per sample × characteristic), recomputes the derived values
   * of the cores touched, all in one transaction with one audit event.
   */
  async putReadings(actor: SessionUser, lotId: string, input: ReadingInput[], source: 'bench' | 'import' = 'bench', txIn?: Tx): Promise<{ saved: number }> {
    const work = async (tx: Tx) => {
      await tx.select({ id: lot.id }).from(lot).where(eq(lot.id, lotId)).for('update');
      const ctx = await this.context(tx, lotId);
      if (!(OPEN_STATUSES as readonly string[]).includes(ctx.lot.status)) {
        throw conflict(`This lot is already ${ctx.lot.status}; its readings can no longer change.`);
      }
      const byCode = new Map(ctx.chars.map((c) => [c.code, c]));
      const sampleIds = new Set(ctx.samples.map((s) => s.id));
      const gaugeIds = [...new Set(input.map((r) => r.gaugeId).filter((g): g is string => !!g))];
      const gauges = gaugeIds.length ? await tx.select().from(gauge).where(inArray(gauge.id, gaugeIds)) : [];
      const gaugeById = new Map(gauges.map((g) => [g.id, g]));
      const today = todayIso(clockNow());
      const fields: Record<string, string> = {};
      input.forEach((r, i) => {
        const at = `readings.${i}`;
        const c = byCode.get(r.characteristicCode);
        if (!sampleIds.has(r.sampleId)) fields[`${at}.sampleId`] = 'This core is not one of the sampled cores of this lot';
        if (!c) {
          fields[`${at}.characteristicCode`] = `${r.characteristicCode} is not a characteristic of this lot's plan`;
          return;
        }
        if (c.kind === 'derived') {
          fields[`${at}.characteristicCode`] = `${c.code} is computed from other readings and cannot be entered`;
          return;
        }
        if (c.kind === 'attribute') {
          if (r.pass == null) fields[`${at}.pass`] = `${c.code} is a pass/fail check: send pass true or false`;
          if ((r.values ?? []).length) fields[`${at}.values`] = `${c.code} takes no numbers, only pass or fail`;
        } else {
          const need = expectedReadings(evalChar(c));
          const got = (r.values ?? []).length;
          if (got !== need) fields[`${at}.values`] = `${c.code} takes ${need} reading${need === 1 ? '' : 's'} per core (${c.layout}); got ${got}`;
        }
        if (c.gaugeKind && c.kind === 'variable' && !r.gaugeId) fields[`${at}.gaugeId`] = `Choose the ${c.gaugeKind} used for ${c.code}`;
        if (r.gaugeId) {
          const g = gaugeById.get(r.gaugeId);
          if (!g) fields[`${at}.gaugeId`] = 'No such gauge';
          else if (g.status !== 'in-service') fields[`${at}.gaugeId`] = `Gauge ${g.assetTag} is out of service`;
          else if (g.calibrationDueOn < today) fields[`${at}.gaugeId`] = `Gauge ${g.assetTag} was due for calibration on ${g.calibrationDueOn}: readings taken with it are refused. Use a calibrated gauge.`;
          else if (c.gaugeKind && g.kind !== c.gaugeKind) fields[`${at}.gaugeId`] = `${c.code} needs a ${c.gaugeKind}; ${g.assetTag} is a ${g.kind}`;
        }
      });
      if (Object.keys(fields).length) throw new ValidationFailed(fields, 'Some readings were refused; nothing was saved');

      // Evaluate in memory first (existing readings of the touched cores + what was sent), then
      // write each row once with its result: one unnest upsert per batch, no read-back.
      const now = clockNow();
      const touched = [...new Set(input.map((r) => r.sampleId))];
      await this.writeEvaluated(tx, ctx, input, touched, { actorId: actor.id, now, source, gaugeDue: (gid) => (gid ? (gaugeById.get(gid)?.calibrationDueOn ?? null) : null) });
      if (ctx.lot.status === 'received') await tx.update(lot).set({ status: 'inspecting', updatedAt: now }).where(eq(lot.id, lotId));
      await this.audit.record(tx, {
        actorId: actor.id,
        actorEmail: actor.email,
        action: source === 'import' ? 'lot.readings_imported' : 'lot.readings_saved',
        entity: 'lot',
        entityId: lotId,
        after: input.length <= 50 ? { readings: input.map((r) => ({ sample: r.sampleId, code: r.characteristicCode, values: r.values, pass: r.pass ?? null, gauge: r.gaugeId ?? null })) } : { count: input.length, cores: touched.length },
      });
      return { saved: input.length };
    };
    return txIn ? work(txIn) : this.db.transaction(work);
  }

  /**
   * Server-side evaluation (the authority): merges the touched cores' stored readings with the new
   * ones, evaluates each core, and upserts entered and derived rows with their value and
   * conformance. Rows travel as parallel arrays through unnest: one statement per batch.
   */
  private async writeEvaluated(
    tx: Tx,
    ctx: Awaited<ReturnType<LotsService['context']>>,
    input: ReadingInput[],
    sampleIds: string[],
    o: { actorId: string; now: Date; source: 'bench' | 'import'; gaugeDue: (gaugeId?: string | null) => string | null },
  ): Promise<void> {
    const chars = ctx.chars.map(evalChar);
    const p = evalPart(ctx.part);
    const existing = await tx
      .select({ sampleId: reading.sampleId, code: reading.characteristicCode, values: reading.values, pass: reading.pass })
      .from(reading)
      .where(and(eq(reading.lotId, ctx.lot.id), inArray(reading.sampleId, sampleIds)));
    const bySample = new Map<string, Record<string, RawReading>>();
    for (const r of existing) {
      const m = bySample.get(r.sampleId) ?? {};
      m[r.code] = { values: r.values, pass: r.pass };
      bySample.set(r.sampleId, m);
    }
    for (const r of input) {
      const m = bySample.get(r.sampleId) ?? {};
      m[r.characteristicCode] = { values: r.values ?? [], pass: r.pass ?? null };
      bySample.set(r.sampleId, m);
    }
    const evals = new Map<string, ReturnType<typeof evaluateSample>>();
    for (const sid of sampleIds) evals.set(sid, evaluateSample(chars, p, bySample.get(sid) ?? {}));

    const rows: Row[] = input.map((r) => {
      const e = evals.get(r.sampleId)![r.characteristicCode];
      return { sampleId: r.sampleId, code: r.characteristicCode, values: r.values ?? [], value: e?.value ?? null, pass: r.pass ?? null, conforming: e?.conforming ?? null, note: r.note ?? null, gaugeId: r.gaugeId ?? null, gaugeDueOn: o.gaugeDue(r.gaugeId) };
    });
    for (const sid of sampleIds) {
      const ev = evals.get(sid)!;
      for (const c of chars) {
        if (c.kind !== 'derived' || ev[c.code].value == null) continue;
        rows.push({ sampleId: sid, code: c.code, values: [], value: ev[c.code].value, pass: null, conforming: ev[c.code].conforming, note: null, gaugeId: null, gaugeDueOn: null });
      }
    }
    for (let i = 0; i < rows.length; i += 5000) await this.upsertRows(tx, ctx.lot.id, rows.slice(i, i + 5000), o);
  }

  private async upsertRows(tx: Tx, lotId: string, rows: Row[], o: { actorId: string; now: Date; source: 'bench' | 'import' }): Promise<void> {
    const col = <K extends keyof Row>(k: K) => sql.param(rows.map((r) => r[k]));
    // float8[] per row travels as its array literal; unnest of a 2-D array would flatten it.
    const literals = sql.param(rows.map((r) => `{${r.values.join(',')}}`));
    await tx.execute(sql`
      insert into reading (lot_id, sample_id, characteristic_code, values, value, pass, conforming, note, gauge_id, gauge_due_on, entered_by, entered_at, source)
      select ${lotId}::uuid, u.sample_id, u.code, u.vals::float8[], u.value, u.pass, u.conforming, u.note, u.gauge_id, u.gauge_due_on, ${o.actorId}::uuid, ${o.now.toISOString()}::timestamptz, ${o.source}
      from unnest(${col('sampleId')}::uuid[], ${col('code')}::text[], ${literals}::text[], ${col('value')}::float8[], ${col('pass')}::boolean[],
                  ${col('conforming')}::boolean[], ${col('note')}::text[], ${col('gaugeId')}::uuid[], ${col('gaugeDueOn')}::date[])
        as u(sample_id, code, vals, value, pass, conforming, note, gauge_id, gauge_due_on)
      on conflict (sample_id, characteristic_code) do update set
        values = excluded.values, value = excluded.value, pass = excluded.pass, conforming = excluded.conforming, note = excluded.note,
        gauge_id = excluded.gauge_id, gauge_due_on = excluded.gauge_due_on, entered_by = excluded.entered_by, entered_at = excluded.entered_at, source = excluded.source`);
  }

  /** The proposal from the stored results: nonconforming cores against Ac/Re; a critical failure rejects. */
  async proposal(tx: Db | Tx, lotId: string) {
    const ctx = await this.context(tx, lotId);
    const rows = await tx.select().from(reading).where(eq(reading.lotId, lotId));
    const chars = ctx.chars.map(evalChar);
    const bySample = new Map<string, Record<string, RawReading>>();
    for (const r of rows) {
      const m = bySample.get(r.sampleId) ?? {};
      m[r.characteristicCode] = { values: r.values, pass: r.pass };
      bySample.set(r.sampleId, m);
    }
    const perCore = ctx.samples.map((s) => evaluateSample(chars, evalPart(ctx.part), bySample.get(s.id) ?? {}));
    return { ctx, ...proposeDecision(perCore, chars, ctx.lot.sampling.accept, ctx.lot.sampling.reject) };
  }

  async decide(actor: SessionUser, lotId: string, body: { decision: 'accept' | 'reject'; comment: string; version: number }): Promise<Lot> {
    await this.db.transaction(async (tx) => {
      const [locked] = await tx.select().from(lot).where(eq(lot.id, lotId)).for('update');
      if (!locked) throw notFound('lot');
      if (locked.version !== body.version) throw stale('lot');
      if (!(OPEN_STATUSES as readonly string[]).includes(locked.status)) throw conflict(`This lot was already decided (${locked.status}).`);
      const prop = await this.proposal(tx, lotId);
      if (body.decision === 'accept') {
        if (prop.proposal === null) throw new BadRequestException({ error: 'validation', message: `The lot cannot be accepted yet: ${prop.reason}.`, fields: { decision: prop.reason } });
        if (prop.proposal === 'reject') throw conflict(`The results require rejection (${prop.reason}). A nonconforming lot is dispositioned through review, not accepted here.`);
      }
      const now = clockNow();
      const status = body.decision === 'accept' ? 'released' : 'on-hold';
      await tx
        .update(lot)
        .set({ status, decision: body.decision, decisionComment: body.comment, nonconformingCount: prop.nonconforming, decidedBy: actor.id, decidedAt: now, version: locked.version + 1, updatedAt: now })
        .where(eq(lot.id, lotId));
      // Drift watch reads every charted history with this decision in it. That happens before
      // the first audit record, whose lock on the audit chain every other audited write waits for.
      const signals = await this.spc.planSignals(tx, locked.supplierId, locked.partId, { lotId, actor });
      await this.audit.record(tx, {
        actorId: actor.id,
        actorEmail: actor.email,
        action: body.decision === 'accept' ? 'lot.accepted' : 'lot.rejected',
        entity: 'lot',
        entityId: lotId,
        before: { status: locked.status },
        after: { status, decision: body.decision, nonconforming: prop.nonconforming, proposal: prop.proposal, proposalReason: prop.reason },
        reason: body.comment,
      });
      await this.updateSwitching(tx, actor, locked, body.decision === 'accept', prop.nonconforming);
      // Drift watch: new run-rule violations at this lot's points become drift signals.
      await this.spc.applySignals(tx, signals);
      // Corrective actions in verification count accepted lots of this supplier × part.
      await recordLotDecisionForCorrectiveActions(tx, locked, body.decision === 'accept', actor);
    });
    return this.get(actor, lotId);
  }

  /** ISO 2859-1 §9.3: the decision moves the supplier × part switching state. */
  private async updateSwitching(tx: Tx, actor: SessionUser, l: typeof lot.$inferSelect, accepted: boolean, nonconforming: number): Promise<void> {
    const sampling = l.sampling;
    if (sampling.kind !== 'aql' || !sampling.plan) return; // zero-acceptance and single-core lots do not switch
    const before = await this.lockSwitching(tx, l.supplierId, l.partId);
    if (before.discontinued) return;
    const step = nextSwitchingState(before, {
      accepted,
      nonconforming: Math.min(nonconforming, sampling.sampleSize),
      plan: sampling.plan as never,
      aql: sampling.aql!,
      level: sampling.level as never,
      lotSize: sampling.lotSize,
    });
    await tx.update(switchingState).set({ state: step.state, updatedAt: clockNow() }).where(and(eq(switchingState.supplierId, l.supplierId), eq(switchingState.partId, l.partId)));
    await tx.insert(switchingEvent).values({ supplierId: l.supplierId, partId: l.partId, lotId: l.id, event: step.event ?? null, reason: step.reason, before, after: step.state, actorId: actor.id, at: clockNow() });
    if (step.event) {
      await this.audit.record(tx, { actorId: actor.id, actorEmail: actor.email, action: `switching.${step.event}`, entity: 'switching_state', entityId: `${l.supplierId}:${l.partId}`, before, after: step.state, reason: step.reason });
    }
  }
}
