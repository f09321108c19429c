import { ConflictException, ForbiddenException, Inject, Injectable } from '@nestjs/common';
import { and, asc, count, desc, eq, ilike, inArray, ne, notInArray, or, sql, type SQL } from 'drizzle-orm';
import { CONFIG, type AppConfig } from '../config';
import { DB, type Db, type DbOrTx, type Tx } from '../db/client';
import { appUser, auditEvent, correctiveAction, correctiveActionEvidence, correctiveActionStep, lot, ncr, part, supplier, type CorrectiveActionRow, type CorrectiveActionStepRow } from '../db/schema';
import { AuditRepository } from '../audit/audit.repository';
import { OutboxService } from '../mail/outbox.service';
import { notFound, stale } from '../common/errors';
import { likeEscape, offsetOf, orderFrom } from '../common/paging';
import { ValidationFailed, fieldsFromZod } from '../common/zod.pipe';
import { now } from '../common/clock';
import { addCalendarDays, addWorkingDays, isoDateOf } from '../../shared/compute/working-days';
import {
  EIGHT_D_STEPS, SCAR_MANUAL_ACTOR, SCAR_MANUAL_TRANSITIONS, derivedScarStatus, scarPath, stepOpens, type EightDStep, type ScarStatus, type StepState,
} from '../../shared/compute/workflow';
import {
  SCAR_STATUS_LABELS, STEP_INFO, STEP_STATUS_LABELS, stepAnswerSchemas,
  type CreateScarInput, type PutStepInput, type ReviewStepInput, type Scar, type ScarListQuery, type ScarStep, type ScarSummary, type ScarTransitionInput,
} from '../../shared/schemas/corrective-action';
import type { SessionUser } from '../../shared/schemas/auth';
import { nextDocumentNumber } from '../ncrs/numbering';
import { illegalTransition } from '../ncrs/ncrs.service';
import { issuedMail, returnedMail } from './scar-mail';

const NO_SUPPLIER = '00000000-0000-0000-0000-000000000000';
const MAX_DRAFT_CHARS = 64_000;
const DONE_STEP = ['submitted', 'accepted'] as const;

type StepRow = CorrectiveActionStepRow;

/** The step an audit event concerns, when it concerns one. */
const stepOfAudit = (after: unknown): string | null => {
  const step = (after as { step?: unknown } | null)?.step;
  return typeof step === 'string' ? step : null;
};

export interface DueDates {
  containment: string;
  rootCause: string;
  closure: string;
}

@Injectable()
export class CorrectiveActionsService {
  constructor(
    @Inject(DB) private readonly db: Db,
    @Inject(CONFIG) private readonly cfg: AppConfig,
    private readonly audit: AuditRepository,
    private readonly outbox: OutboxService,
  ) {}

  scope(user: SessionUser): SQL | undefined {
    return user.role === 'supplier' ? eq(correctiveAction.supplierId, user.supplierId ?? NO_SUPPLIER) : undefined;
  }

  /**
   * Response times from the day of issue (config: containment and root cause in working days,
   * closure in calendar days, moved off a weekend to the next working day).
   */
  dueDates(issuedOn: string): DueDates {
    return {
      containment: addWorkingDays(issuedOn, this.cfg.SCAR_CONTAINMENT_WORKING_DAYS),
      rootCause: addWorkingDays(issuedOn, this.cfg.SCAR_ROOT_CAUSE_WORKING_DAYS),
      closure: addWorkingDays(addCalendarDays(issuedOn, this.cfg.SCAR_CLOSURE_DAYS), 0),
    };
  }

  static dueOf(step: EightDStep, d: DueDates): string {
    return step <= 'D3' ? d.containment : step <= 'D5' ? d.rootCause : d.closure;
  }

  // ───────── reading ─────────

