import { BadRequestException, Inject, Injectable } from '@nestjs/common';
import { and, asc, count, desc, eq, max, sql } from 'drizzle-orm';
import { now as clockNow } from '../common/clock';
import { DB, type Db, type Tx } from '../db/client';
import { inspectionPlan, part, planCharacteristic } from '../db/schema';
import { AuditRepository } from '../audit/audit.repository';
import { conflict, notFound, stale } from '../common/errors';
import { offsetOf, orderFrom } from '../common/paging';
import { ValidationFailed } from '../common/zod.pipe';
import { characteristicInputSchema, type Characteristic, type CreatePlanInput, type Plan, type PlanChange, type PlanSummary, type UpdatePlanInput, type planListQuerySchema } from '../../shared/schemas/master-data';
import type { SessionUser } from '../../shared/schemas/auth';
import { planTemplate, PLAN_TEMPLATES } from '../../shared/compute/plan-templates';
import { diffPlans } from '../../shared/compute/plan-diff';
import type { z } from 'zod';

type PlanRow = typeof inspectionPlan.$inferSelect;
type CharRow = typeof planCharacteristic.$inferSelect;
type CharInput = z.output<typeof characteristicInputSchema>;

function toCharacteristic(c: CharRow): Characteristic {
  return {
    id: c.id,
    seq: c.seq,
    code: c.code,
    name: c.name,
    kind: c.kind,
    unit: c.unit as Characteristic['unit'],
    nominal: c.nominal,
    lsl: c.lsl,
    usl: c.usl,
    method: c.method,
    gaugeKind: c.gaugeKind as Characteristic['gaugeKind'],
    layout: c.layout as Characteristic['layout'],
    angles: c.angles,
    levels: c.levels,
    readingsPerSample: c.readingsPerSample,
    derivedFormula: c.derivedFormula as Characteristic['derivedFormula'],
    inputs: c.inputs ?? null,
    chartKind: c.chartKind as Characteristic['chartKind'],
    subgroupSize: c.subgroupSize,
    severity: c.severity,
    wearDriven: c.wearDriven,
    ruleSet: c.ruleSet as Characteristic['ruleSet'],
  };
}

function summary(p: PlanRow, partRow: { partNumber: string; revision: string }): Omit<Plan, 'characteristics'> {
  return {
    id: p.id,
    partId: p.partId,
    partNumber: partRow.partNumber,
    partRevision: partRow.revision,
    revision: p.revision,
    status: p.status,
    samplingKind: p.samplingKind,
    inspectionLevel: p.inspectionLevel as Plan['inspectionLevel'],
    aql: p.aql,
    zeroSampleSize: p.zeroSampleSize,
    notes: p.notes,
    basedOnPlanId: p.basedOnPlanId,
    createdAt: p.createdAt.toISOString(),
    activatedAt: p.activatedAt?.toISOString() ?? null,
    supersededAt: p.supersededAt?.toISOString() ?? null,
    version: p.version,
  };
}

/** The number of readings one sample takes for a characteristic, from its layout. */
export function readingsFor(c: Pick<Characteristic, 'layout' | 'angles' | 'levels' | 'readingsPerSample'>): number {
  switch (c.layout) {
    case 'two-point':
    case 'heights':
      return c.angles ?? 1;
    case 'probed':
      return (c.angles ?? 1) * (c.levels ?? 1);
    case 'pass-fail':
      return 0;
    default:
      return c.readingsPerSample;
  }
}

function charValues(planId: string, list: CharInput[]) {
  return list.map((c, i) => ({
    planId,
    seq: i + 1,
    code: c.code,
    name: c.name,
    kind: c.kind,
    unit: c.unit ?? null,
    nominal: c.nominal ?? null,
    lsl: c.lsl ?? null,
    usl: c.usl ?? null,
    method: c.method ?? null,
    gaugeKind: c.gaugeKind ?? null,
    layout: c.layout,
    angles: c.angles ?? null,
    levels: c.levels ?? null,
    readingsPerSample: c.readingsPerSample,
    derivedFormula: c.derivedFormula ?? null,
    inputs: c.inputs ?? null,
    chartKind: c.chartKind,
    subgroupSize: c.subgroupSize ?? null,
    severity: c.severity,
    wearDriven: c.wearDriven,
    ruleSet: c.ruleSet,
  }));
}

