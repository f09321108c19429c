import { Inject, Injectable } from '@nestjs/common';
import { asc, eq, inArray, sql } from 'drizzle-orm';
import { DB, type Db } from '../db/client';
import { part, supplier, switchingState } from '../db/schema';
import type { ScorecardPeriod } from '../../shared/compute/scorecard';
import type { SwitchingState } from '../../shared/compute/sampling';

const rowsOf = <T>(r: unknown): T[] => ((r as { rows?: T[] }).rows ?? (r as T[])) as T[];

/** One supplier × period of lots received: counts, quantities and the cost of their NCRs' dispositions. */
export interface LotPeriodRow {
  supplier_id: string;
  period: string;
  lots_received: number;
  lots_accepted: number;
  lots_rejected: number;
  quantity_received: number;
  quantity_rejected: number;
  cost: number;
}

export interface ScarRow {
  supplier_id: string;
  issued: number;
  closed_on_time: number;
  closed_late: number;
  open: number;
  overdue: number;
}

export interface Window {
  /** First instant of `from` (UTC). */
  start: Date;
  /** First instant after `to` (UTC): the range is [start, end). */
  end: Date;
  period: ScorecardPeriod;
  /** Today (UTC date) for "overdue". */
  today: string;
  /** A supplier user's own company; undefined = every supplier. */
  supplierId?: string;
}

// The period key in the same format as periodKeyOf in shared/compute/scorecard.ts.
const PERIOD_FORMAT: Record<ScorecardPeriod, string> = { month: 'YYYY-MM', quarter: 'YYYY-"Q"Q' };

/** The scorecard's queries: aggregates in SQL (GROUP BY), never a loop over lots. */
@Injectable()
export class ScorecardsRepository {
  constructor(@Inject(DB) readonly db: Db) {}

  suppliers(supplierId?: string) {
    return this.db
      .select({ id: supplier.id, code: supplier.code, name: supplier.name, approvalStatus: supplier.approvalStatus })
      .from(supplier)
      .where(supplierId ? eq(supplier.id, supplierId) : undefined)
      .orderBy(asc(supplier.code));
  }

  /**
   * Lots received in the window per supplier × period. Rejected = decision 'reject' (whatever
   * happened to the lot after). The cost is summed per lot first, so a lot with two NCRs or
   * several disposition lines is still one lot in the counts.
   */
  async lotPeriods(w: Window): Promise<LotPeriodRow[]> {
    const fmt = sql.raw(`'${PERIOD_FORMAT[w.period]}'`);
    const own = w.supplierId ? sql`and l.supplier_id = ${w.supplierId}` : sql``;
    const r = await this.db.execute(sql`
      with in_range as (
        select l.id, l.supplier_id, l.quantity, l.decision, l.received_at
        from lot l
        where l.received_at >= ${w.start} and l.received_at < ${w.end} ${own}
      ),
      lot_cost as (
        select n.lot_id, sum(d.cost) as cost
        from ncr n
        join disposition d on d.ncr_id = n.id
        where n.lot_id in (select id from in_range)
        group by n.lot_id
      )
      select l.supplier_id,
             to_char(l.received_at at time zone 'UTC', ${fmt}) as period,
             count(*)::int as lots_received,
             (count(*) filter (where l.decision = 'accept'))::int as lots_accepted,
             (count(*) filter (where l.decision = 'reject'))::int as lots_rejected,
             coalesce(sum(l.quantity), 0)::float8 as quantity_received,
             coalesce(sum(l.quantity) filter (where l.decision = 'reject'), 0)::float8 as quantity_rejected,
             coalesce(sum(c.cost), 0)::float8 as cost
      from in_range l
      left join lot_cost c on c.lot_id = l.id
      group by l.supplier_id, period
    `);
    return rowsOf<LotPeriodRow>(r);
  }

  /**
   * Corrective actions issued in the window per supplier. On time: closed on or before the
   * latest due date of its steps (the closure date). Overdue: not closed, and a step still owed
   * (not submitted or accepted; D8 only once the actions are accepted) is past its due date —
   * the same rule the corrective-action list uses for its overdue flag.
   */
  async scars(w: Window): Promise<ScarRow[]> {
    const own = w.supplierId ? sql`and ca.supplier_id = ${w.supplierId}` : sql``;
    const r = await this.db.execute(sql`
      select ca.supplier_id,
             count(*)::int as issued,
             (count(*) filter (where ca.status = 'closed' and (due.closure is null or (ca.closed_at at time zone 'UTC')::date <= due.closure)))::int as closed_on_time,
             (count(*) filter (where ca.status = 'closed' and due.closure is not null and (ca.closed_at at time zone 'UTC')::date > due.closure))::int as closed_late,
             (count(*) filter (where ca.status <> 'closed'))::int as open,
             (count(*) filter (where ca.status <> 'closed' and exists (
               select 1 from corrective_action_step s
               where s.corrective_action_id = ca.id
                 and s.status not in ('submitted', 'accepted')
                 and s.due_on < ${w.today}::date
                 and (s.step <> 'D8' or ca.status in ('accepted', 'verifying'))
             )))::int as overdue
      from corrective_action ca
      left join lateral (select max(s.due_on) as closure from corrective_action_step s where s.corrective_action_id = ca.id) due on true
      where ca.issued_at >= ${w.start} and ca.issued_at < ${w.end} ${own}
      group by ca.supplier_id
    `);
    return rowsOf<ScarRow>(r);
  }

  /** The current switching state of every part the suppliers have one for. */
  async switching(supplierIds: string[]) {
    if (!supplierIds.length) return [];
    const rows = await this.db
      .select({ supplierId: switchingState.supplierId, partId: switchingState.partId, partNumber: part.partNumber, revision: part.revision, state: switchingState.state, updatedAt: switchingState.updatedAt })
      .from(switchingState)
      .innerJoin(part, eq(part.id, switchingState.partId))
      .where(inArray(switchingState.supplierId, supplierIds))
      .orderBy(asc(part.partNumber), asc(part.revision));
    return rows.map((r) => ({ ...r, state: r.state as SwitchingState }));
  }
}