  private selectJoined(tx: DbOrTx) {
    return tx
      .select({
        ca: correctiveAction,
        s: { code: supplier.code, name: supplier.name, contactEmails: supplier.contactEmails },
        p: { partNumber: part.partNumber, revision: part.revision },
        ncrNumber: ncr.number,
        nextDueOn: sql<string | null>`(select min(${correctiveActionStep.dueOn})::text from ${correctiveActionStep} where ${correctiveActionStep.correctiveActionId} = ${correctiveAction.id} and ${correctiveActionStep.status} not in ('submitted', 'accepted') and (${correctiveActionStep.step} <> 'D8' or ${correctiveAction.status} in ('accepted', 'verifying')))`,
        nextDueStep: sql<EightDStep | null>`(select ${correctiveActionStep.step} from ${correctiveActionStep} where ${correctiveActionStep.correctiveActionId} = ${correctiveAction.id} and ${correctiveActionStep.status} not in ('submitted', 'accepted') and (${correctiveActionStep.step} <> 'D8' or ${correctiveAction.status} in ('accepted', 'verifying')) order by ${correctiveActionStep.dueOn}, ${correctiveActionStep.step} limit 1)`,
      })
      .from(correctiveAction)
      .innerJoin(supplier, eq(supplier.id, correctiveAction.supplierId))
      .innerJoin(ncr, eq(ncr.id, correctiveAction.ncrId))
      .leftJoin(part, eq(part.id, correctiveAction.partId));
  }

  private summaryOf(r: Awaited<ReturnType<CorrectiveActionsService['selectJoined']>>[number], today: string): ScarSummary {
    const ca = r.ca;
    const open = ca.status !== 'closed';
    return {
      id: ca.id,
      number: ca.number,
      status: ca.status,
      title: ca.title,
      supplierId: ca.supplierId,
      supplierCode: r.s.code,
      supplierName: r.s.name,
      partId: ca.partId,
      partNumber: r.p?.partNumber ?? null,
      partRevision: r.p?.revision ?? null,
      ncrId: ca.ncrId,
      ncrNumber: r.ncrNumber,
      defectCodes: ca.defectCodes,
      issuedAt: ca.issuedAt.toISOString(),
      nextDueOn: open ? r.nextDueOn : null,
      nextDueStep: open ? r.nextDueStep : null,
      overdue: open && !!r.nextDueOn && r.nextDueOn < today,
      version: ca.version,
    };
  }

  async list(user: SessionUser, q: ScarListQuery): Promise<{ items: ScarSummary[]; total: number }> {
    const where = and(
      this.scope(user),
      q.status === 'active' ? ne(correctiveAction.status, 'closed') : q.status ? eq(correctiveAction.status, q.status) : undefined,
      q.supplierId ? eq(correctiveAction.supplierId, q.supplierId) : undefined,
      q.ncrId ? eq(correctiveAction.ncrId, q.ncrId) : undefined,
      q.q ? or(ilike(correctiveAction.number, likeEscape(q.q)), ilike(correctiveAction.title, likeEscape(q.q)), ilike(ncr.number, likeEscape(q.q))) : undefined,
    );
    const rows = await this.selectJoined(this.db)
      .where(where)
      .orderBy(...orderFrom(q.sort, { issuedAt: correctiveAction.issuedAt, number: correctiveAction.number, status: correctiveAction.status }, desc(correctiveAction.issuedAt)))
      .limit(q.pageSize)
      .offset(offsetOf(q.page, q.pageSize));
    const [{ n }] = await this.db.select({ n: count() }).from(correctiveAction).innerJoin(ncr, eq(ncr.id, correctiveAction.ncrId)).where(where);
    const today = isoDateOf(now());
    return { items: rows.map((r) => this.summaryOf(r, today)), total: n };
  }

