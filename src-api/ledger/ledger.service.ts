import { Injectable } from '@nestjs/common';
import type { auditEvent, switchingEvent } from '../db/schema';
import type { DbOrTx } from '../db/client';
import { PlansService } from '../plans/plans.service';
import { initialSwitchingState, type SwitchingState } from '../../shared/compute/sampling';
import type { StoredSampling } from '../../shared/schemas/receiving';
import { type LedgerEvent, type LedgerKind, type LedgerLot, type LedgerPlan, type LedgerReading, type SwitchingSnapshot } from '../../shared/schemas/ledger';
import { LedgerRepository, person, type LinkedRecords, type LotReadingRow } from './ledger.repository';

type AuditRow = typeof auditEvent.$inferSelect;
type SwitchingRow = typeof switchingEvent.$inferSelect;

/** Stored sampling without the internal plan blob and lot size: what people read. */
export function publicSampling(s: StoredSampling & { plan?: unknown; lotSize?: number }): StoredSampling {
  const { plan: _plan, lotSize: _lotSize, ...rest } = s;
  return rest;
}

const iso = (d: Date) => d.toISOString();
const dayOf = (d: Date) => d.toISOString().slice(0, 10);
const plural = (n: number, one: string, many = `${one}s`) => `${n.toLocaleString('en-GB')} ${n === 1 ? one : many}`;

function snapshot(s: SwitchingState, since: Date | null): SwitchingSnapshot {
  return { severity: s.severity, consecutiveAccepted: s.consecutiveAccepted, switchingScore: s.switchingScore, discontinued: s.discontinued, since: since ? iso(since) : null };
}

/** The supplier × part switching state in force at `at`: the last event at or before it, else the initial state. */
export function switchingAt(events: Pick<SwitchingRow, 'at' | 'after'>[], at: Date): SwitchingSnapshot {
  let last: Pick<SwitchingRow, 'at' | 'after'> | undefined;
  for (const e of events) if (e.at.getTime() <= at.getTime()) last = e;
  return last ? snapshot(last.after as SwitchingState, last.at) : snapshot(initialSwitchingState(), null);
}

// Events written in the same transaction share a time: show the thing before its audit record.
// Within one transaction: the disposition lines, the signature over them, then the NCR's new status.
const ORDER: readonly LedgerKind[] = ['plan', 'received', 'readings', 'photo', 'decision', 'switching', 'disposition', 'signature', 'ncr', 'scar', 'scar-step', 'audit'];
const KIND_ORDER = new Map<LedgerKind, number>(ORDER.map((k, i) => [k, i]));

/** Time order; ties by kind (the change before its record), then by audit id. */
export function byTime(a: LedgerEvent, b: LedgerEvent): number {
  return Date.parse(a.at) - Date.parse(b.at) || (KIND_ORDER.get(a.kind) ?? 0) - (KIND_ORDER.get(b.kind) ?? 0) || (a.auditId ?? 0) - (b.auditId ?? 0) || a.key.localeCompare(b.key);
}

export const toLedgerReading = (x: LotReadingRow, chars: Map<string, { kind: string; unit: string | null }>): LedgerReading => ({
  serial: x.serial,
  characteristicCode: x.r.characteristicCode,
  kind: chars.get(x.r.characteristicCode)?.kind ?? null,
  unit: chars.get(x.r.characteristicCode)?.unit ?? null,
  value: x.r.value,
  values: x.r.values,
  pass: x.r.pass,
  conforming: x.r.conforming,
  note: x.r.note,
  gaugeId: x.r.gaugeId,
  gaugeAssetTag: x.gaugeAssetTag,
  gaugeDueOn: x.r.gaugeDueOn,
});

@Injectable()
export class LedgerService {
  constructor(
    private readonly repo: LedgerRepository,
    private readonly plans: PlansService,
  ) {}