/** Derived characteristics must name inputs that exist in the same plan. */
function checkInputs(list: CharInput[]): void {
  const codes = new Set(list.map((c) => c.code));
  const fields: Record<string, string> = {};
  list.forEach((c, i) => {
    for (const code of c.inputs ?? []) if (!codes.has(code)) fields[`characteristics.${i}.inputs`] = `Input ${code} is not a characteristic of this plan`;
  });
  if (Object.keys(fields).length) throw new ValidationFailed(fields);
}

const DRAFT_ONLY = 'Active and superseded plans are never edited. Use “Revise” to copy this plan into a new draft revision, then change the draft.';

@Injectable()
export class PlansService {
  constructor(
    @Inject(DB) private readonly db: Db,
    private readonly audit: AuditRepository,
  ) {}

  async list(q: z.infer<typeof planListQuerySchema>): Promise<{ items: PlanSummary[]; total: number }> {
    const where = and(q.partId ? eq(inspectionPlan.partId, q.partId) : undefined, q.status ? eq(inspectionPlan.status, q.status) : undefined);
    const nChars = this.db.select({ planId: planCharacteristic.planId, n: count().as('n') }).from(planCharacteristic).groupBy(planCharacteristic.planId).as('n_chars');
    const rows = await this.db
      .select({ p: inspectionPlan, partNumber: part.partNumber, partRevision: part.revision, n: nChars.n })
      .from(inspectionPlan)
      .innerJoin(part, eq(part.id, inspectionPlan.partId))
      .leftJoin(nChars, eq(nChars.planId, inspectionPlan.id))
      .where(where)
      .orderBy(...orderFrom(q.sort, { revision: inspectionPlan.revision, createdAt: inspectionPlan.createdAt }, desc(inspectionPlan.createdAt)), desc(inspectionPlan.revision))
      .limit(q.pageSize)
      .offset(offsetOf(q.page, q.pageSize));
    const [{ n }] = await this.db.select({ n: count() }).from(inspectionPlan).where(where);
    return {
      items: rows.map((r) => ({ ...summary(r.p, { partNumber: r.partNumber, revision: r.partRevision }), characteristicCount: Number(r.n ?? 0) })),
      total: n,
    };
  }

  async get(id: string, tx: Db | Tx = this.db): Promise<Plan> {
    const [row] = await tx.select({ p: inspectionPlan, partNumber: part.partNumber, partRevision: part.revision }).from(inspectionPlan).innerJoin(part, eq(part.id, inspectionPlan.partId)).where(eq(inspectionPlan.id, id));
    if (!row) throw notFound('inspection plan');
    const chars = await tx.select().from(planCharacteristic).where(eq(planCharacteristic.planId, id)).orderBy(asc(planCharacteristic.seq));
    return { ...summary(row.p, { partNumber: row.partNumber, revision: row.partRevision }), characteristics: chars.map(toCharacteristic) };
  }

  private async nextRevision(tx: Tx, partId: string): Promise<number> {
    // Serialise plan changes per part: the part row is the lock.
    const [p] = await tx.select({ id: part.id }).from(part).where(eq(part.id, partId)).for('update');
    if (!p) throw new ValidationFailed({ partId: 'No such part' });
    const [{ m }] = await tx.select({ m: max(inspectionPlan.revision) }).from(inspectionPlan).where(eq(inspectionPlan.partId, partId));
    return (m ?? 0) + 1;
  }