  async get(user: SessionUser, id: string, tx: DbOrTx = this.db): Promise<Scar> {
    const [r] = await this.selectJoined(tx).where(and(eq(correctiveAction.id, id), this.scope(user)));
    if (!r) throw notFound('corrective action');
    const ca = r.ca;
    const internal = user.role !== 'supplier';
    const today = isoDateOf(now());
    const [steps, evidence, lots, recurrence, history] = await Promise.all([
      tx.select().from(correctiveActionStep).where(eq(correctiveActionStep.correctiveActionId, id)).orderBy(asc(correctiveActionStep.step)),
      tx.select().from(correctiveActionEvidence).where(eq(correctiveActionEvidence.correctiveActionId, id)).orderBy(asc(correctiveActionEvidence.createdAt)),
      ca.verifyLots.length ? tx.select({ id: lot.id, ref: lot.ref }).from(lot).where(inArray(lot.id, ca.verifyLots.map((v) => v.lotId))) : Promise.resolve([]),
      ca.recurrenceNcrId ? tx.select({ number: ncr.number }).from(ncr).where(eq(ncr.id, ca.recurrenceNcrId)).then((x) => x[0]) : Promise.resolve(undefined),
      internal
        ? tx.select({ at: auditEvent.at, action: auditEvent.action, actorEmail: auditEvent.actorEmail, reason: auditEvent.reason, after: auditEvent.after }).from(auditEvent).where(and(eq(auditEvent.entity, 'corrective_action'), eq(auditEvent.entityId, id))).orderBy(asc(auditEvent.id))
        : Promise.resolve(null),
    ]);
    const refs = new Map(lots.map((l) => [l.id, l.ref]));
    return {
      ...this.summaryOf(r, today),
      problem: ca.problem,
      recipients: internal ? ca.recipients : [],
      acknowledgedAt: ca.acknowledgedAt?.toISOString() ?? null,
      acceptedAt: ca.acceptedAt?.toISOString() ?? null,
      closedAt: ca.closedAt?.toISOString() ?? null,
      steps: steps.map((s): ScarStep => ({
        step: s.step,
        title: STEP_INFO[s.step].title,
        status: s.status,
        answer: s.answer ?? null,
        draft: s.draft ?? null,
        draftSavedAt: s.draftSavedAt?.toISOString() ?? null,
        submittedAt: s.submittedAt?.toISOString() ?? null,
        reviewedAt: s.reviewedAt?.toISOString() ?? null,
        reviewDecision: s.reviewDecision,
        reviewComment: s.reviewComment,
        dueOn: s.dueOn,
        overdue: ca.status !== 'closed' && !!s.dueOn && s.dueOn < today && !(DONE_STEP as readonly string[]).includes(s.status),
        version: s.version,
        evidence: evidence
          .filter((e) => e.step === s.step)
          .map((e) => ({ id: e.id, step: e.step, name: e.name, contentType: e.contentType, bytes: e.bytes, caption: e.caption, createdAt: e.createdAt.toISOString() })),
      })),
      verification: {
        required: ca.verifyLotsRequired,
        passed: ca.verifyLots.length,
        lots: ca.verifyLots.map((v) => ({ lotId: v.lotId, ref: refs.get(v.lotId) ?? null, at: v.at })),
        startedAt: ca.verifyingSince?.toISOString() ?? null,
        recurrence: ca.recurrenceAt ? { lotId: ca.recurrenceLotId, ncrId: ca.recurrenceNcrId, ncrNumber: recurrence?.number ?? null, at: ca.recurrenceAt.toISOString() } : null,
      },
      mail: internal ? await this.outbox.forEntity(id) : null,
      history: history ? history.map((h) => ({ at: h.at.toISOString(), action: h.action, actorEmail: h.actorEmail, reason: h.reason, detail: stepOfAudit(h.after) })) : null,
    };
  }

  // ───────── issuing ─────────

  /** Where the mails go: the supplier's contacts and its active users, unless the engineer names them. */
  private async recipientsFor(tx: Tx, supplierId: string, contactEmails: string[]): Promise<string[]> {
    const users = await tx.select({ email: appUser.email }).from(appUser).where(and(eq(appUser.supplierId, supplierId), eq(appUser.role, 'supplier'), eq(appUser.active, true)));
    return [...new Set([...contactEmails, ...users.map((u) => u.email)].map((e) => e.toLowerCase()))];
  }