  /** A lot's whole story on one timeline, with the plan revisions of its part. */
  async lotStory(id: string, tx: DbOrTx = this.repo.db): Promise<LedgerLot> {
    const h = await this.repo.lotHeader(id, tx);
    const l = h.l;
    const [chars, samples, readings, photos, switching, linked, planRows] = await Promise.all([
      this.repo.characteristics(l.planId, tx),
      this.repo.samples(id, tx),
      this.repo.readings(id, tx),
      this.repo.photos(id, tx),
      this.repo.switchingEvents(l.supplierId, l.partId, tx),
      this.repo.linked(id, tx),
      this.repo.plansOfPart(l.partId, tx),
    ]);
    const charMap = new Map(chars.map((c) => [c.code, { kind: c.kind, unit: c.unit }]));
    const events: LedgerEvent[] = [];
    const base = { detail: null, actor: null, auditId: null };

    // ── The plan in force: its activation.
    const lotPlan = planRows.find((p) => p.id === l.planId);
    if (lotPlan?.activatedAt) {
      events.push({ ...base, key: `plan:${lotPlan.id}`, at: iso(lotPlan.activatedAt), kind: 'plan', title: `Inspection plan rev ${lotPlan.revision} activated`, detail: 'The plan this lot was received and judged against.', link: { entity: 'inspection_plan', id: lotPlan.id, label: `Rev ${lotPlan.revision}` } });
    }

    // ── Received, with the sampling computed then and the switching state in force then.
    const heats = l.heatNumbers.length ? `heats ${l.heatNumbers.join(', ')}` : 'no heat numbers given';
    events.push({
      ...base,
      key: 'received',
      at: iso(l.receivedAt),
      kind: 'received',
      title: `Received ${plural(l.quantity, 'core')} of ${h.p.partNumber} rev ${h.p.revision} from ${h.s.name} (${h.s.code})`,
      detail: [`Supplier lot ${l.supplierLotNumber}`, l.poNumber ? `PO ${l.poNumber}` : null, heats, `packaging ${l.packagingCondition}${l.packagingNote ? ` (${l.packagingNote})` : ''}`].filter(Boolean).join(' · '),
      actor: person(h.receivedBy),
      sampling: publicSampling(l.sampling),
      switching: switchingAt(switching.map((s) => s.e), l.receivedAt),
    });

    // ── Readings, one entry per save (same time, same person, same source).
    const batches = new Map<string, LotReadingRow[]>();
    for (const x of readings) {
      // Derived values are computed by the server from the entered ones; they are shown with them in the report.
      if (charMap.get(x.r.characteristicCode)?.kind === 'derived') continue;
      const k = `${iso(x.r.enteredAt)}|${x.enteredBy?.email ?? ''}|${x.r.source}`;
      const list = batches.get(k) ?? [];
      list.push(x);
      batches.set(k, list);
    }
    for (const [k, rows] of batches) {
      const first = rows[0];
      const cores = new Set(rows.map((r) => r.serial));
      const codes = [...new Set(rows.map((r) => r.r.characteristicCode))];
      const bad = rows.filter((r) => r.r.conforming === false).length;
      const gauges = new Map<string, { id: string; assetTag: string; dueOn: string | null; overdueAtTime: boolean }>();
      for (const r of rows) {
        if (!r.r.gaugeId) continue;
        const dueOn = r.r.gaugeDueOn;
        gauges.set(`${r.r.gaugeId}|${dueOn}`, { id: r.r.gaugeId, assetTag: r.gaugeAssetTag ?? r.r.gaugeId, dueOn, overdueAtTime: !!dueOn && dueOn < dayOf(r.r.enteredAt) });
      }
      events.push({
        ...base,
        key: `readings:${k}`,
        at: iso(first.r.enteredAt),
        kind: 'readings',
        title: `${plural(rows.length, 'reading')} on ${plural(cores.size, 'core')}${first.r.source === 'import' ? ' imported from a gauge file' : ' entered'}`,
        detail: `${codes.join(', ')}${bad ? ` · ${plural(bad, 'nonconforming result')}` : ' · all within limits'}`,
        actor: person(first.enteredBy),
        readings: rows.map((r) => toLedgerReading(r, charMap)),
        gauges: [...gauges.values()],
      });
    }

    for (const ph of photos) {
      events.push({
        ...base,
        key: `photo:${ph.p.id}`,
        at: iso(ph.p.createdAt),
        kind: 'photo',
        title: ph.p.caption ? `Photo: ${ph.p.caption}` : 'Photo added',
        detail: [ph.serial != null ? `core ${ph.serial}` : null, ph.p.characteristicCode, `${ph.p.width} × ${ph.p.height} px`].filter(Boolean).join(' · '),
        actor: person(ph.by),
        photoId: ph.p.id,
      });
    }

    if (l.decision && l.decidedAt) {
      events.push({
        ...base,
        key: 'decision',
        at: iso(l.decidedAt),
        kind: 'decision',
        title: l.decision === 'accept' ? 'Accepted — released to production' : 'Rejected — put on hold',
        detail: [l.decisionComment, l.nonconformingCount != null ? `${plural(l.nonconformingCount, 'nonconforming core')} of ${plural(l.sampling.sampleSize, 'sampled core')} (Ac ${l.sampling.accept}, Re ${l.sampling.reject})` : null].filter(Boolean).join(' · '),
        actor: person(h.decidedBy),
      });
    }

    for (const s of switching.filter((x) => x.e.lotId === id)) {
      const before = s.e.before as SwitchingState;
      const after = s.e.after as SwitchingState;
      events.push({
        ...base,
        key: `switching:${s.e.id}`,
        at: iso(s.e.at),
        kind: 'switching',
        title: before.severity === after.severity ? `Switching: stays on ${after.severity} inspection` : `Switching: ${before.severity} → ${after.severity} inspection`,
        detail: s.e.reason,
        actor: person(s.by),
        switching: snapshot(after, s.e.at),
      });
    }

    events.push(...this.linkedEvents(linked));

    const audit = await this.repo.audit(
      [
        { entity: 'lot', ids: [id] },
        { entity: 'ncr', ids: linked.ncrs.map((n) => n.id) },
        { entity: 'disposition', ids: linked.dispositions.map((d) => d.id) },
        { entity: 'e_signature', ids: linked.signatures.map((x) => x.id) },
        { entity: 'corrective_action', ids: linked.scars.map((x) => x.id) },
        { entity: 'scar', ids: linked.scars.map((x) => x.id) },
      ],
      tx,
    );
    events.push(...audit.map(auditEntry));
    events.sort(byTime);

    return {
      lot: {
        id: l.id,
        ref: l.ref,
        supplierLotNumber: l.supplierLotNumber,
        poNumber: l.poNumber,
        supplierId: l.supplierId,
        supplierCode: h.s.code,
        supplierName: h.s.name,
        partId: l.partId,
        partNumber: h.p.partNumber,
        partRevision: h.p.revision,
        planId: l.planId,
        planRevision: h.plan.revision,
        quantity: l.quantity,
        heatNumbers: l.heatNumbers,
        status: l.status,
        receivedAt: iso(l.receivedAt),
        receivedBy: person(h.receivedBy),
        sampling: publicSampling(l.sampling),
        decision: l.decision,
        decidedBy: person(h.decidedBy),
        decidedAt: l.decidedAt ? iso(l.decidedAt) : null,
        coreCount: samples.length,
      },
      events,
      plans: await this.planRevisions(planRows, l.planId),
      linked: [
        ...linked.ncrs.map((n) => ({ entity: 'ncr' as const, id: n.id, label: n.number, status: n.status })),
        ...linked.scars.map((x) => ({ entity: 'corrective_action' as const, id: x.id, label: x.number, status: x.status })),
      ],
      notes: linked.notes,
    };
  }

