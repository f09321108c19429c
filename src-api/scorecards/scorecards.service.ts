import { Injectable } from '@nestjs/common';
import { notFound } from '../common/errors';
import { ValidationFailed } from '../common/zod.pipe';
import { now } from '../common/clock';
import { ComputeError } from '../../shared/compute/errors';
import { isoDateOf } from '../../shared/compute/working-days';
import { ppm, rankSuppliers, scorecardRange, type ScorecardRange } from '../../shared/compute/scorecard';
import type { SessionUser } from '../../shared/schemas/auth';
import type { ScorecardList, ScorecardOne, ScorecardQuery, SupplierScorecard } from '../../shared/schemas/scorecard';
import { ScorecardsRepository, type LotPeriodRow, type Window } from './scorecards.repository';

const NO_SUPPLIER = '00000000-0000-0000-0000-000000000000';
const DAY_MS = 86_400_000;

@Injectable()
export class ScorecardsService {
  constructor(private readonly repo: ScorecardsRepository) {}

  /** The range with its defaults applied; an inverted or too long one is a 400 naming the limit. */
  range(q: ScorecardQuery, today = isoDateOf(now())): ScorecardRange {
    try {
      return scorecardRange(q, today);
    } catch (e) {
      if (e instanceof ComputeError) throw new ValidationFailed({ [e.field ?? 'to']: e.message }, e.message);
      throw e;
    }
  }

  list(user: SessionUser, q: ScorecardQuery): Promise<ScorecardList> {
    return this.build(user, q);
  }

  /** One supplier's card; another company's (for a supplier user) or an unknown id → 404. */
  async one(user: SessionUser, supplierId: string, q: ScorecardQuery): Promise<ScorecardOne> {
    if (user.role === 'supplier' && user.supplierId !== supplierId) throw notFound('supplier');
    const { items, ...rest } = await this.build(user, q, supplierId);
    const item = items.find((i) => i.supplierId === supplierId);
    if (!item) throw notFound('supplier');
    return { ...rest, item };
  }

  private async build(user: SessionUser, q: ScorecardQuery, only?: string): Promise<ScorecardList> {
    const today = isoDateOf(now());
    const r = this.range(q, today);
    // A supplier user's every query is filtered by its own company, so nothing of another's is read.
    const scoped = user.role === 'supplier' ? (user.supplierId ?? NO_SUPPLIER) : undefined;
    const start = new Date(`${r.from}T00:00:00.000Z`);
    const w: Window = { start, end: new Date(Date.parse(`${r.to}T00:00:00.000Z`) + DAY_MS), period: r.period, today, supplierId: scoped };
    // The ranking compares every supplier, so a single card still reads them all (engineers and
    // auditors only); the figures come from the same two aggregate queries either way.
    const [suppliers, lotRows, scarRows] = await Promise.all([this.repo.suppliers(scoped), this.repo.lotPeriods(w), this.repo.scars(w)]);
    const switching = await this.repo.switching(suppliers.filter((s) => !only || s.id === only).map((s) => s.id));

    const bySupplier = new Map<string, LotPeriodRow[]>();
    for (const row of lotRows) bySupplier.set(row.supplier_id, [...(bySupplier.get(row.supplier_id) ?? []), row]);
    const scars = new Map(scarRows.map((s) => [s.supplier_id, s]));

    const items: SupplierScorecard[] = suppliers.map((s) => {
      const periods = new Map((bySupplier.get(s.id) ?? []).map((p) => [p.period, p]));
      let received = 0, accepted = 0, rejected = 0, qtyReceived = 0, qtyRejected = 0, cost = 0;
      const trend = r.periods.map((b) => {
        const p = periods.get(b.key);
        received += p?.lots_received ?? 0;
        accepted += p?.lots_accepted ?? 0;
        rejected += p?.lots_rejected ?? 0;
        qtyReceived += p?.quantity_received ?? 0;
        qtyRejected += p?.quantity_rejected ?? 0;
        cost += p?.cost ?? 0;
        return {
          period: b.key,
          lotsReceived: p?.lots_received ?? 0,
          lotsRejected: p?.lots_rejected ?? 0,
          quantityReceived: p?.quantity_received ?? 0,
          quantityRejected: p?.quantity_rejected ?? 0,
          ppm: ppm(p?.quantity_rejected ?? 0, p?.quantity_received ?? 0),
        };
      });
      const sc = scars.get(s.id);
      return {
        supplierId: s.id,
        supplierCode: s.code,
        supplierName: s.name,
        approvalStatus: s.approvalStatus,
        rank: null,
        lots: { received, accepted, rejected, undecided: received - accepted - rejected },
        quantity: { received: qtyReceived, rejected: qtyRejected },
        ppm: ppm(qtyRejected, qtyReceived),
        scars: { issued: sc?.issued ?? 0, closedOnTime: sc?.closed_on_time ?? 0, closedLate: sc?.closed_late ?? 0, open: sc?.open ?? 0, overdue: sc?.overdue ?? 0 },
        // Costs are kept to the cent on each line; the sum is rounded to the cent again.
        costOfPoorQuality: Math.round(cost * 100) / 100,
        switching: switching
          .filter((x) => x.supplierId === s.id)
          .map((x) => ({
            partId: x.partId,
            partNumber: x.partNumber,
            partRevision: x.revision,
            severity: x.state.severity,
            discontinued: x.state.discontinued,
            reducedEligible: x.state.reducedEligible,
            consecutiveAccepted: x.state.consecutiveAccepted,
            updatedAt: x.updatedAt.toISOString(),
          })),
        trend,
      };
    });

    // Suppliers see no one else, so they get no rank: a rank would say something about others.
    let rankedOf = 0;
    if (!scoped) {
      const ranks = rankSuppliers(items.map((i) => ({ id: i.supplierId, ppm: i.ppm, lotsRejected: i.lots.rejected })));
      for (const i of items) i.rank = ranks.get(i.supplierId) ?? null;
      rankedOf = items.filter((i) => i.rank != null).length;
      items.sort((a, b) => (a.rank ?? Infinity) - (b.rank ?? Infinity) || a.supplierCode.localeCompare(b.supplierCode));
    }
    return { from: r.from, to: r.to, period: r.period, periods: r.periods, rankedOf, items };
  }
}