  async create(actor: SessionUser, input: CreateScarInput): Promise<Scar> {
    const id = await this.db.transaction(async (tx) => {
      const [n] = await tx.select().from(ncr).where(eq(ncr.id, input.ncrId)).for('update');
      if (!n) throw new ValidationFailed({ ncrId: 'No such NCR' });
      if (!n.supplierId) throw new ValidationFailed({ ncrId: `${n.number} names no supplier; a corrective action goes to the supplier who caused the nonconformance` });
      const [open] = await tx.select({ number: correctiveAction.number }).from(correctiveAction).where(and(eq(correctiveAction.ncrId, n.id), ne(correctiveAction.status, 'closed')));
      if (open) throw new ConflictException({ error: 'conflict', message: `${n.number} already has ${open.number} in progress` });
      const [s] = await tx.select().from(supplier).where(eq(supplier.id, n.supplierId));
      const recipients = input.recipients?.length ? [...new Set(input.recipients.map(String))] : await this.recipientsFor(tx, s.id, s.contactEmails);
      if (!recipients.length) throw new ValidationFailed({ recipients: `${s.name} has no contact e-mail and no user: add a contact to the supplier first` });
      const [p] = n.partId ? await tx.select().from(part).where(eq(part.id, n.partId)) : [];
      const [l] = n.lotId ? await tx.select().from(lot).where(eq(lot.id, n.lotId)) : [];

      const at = now();
      const issuedOn = isoDateOf(at);
      const due = this.dueDates(issuedOn);
      const { seq, number } = await nextDocumentNumber(tx, 'scar', at.getUTCFullYear());
      const title = input.title ?? n.title;
      const problem = input.problem ?? `Required: ${n.requirement}\nFound: ${n.found}`;
      const [ca] = await tx
        .insert(correctiveAction)
        .values({ number, year: at.getUTCFullYear(), seq, ncrId: n.id, supplierId: s.id, partId: n.partId, title, problem, defectCodes: n.defectCodes, recipients, status: 'issued', issuedBy: actor.id, issuedAt: at, verifyLotsRequired: this.cfg.SCAR_VERIFY_LOTS, createdAt: at, updatedAt: at })
        .returning();
      const initial = EIGHT_D_STEPS.map((step) => ({ step, status: 'locked' as const }));
      await tx.insert(correctiveActionStep).values(
        EIGHT_D_STEPS.map((step) => ({
          correctiveActionId: ca.id,
          step,
          status: stepOpens(step, initial, 'issued') ? ('open' as const) : ('locked' as const),
          dueOn: CorrectiveActionsService.dueOf(step, due),
          updatedAt: at,
        })),
      );
      await this.audit.record(tx, {
        actorId: actor.id,
        actorEmail: actor.email,
        action: 'corrective_action.issued',
        entity: 'corrective_action',
        entityId: ca.id,
        after: { number, ncr: n.number, supplier: s.code, recipients, due },
      });
      await this.audit.record(tx, { actorId: actor.id, actorEmail: actor.email, action: 'ncr.scar_issued', entity: 'ncr', entityId: n.id, after: { scar: number } });
      await this.outbox.enqueue(
        tx,
        issuedMail(this.cfg.PUBLIC_URL, { id: ca.id, number, title, supplierName: s.name, recipients }, {
          ncrNumber: n.number,
          part: p ? `${p.partNumber} rev ${p.revision}` : null,
          lot: l ? `#${l.ref} (${l.supplierLotNumber})` : null,
          defectCodes: n.defectCodes,
          suspectQuantity: n.suspectQuantity,
          problem,
          due,
        }),
      );
      return ca.id;
    });
    return this.get(actor, id);
  }

  // ───────── answering and reviewing ─────────

  private async lockScar(tx: Tx, user: SessionUser, id: string): Promise<CorrectiveActionRow> {
    const [ca] = await tx.select().from(correctiveAction).where(and(eq(correctiveAction.id, id), this.scope(user))).for('update');
    if (!ca) throw notFound('corrective action');
    return ca;
  }

  private async lockSteps(tx: Tx, id: string): Promise<StepRow[]> {
    return tx.select().from(correctiveActionStep).where(eq(correctiveActionStep.correctiveActionId, id)).orderBy(asc(correctiveActionStep.step)).for('update');
  }

  private whyNotOpen(step: EightDStep, s: StepRow, ca: CorrectiveActionRow): string {
    if (ca.status === 'closed') return `${ca.number} is closed; its answers no longer change.`;
    if (s.status === 'submitted') return `${step} was submitted and waits for the engineer’s review; it can be changed if it is returned.`;
    if (s.status === 'accepted') return `${step} was accepted; it no longer changes.`;
    if (step === 'D4') return 'D4 opens once the containment (D3) is submitted.';
    if (step === 'D8') return 'D8 opens once the engineer has accepted D1–D7.';
    return `${step} opens once the root cause (D4) is submitted.`;
  }