  async create(actor: SessionUser, input: CreatePlanInput & { characteristics: CharInput[] }, basedOnPlanId: string | null = null, action = 'plan.created'): Promise<Plan> {
    checkInputs(input.characteristics);
    return this.db.transaction(async (tx) => {
      const revision = await this.nextRevision(tx, input.partId);
      const [row] = await tx
        .insert(inspectionPlan)
        .values({
          partId: input.partId,
          revision,
          status: 'draft',
          samplingKind: input.samplingKind,
          inspectionLevel: input.samplingKind === 'aql' ? (input.inspectionLevel ?? null) : null,
          aql: input.samplingKind === 'aql' ? (input.aql ?? null) : null,
          zeroSampleSize: input.samplingKind === 'zero-acceptance' ? (input.zeroSampleSize ?? null) : null,
          notes: input.notes ?? null,
          basedOnPlanId,
          createdBy: actor.id,
        })
        .returning();
      if (input.characteristics.length) await tx.insert(planCharacteristic).values(charValues(row.id, input.characteristics));
      const plan = await this.get(row.id, tx);
      await this.audit.record(tx, { actorId: actor.id, actorEmail: actor.email, action, entity: 'inspection_plan', entityId: row.id, after: plan, reason: basedOnPlanId ? `revision of ${basedOnPlanId}` : null });
      return plan;
    });
  }

  async update(actor: SessionUser, id: string, input: UpdatePlanInput): Promise<Plan> {
    return this.db.transaction(async (tx) => {
      const [row] = await tx.select().from(inspectionPlan).where(eq(inspectionPlan.id, id)).for('update');
      if (!row) throw notFound('inspection plan');
      if (row.status !== 'draft') throw conflict(DRAFT_ONLY);
      if (row.version !== input.version) throw stale('plan');
      const before = await this.get(id, tx);
      const kind = input.samplingKind ?? row.samplingKind;
      const merged = {
        samplingKind: kind,
        inspectionLevel: kind === 'aql' ? (input.inspectionLevel !== undefined ? input.inspectionLevel : row.inspectionLevel) : null,
        aql: kind === 'aql' ? (input.aql !== undefined ? input.aql : row.aql) : null,
        zeroSampleSize: kind === 'zero-acceptance' ? (input.zeroSampleSize !== undefined ? input.zeroSampleSize : row.zeroSampleSize) : null,
      };
      if (kind === 'aql' && (!merged.inspectionLevel || merged.aql == null)) throw new ValidationFailed({ aql: 'An AQL plan needs a level and an AQL' });
      if (kind === 'zero-acceptance' && merged.zeroSampleSize == null) throw new ValidationFailed({ zeroSampleSize: 'Give the fixed sample size' });
      await tx
        .update(inspectionPlan)
        .set({ ...merged, notes: input.notes !== undefined ? input.notes : row.notes, version: row.version + 1, updatedAt: clockNow() })
        .where(eq(inspectionPlan.id, id));
      if (input.characteristics) {
        const chars = input.characteristics.map((c) => characteristicInputSchema.parse(c));
        checkInputs(chars);
        await tx.delete(planCharacteristic).where(eq(planCharacteristic.planId, id));
        if (chars.length) await tx.insert(planCharacteristic).values(charValues(id, chars));
      }
      const after = await this.get(id, tx);
      await this.audit.record(tx, { actorId: actor.id, actorEmail: actor.email, action: 'plan.updated', entity: 'inspection_plan', entityId: id, before, after });
      return after;
    });
  }

  /** Draft → active; the part's previous active plan becomes superseded in the same transaction. */
  async activate(actor: SessionUser, id: string, version: number): Promise<Plan> {
    return this.db.transaction(async (tx) => {
      const [head] = await tx.select({ partId: inspectionPlan.partId }).from(inspectionPlan).where(eq(inspectionPlan.id, id));
      if (!head) throw notFound('inspection plan');
      await tx.select({ id: part.id }).from(part).where(eq(part.id, head.partId)).for('update');
      const [row] = await tx.select().from(inspectionPlan).where(eq(inspectionPlan.id, id)).for('update');
      if (row.status !== 'draft') throw conflict(`Only a draft can be activated; this plan is ${row.status}.`);
      if (row.version !== version) throw stale('plan');
      const [{ n }] = await tx.select({ n: count() }).from(planCharacteristic).where(eq(planCharacteristic.planId, id));
      if (n === 0) throw new BadRequestException({ error: 'validation', message: 'A plan with no characteristics cannot be activated. Add what to measure or check first.', fields: { characteristics: 'Add at least one characteristic' } });
      const now = clockNow();
      const previous = await tx
        .update(inspectionPlan)
        .set({ status: 'superseded', supersededAt: now, version: sqlInc(), updatedAt: now })
        .where(and(eq(inspectionPlan.partId, row.partId), eq(inspectionPlan.status, 'active')))
        .returning({ id: inspectionPlan.id, revision: inspectionPlan.revision });
      await tx.update(inspectionPlan).set({ status: 'active', activatedAt: now, activatedBy: actor.id, version: row.version + 1, updatedAt: now }).where(eq(inspectionPlan.id, id));
      for (const p of previous) {
        await this.audit.record(tx, { actorId: actor.id, actorEmail: actor.email, action: 'plan.superseded', entity: 'inspection_plan', entityId: p.id, before: { status: 'active' }, after: { status: 'superseded', by: id } });
      }
      await this.audit.record(tx, { actorId: actor.id, actorEmail: actor.email, action: 'plan.activated', entity: 'inspection_plan', entityId: id, before: { status: 'draft' }, after: { status: 'active', supersedes: previous.map((p) => p.id) } });
      return this.get(id, tx);
    });
  }