  /** Every revision of the part with what changed from the one before it. */
  private async planRevisions(rows: Awaited<ReturnType<LedgerRepository['plansOfPart']>>, lotPlanId: string): Promise<LedgerPlan[]> {
    const out: LedgerPlan[] = [];
    for (const p of rows) {
      const c = await this.plans.changes(p.id);
      out.push({
        id: p.id,
        revision: p.revision,
        status: p.status,
        createdAt: iso(p.createdAt),
        activatedAt: p.activatedAt ? iso(p.activatedAt) : null,
        supersededAt: p.supersededAt ? iso(p.supersededAt) : null,
        isLotPlan: p.id === lotPlanId,
        fromRevision: c.from?.revision ?? null,
        changes: c.changes,
      });
    }
    return out.reverse();
  }

  private linkedEvents(x: LinkedRecords): LedgerEvent[] {
    const base = { detail: null, actor: null, auditId: null };
    const out: LedgerEvent[] = [];
    const ncrNumber = new Map(x.ncrs.map((n) => [n.id, n.number]));
    for (const n of x.ncrs) {
      const link = { entity: 'ncr' as const, id: n.id, label: n.number };
      out.push({ ...base, key: `ncr:${n.id}`, at: n.raised_at, kind: 'ncr', title: `${n.number} raised: ${n.title}`, detail: `${plural(n.suspect_quantity, 'suspect core')}${n.defect_codes?.length ? ` · ${n.defect_codes.join(', ')}` : ''}`, actor: n.raised_by, link });
      if (n.review_started_at) out.push({ ...base, key: `ncr-review:${n.id}`, at: n.review_started_at, kind: 'ncr', title: `${n.number} taken to the review board`, link });
      if (n.dispositioned_at) out.push({ ...base, key: `ncr-disp:${n.id}`, at: n.dispositioned_at, kind: 'ncr', title: `${n.number} dispositioned`, link });
      if (n.closed_at) out.push({ ...base, key: `ncr-closed:${n.id}`, at: n.closed_at, kind: 'ncr', title: `${n.number} closed`, actor: n.closed_by, link });
    }
    for (const d of x.dispositions) {
      const number = ncrNumber.get(d.ncr_id) ?? 'NCR';
      out.push({
        ...base,
        key: `disposition:${d.ncr_id}:${String(d.seq).padStart(4, '0')}`,
        at: d.created_at,
        kind: 'disposition',
        title: `${number} disposition ${d.seq}: ${d.kind.replace(/-/g, ' ')}, ${plural(d.quantity, 'core')}`,
        detail: [d.rationale, d.concession_ref ? `concession ${d.concession_ref}` : null, `cost ${Number(d.cost).toFixed(2)}`].filter(Boolean).join(' · '),
        link: { entity: 'ncr', id: d.ncr_id, label: number },
      });
    }
    for (const s of x.signatures) {
      out.push({
        ...base,
        key: `signature:${s.id}`,
        at: s.signed_at,
        kind: 'signature',
        title: `Signed by ${s.signer_name} (${s.signer_role}): “${s.meaning}”`,
        detail: `${s.purpose} · content SHA-256 ${s.content_hash.slice(0, 16)}…`,
        actor: `${s.signer_name} <${s.signer_email}>`,
      });
    }
    const scarNumber = new Map(x.scars.map((s) => [s.id, s.number]));
    for (const s of x.scars) {
      const link = { entity: 'corrective_action' as const, id: s.id, label: s.number };
      out.push({ ...base, key: `scar:${s.id}`, at: s.issued_at, kind: 'scar', title: `${s.number} issued to the supplier: ${s.title}`, actor: s.issued_by, link });
      if (s.acknowledged_at) out.push({ ...base, key: `scar-ack:${s.id}`, at: s.acknowledged_at, kind: 'scar', title: `${s.number} acknowledged by the supplier`, link });
      if (s.accepted_at) out.push({ ...base, key: `scar-acc:${s.id}`, at: s.accepted_at, kind: 'scar', title: `${s.number} answer accepted`, link });
      if (s.verifying_since) out.push({ ...base, key: `scar-ver:${s.id}`, at: s.verifying_since, kind: 'scar', title: `${s.number} verifying on the next lots`, link });
      if (s.closed_at) out.push({ ...base, key: `scar-closed:${s.id}`, at: s.closed_at, kind: 'scar', title: `${s.number} closed`, actor: s.closed_by, link });
    }
    for (const st of x.steps) {
      const number = scarNumber.get(st.corrective_action_id) ?? 'SCAR';
      const link = { entity: 'corrective_action' as const, id: st.corrective_action_id, label: number };
      if (st.submitted_at) out.push({ ...base, key: `step-sub:${st.id}`, at: st.submitted_at, kind: 'scar-step', title: `${number} ${st.step} answered by the supplier`, detail: st.due_on ? `due ${st.due_on}` : null, actor: st.submitted_by, link });
      if (st.reviewed_at) out.push({ ...base, key: `step-rev:${st.id}`, at: st.reviewed_at, kind: 'scar-step', title: `${number} ${st.step} ${st.review_decision === 'return' ? 'returned to the supplier' : 'accepted'}`, detail: st.review_comment, actor: st.reviewed_by, link });
    }
    return out;
  }
}

export function auditEntry(a: AuditRow): LedgerEvent {
  return {
    key: `audit:${a.id}`,
    at: iso(a.at),
    kind: 'audit',
    title: `Record #${a.id} · ${a.action}`,
    detail: a.reason,
    actor: a.actorEmail,
    auditId: a.id,
    audit: { action: a.action, entity: a.entity, entityId: a.entityId, before: a.before, after: a.after, reason: a.reason, hash: a.hash },
  };
}