  /** A supplier's draft or submission of one step's answer. */
  async putStep(user: SessionUser, id: string, step: EightDStep, body: PutStepInput): Promise<Scar> {
    await this.db.transaction(async (tx) => {
      const ca = await this.lockScar(tx, user, id);
      const steps = await this.lockSteps(tx, id);
      const s = steps.find((x) => x.step === step)!;
      if (s.version !== body.version) throw stale(`answer to ${step}`);
      const states = steps.map((x) => ({ step: x.step, status: x.status }));
      if (!(s.status === 'open' || s.status === 'returned') || !stepOpens(step, states, ca.status)) throw illegalTransition(this.whyNotOpen(step, s, ca));
      if (JSON.stringify(body.answer).length > MAX_DRAFT_CHARS) throw new ValidationFailed({ answer: `An answer may be at most ${MAX_DRAFT_CHARS / 1000} 000 characters` });
      const at = now();
      if (body.submit) {
        const parsed = stepAnswerSchemas[step].safeParse(body.answer);
        if (!parsed.success) {
          const fields = Object.fromEntries(Object.entries(fieldsFromZod(parsed.error)).map(([k, v]) => [k === '_' ? 'answer' : `answer.${k}`, v]));
          throw new ValidationFailed(fields, `${step} is not complete yet; nothing was submitted`);
        }
        await tx
          .update(correctiveActionStep)
          .set({ status: 'submitted', answer: parsed.data as Record<string, unknown>, draft: null, draftSavedAt: null, submittedAt: at, submittedBy: user.id, version: s.version + 1, updatedAt: at })
          .where(eq(correctiveActionStep.id, s.id));
        await this.audit.record(tx, { actorId: user.id, actorEmail: user.email, action: 'corrective_action.step_submitted', entity: 'corrective_action', entityId: id, before: { step, status: s.status }, after: { step, status: 'submitted', answer: parsed.data } });
      } else {
        await tx.update(correctiveActionStep).set({ draft: body.answer, draftSavedAt: at, version: s.version + 1, updatedAt: at }).where(eq(correctiveActionStep.id, s.id));
        await this.audit.record(tx, { actorId: user.id, actorEmail: user.email, action: 'corrective_action.step_draft_saved', entity: 'corrective_action', entityId: id, after: { step } });
      }
      await this.settle(tx, ca, user);
    });
    return this.get(user, id);
  }

  async reviewStep(actor: SessionUser, id: string, step: EightDStep, body: ReviewStepInput): Promise<Scar> {
    await this.db.transaction(async (tx) => {
      const ca = await this.lockScar(tx, actor, id);
      const steps = await this.lockSteps(tx, id);
      const s = steps.find((x) => x.step === step)!;
      if (s.version !== body.version) throw stale(`answer to ${step}`);
      if (ca.status === 'closed') throw illegalTransition(`${ca.number} is closed.`);
      if (s.status !== 'submitted') throw illegalTransition(`${step} is not waiting for review (it is “${STEP_STATUS_LABELS[s.status].toLowerCase()}”).`);
      const at = now();
      const status = body.decision === 'accept' ? 'accepted' : 'returned';
      await tx
        .update(correctiveActionStep)
        .set({ status, reviewDecision: body.decision, reviewComment: body.comment ?? null, reviewedAt: at, reviewedBy: actor.id, version: s.version + 1, updatedAt: at })
        .where(eq(correctiveActionStep.id, s.id));
      await this.audit.record(tx, {
        actorId: actor.id,
        actorEmail: actor.email,
        action: body.decision === 'accept' ? 'corrective_action.step_accepted' : 'corrective_action.step_returned',
        entity: 'corrective_action',
        entityId: id,
        before: { step, status: s.status },
        after: { step, status },
        reason: body.comment ?? null,
      });
      if (body.decision === 'return') {
        const [sup] = await tx.select({ name: supplier.name }).from(supplier).where(eq(supplier.id, ca.supplierId));
        await this.outbox.enqueue(tx, returnedMail(this.cfg.PUBLIC_URL, { id, number: ca.number, title: ca.title, supplierName: sup.name, recipients: ca.recipients }, [step], body.comment ?? ''));
      }
      await this.settle(tx, ca, actor);
    });
    return this.get(actor, id);
  }