  /** Copies any plan into a new draft revision of the same part. */
  async revise(actor: SessionUser, id: string): Promise<Plan> {
    const src = await this.get(id);
    const [openDraft] = await this.db
      .select({ revision: inspectionPlan.revision })
      .from(inspectionPlan)
      .where(and(eq(inspectionPlan.partId, src.partId), eq(inspectionPlan.status, 'draft')));
    if (openDraft) throw conflict(`Revision ${openDraft.revision} of this part is already a draft: change that draft (or activate it) instead of starting another.`);
    const characteristics = src.characteristics.map(({ id: _id, seq: _seq, ...c }) => characteristicInputSchema.parse(c));
    return this.create(
      actor,
      { partId: src.partId, samplingKind: src.samplingKind, inspectionLevel: src.inspectionLevel, aql: src.aql as never, zeroSampleSize: src.zeroSampleSize, notes: src.notes, characteristics },
      src.id,
      'plan.revised',
    );
  }

  async fromTemplate(actor: SessionUser, partId: string, template: string): Promise<Plan> {
    const [p] = await this.db.select().from(part).where(eq(part.id, partId));
    if (!p) throw new ValidationFailed({ partId: 'No such part' });
    const t = planTemplate(template as never, p);
    const characteristics = t.characteristics.map((c) => characteristicInputSchema.parse(c));
    return this.create(actor, { partId, samplingKind: 'aql', inspectionLevel: 'II', aql: 1.0, notes: `From the ${t.name} template`, characteristics }, null, 'plan.created_from_template');
  }

  templates() {
    return PLAN_TEMPLATES;
  }

  /** What changed from `againstId` (default: the plan this one was revised from, else the previous revision). */
  async changes(id: string, againstId?: string): Promise<{ from: PlanSummaryRef | null; to: PlanSummaryRef; changes: PlanChange[] }> {
    const after = await this.get(id);
    let beforeId = againstId ?? after.basedOnPlanId;
    if (!beforeId) {
      const [prev] = await this.db
        .select({ id: inspectionPlan.id })
        .from(inspectionPlan)
        .where(and(eq(inspectionPlan.partId, after.partId), eq(inspectionPlan.revision, after.revision - 1)));
      beforeId = prev?.id ?? null;
    }
    if (!beforeId) return { from: null, to: ref(after), changes: diffPlans(emptyPlan, after) };
    const before = await this.get(beforeId);
    if (before.partId !== after.partId) throw new ValidationFailed({ against: 'Compare revisions of the same part only' });
    return { from: ref(before), to: ref(after), changes: diffPlans(before, after) };
  }
}

interface PlanSummaryRef { id: string; revision: number; status: string }
const ref = (p: Plan): PlanSummaryRef => ({ id: p.id, revision: p.revision, status: p.status });
const emptyPlan = { samplingKind: null, inspectionLevel: null, aql: null, zeroSampleSize: null, notes: null, characteristics: [] } as never;

const sqlInc = () => sql`${inspectionPlan.version} + 1`;