  /**
   * After a step changes: move the request to the status its answers now give (one legal edge
   * at a time, each recorded), then open the steps that may now be answered.
   */
  private async settle(tx: Tx, ca: CorrectiveActionRow, actor: SessionUser): Promise<void> {
    const steps = await tx.select().from(correctiveActionStep).where(eq(correctiveActionStep.correctiveActionId, ca.id));
    const states: StepState[] = steps.map((s) => ({ step: s.step, status: s.status }));
    const target = derivedScarStatus(ca.status, states, ca.acknowledgedAt !== null);
    const at = now();
    let status = ca.status;
    if (target !== ca.status) {
      const path = scarPath(ca.status, target);
      for (const hop of path) {
        await this.audit.record(tx, { actorId: actor.id, actorEmail: actor.email, action: `corrective_action.${hop}`, entity: 'corrective_action', entityId: ca.id, before: { status }, after: { status: hop } });
        status = hop;
      }
      await tx
        .update(correctiveAction)
        .set({
          status: target,
          version: ca.version + 1,
          updatedAt: at,
          ...(path.includes('acknowledged') && !ca.acknowledgedAt ? { acknowledgedAt: at } : {}),
          ...(target === 'accepted' ? { acceptedAt: at } : {}),
        })
        .where(eq(correctiveAction.id, ca.id));
    } else {
      await tx.update(correctiveAction).set({ updatedAt: at }).where(eq(correctiveAction.id, ca.id));
    }
    for (const s of steps) {
      if (s.status === 'locked' && stepOpens(s.step, states, status)) {
        await tx.update(correctiveActionStep).set({ status: 'open', updatedAt: at }).where(eq(correctiveActionStep.id, s.id));
      }
    }
  }

  // ───────── manual moves ─────────

  async transition(user: SessionUser, id: string, body: ScarTransitionInput): Promise<Scar> {
    await this.db.transaction(async (tx) => {
      const ca = await this.lockScar(tx, user, id);
      if (ca.version !== body.version) throw stale('corrective action');
      const from = ca.status;
      const to = body.to as ScarStatus;
      const label = (s: ScarStatus) => SCAR_STATUS_LABELS[s].toLowerCase();
      if (!SCAR_MANUAL_TRANSITIONS[from].includes(to)) {
        if (from === to) throw illegalTransition(`${ca.number} is already ${label(to)}.`);
        throw illegalTransition(`${ca.number} cannot go from ${label(from)} to ${label(to)} by a status change${SCAR_MANUAL_TRANSITIONS[from].length ? `; from ${label(from)} it may go to ${SCAR_MANUAL_TRANSITIONS[from].map(label).join(' or ')}` : '; it moves on as the steps are answered and reviewed'}.`);
      }
      const who = SCAR_MANUAL_ACTOR[to];
      if (who && user.role !== who) throw new ForbiddenException({ error: 'forbidden', message: who === 'supplier' ? 'Only the supplier acknowledges its corrective action request' : 'Only a quality engineer makes this change' });
      const at = now();
      let patch: Partial<typeof correctiveAction.$inferInsert> = {};
      if (to === 'acknowledged') patch = { acknowledgedAt: at };
      if (to === 'verifying') patch = { verifyingSince: at, verifyLots: [], recurrenceLotId: null, recurrenceNcrId: null, recurrenceAt: null };
      if (to === 'closed') {
        if (ca.recurrenceNcrId) {
          const [r] = await tx.select({ number: ncr.number }).from(ncr).where(eq(ncr.id, ca.recurrenceNcrId));
          throw illegalTransition(`The defect returned in ${r?.number ?? 'a new NCR'}: reopen ${ca.number} instead of closing it.`);
        }
        if (ca.verifyLots.length < ca.verifyLotsRequired) throw illegalTransition(`${ca.verifyLots.length} of ${ca.verifyLotsRequired} lots have passed since the actions were accepted; ${ca.number} closes once ${ca.verifyLotsRequired} pass without the defect.`);
        const [d8] = await tx.select().from(correctiveActionStep).where(and(eq(correctiveActionStep.correctiveActionId, id), eq(correctiveActionStep.step, 'D8')));
        if (d8.status !== 'accepted') throw illegalTransition('Accept the supplier’s closure (D8) before closing the request.');
        patch = { closedAt: at, closedBy: user.id };
      }
      if (to === 'returned') {
        if (!body.note) throw new ValidationFailed({ note: 'Say why the request is reopened (which lot or NCR showed the defect again)' });
        const reopen: EightDStep[] = ['D3', 'D4', 'D5', 'D6', 'D7'];
        const due = this.dueDates(isoDateOf(at));
        for (const step of reopen) {
          await tx
            .update(correctiveActionStep)
            .set({ status: 'returned', reviewDecision: 'return', reviewComment: body.note, reviewedAt: at, reviewedBy: user.id, dueOn: CorrectiveActionsService.dueOf(step, due), version: sql`${correctiveActionStep.version} + 1`, updatedAt: at })
            .where(and(eq(correctiveActionStep.correctiveActionId, id), eq(correctiveActionStep.step, step)));
        }
        await tx
          .update(correctiveActionStep)
          .set({ status: 'locked', dueOn: CorrectiveActionsService.dueOf('D8', due), version: sql`${correctiveActionStep.version} + 1`, updatedAt: at })
          .where(and(eq(correctiveActionStep.correctiveActionId, id), eq(correctiveActionStep.step, 'D8')));
        patch = { verifyingSince: null, acceptedAt: null, recurrenceNcrId: null, recurrenceLotId: null, recurrenceAt: null };
        const [sup] = await tx.select({ name: supplier.name }).from(supplier).where(eq(supplier.id, ca.supplierId));
        await this.outbox.enqueue(tx, returnedMail(this.cfg.PUBLIC_URL, { id, number: ca.number, title: ca.title, supplierName: sup.name, recipients: ca.recipients }, reopen, body.note, true));
      }
      await tx.update(correctiveAction).set({ ...patch, status: to, version: ca.version + 1, updatedAt: at }).where(eq(correctiveAction.id, id));
      await this.audit.record(tx, {
        actorId: user.id,
        actorEmail: user.email,
        action: `corrective_action.${to === 'returned' ? 'reopened' : to}`,
        entity: 'corrective_action',
        entityId: id,
        before: { status: from },
        after: { status: to, ...(to === 'closed' ? { lotsPassed: ca.verifyLots.length } : {}) },
        reason: body.note ?? null,
      });
      if (to === 'verifying' || to === 'returned') {
        // D8 opens in verifying; the reopened request locks it again.
        const steps = await tx.select().from(correctiveActionStep).where(eq(correctiveActionStep.correctiveActionId, id));
        const states = steps.map((s) => ({ step: s.step, status: s.status }));
        for (const s of steps) if (s.status === 'locked' && stepOpens(s.step, states, to)) await tx.update(correctiveActionStep).set({ status: 'open', updatedAt: at }).where(eq(correctiveActionStep.id, s.id));
      }
    });
    return this.get(user, id);
  }

  /** For the Supplier desk: steps the supplier still owes, soonest first. */
  async openSteps(user: SessionUser): Promise<{ id: string; number: string; step: EightDStep; dueOn: string | null; status: string }[]> {
    const rows = await this.db
      .select({ id: correctiveAction.id, number: correctiveAction.number, step: correctiveActionStep.step, dueOn: correctiveActionStep.dueOn, status: correctiveActionStep.status })
      .from(correctiveActionStep)
      .innerJoin(correctiveAction, eq(correctiveAction.id, correctiveActionStep.correctiveActionId))
      .where(and(this.scope(user), ne(correctiveAction.status, 'closed'), notInArray(correctiveActionStep.status, ['submitted', 'accepted', 'locked'])))
      .orderBy(asc(correctiveActionStep.dueOn), asc(correctiveActionStep.step));
    return rows;
  }
}
