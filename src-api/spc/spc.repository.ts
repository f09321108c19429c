import { Injectable } from '@nestjs/common';
import { and, asc, desc, eq, sql, type SQL } from 'drizzle-orm';
import type { DbOrTx } from '../db/client';
import { appUser, controlLimit, dieWearForecast, driftSignal, ncr, part, planCharacteristic, supplier } from '../db/schema';
import type { fieldsNeeded, LotResults } from '../../shared/compute/spc/drift';

export type CharacteristicRow = typeof planCharacteristic.$inferSelect & { planRevision: number };
export type ControlLimitRow = typeof controlLimit.$inferSelect & { frozenByEmail: string | null };
/** A signal with the number of the NCR it was taken into, if any. */
export type DriftSignalRow = typeof driftSignal.$inferSelect & { ncrNumber?: string | null };

export type WatchRowRaw = {
  supplier_id: string;
  supplier_code: string;
  supplier_name: string;
  part_id: string;
  part_number: string;
  part_revision: string;
  code: string;
  name: string;
  unit: string | null;
  chart_kind: string;
  subgroup_size: number | null;
  wear_driven: boolean;
  lots: number;
  last_lot_at: Date | null;
  open_signals: number;
  limit_version: number | null;
  lots_to_limit: number | null;
  lots_to_limit_lower: number | null;
  service_lots: number | null;
  service_due: boolean | null;
};

/**
 * The plan revision in effect for a part: the active one, else the newest that was ever active
 * (a part whose plan is being revised still has its charts). Drafts are never in effect.
 */
const CURRENT_PLAN = sql`
  select distinct on (ip.part_id) ip.id, ip.part_id, ip.revision
  from inspection_plan ip
  where ip.status <> 'draft'
  order by ip.part_id, (ip.status = 'active') desc, ip.revision desc`;

export type ChartFields = ReturnType<typeof fieldsNeeded>;
const NO_VALUES: readonly number[] = Object.freeze([]);
const iso = (d: Date | string) => (d instanceof Date ? d : new Date(d)).toISOString();

/** The chart's one query (exported so the benchmark times exactly it). */
export function lotResultsQuery(supplierId: string, partId: string, code: string, f: ChartFields) {
  const col = (want: boolean, c: SQL) => (want ? c : sql`null`);
  return sql`
    select r.lot_id as id, l.ref, l.received_at, l.decided_at,
           json_agg(json_build_array(${col(f.sampleId, sql`r.sample_id`)}, s.serial, ${col(f.value, sql`r.value`)}, ${col(f.values, sql`r.values`)}, ${col(f.conforming, sql`r.conforming`)}) order by s.serial) as cores
    from reading r
    join lot l on l.id = r.lot_id
    join lot_sample s on s.id = r.sample_id
    where r.characteristic_code = ${code} and l.supplier_id = ${supplierId} and l.part_id = ${partId} and l.decided_at is not null
    group by r.lot_id, l.ref, l.received_at, l.decided_at
    order by l.received_at, l.ref`;
}

/** Queries only; the rules live in the service and in shared/compute/spc/drift.ts. */
@Injectable()
export class SpcRepository {
  /** Charted characteristics of the part's current plan (all, or one code). */
  async characteristics(db: DbOrTx, partId: string, code?: string): Promise<CharacteristicRow[]> {
    const { rows } = await db.execute<{ id: string; revision: number }>(sql`select id, revision from (${CURRENT_PLAN}) cur where cur.part_id = ${partId}`);
    if (!rows.length) return [];
    const plan = rows[0];
    const chars = await db
      .select()
      .from(planCharacteristic)
      .where(and(eq(planCharacteristic.planId, plan.id), code ? eq(planCharacteristic.code, code) : undefined))
      .orderBy(asc(planCharacteristic.seq));
    return chars.map((c) => ({ ...c, planRevision: plan.revision }));
  }

  /**
   * The decided lots of supplier × part with this characteristic's results, one row per lot in
   * order of receipt: a single query grouped per lot over reading_lot_code_idx, fetching only
   * the fields the chart reads (`fields`).
   */
  async lotResults(db: DbOrTx, supplierId: string, partId: string, code: string, fields: ChartFields): Promise<LotResults[]> {
    const { rows } = await db.execute<{ id: string; ref: number; received_at: Date | string; decided_at: Date | string; cores: [string | null, number, number | null, number[] | null, boolean | null][] }>(lotResultsQuery(supplierId, partId, code, fields));
    const out: LotResults[] = new Array(rows.length);
    for (let i = 0; i < rows.length; i++) {
      const r = rows[i];
      out[i] = {
        lotId: r.id,
        lotRef: r.ref,
        receivedAt: iso(r.received_at),
        decidedAt: iso(r.decided_at),
        cores: r.cores.map((c) => ({ sampleId: c[0] as string, serial: c[1], value: c[2], values: c[3] ?? NO_VALUES, conforming: c[4] })),
      };
    }
    return out;
  }

  async versions(db: DbOrTx, supplierId: string, partId: string, code: string): Promise<ControlLimitRow[]> {
    const rows = await db
      .select({ l: controlLimit, email: appUser.email })
      .from(controlLimit)
      .leftJoin(appUser, eq(appUser.id, controlLimit.frozenBy))
      .where(and(eq(controlLimit.supplierId, supplierId), eq(controlLimit.partId, partId), eq(controlLimit.characteristicCode, code)))
      .orderBy(asc(controlLimit.version));
    return rows.map((r) => ({ ...r.l, frozenByEmail: r.email }));
  }

  async signals(db: DbOrTx, supplierId: string, partId: string, code: string): Promise<DriftSignalRow[]> {
    const rows = await db
      .select({ s: driftSignal, ncrNumber: ncr.number })
      .from(driftSignal)
      .leftJoin(ncr, eq(ncr.id, driftSignal.ncrId))
      .where(and(eq(driftSignal.supplierId, supplierId), eq(driftSignal.partId, partId), eq(driftSignal.characteristicCode, code)))
      .orderBy(desc(driftSignal.createdAt), desc(driftSignal.lotRef))
      .limit(1000);
    return rows.map((r) => ({ ...r.s, ncrNumber: r.ncrNumber }));
  }

  async supplierAndPart(db: DbOrTx, supplierId: string, partId: string) {
    const [[s], [p]] = await Promise.all([
      db.select({ id: supplier.id, code: supplier.code, name: supplier.name }).from(supplier).where(eq(supplier.id, supplierId)),
      db.select({ id: part.id, partNumber: part.partNumber, revision: part.revision }).from(part).where(eq(part.id, partId)),
    ]);
    return { supplier: s, part: p };
  }

  /** One row per supplier × part × charted characteristic that has decided lots. */
  async watch(db: DbOrTx, filter: { supplierId?: string; partId?: string }): Promise<WatchRowRaw[]> {
    const { rows } = await db.execute<WatchRowRaw>(sql`
      with cur as (${CURRENT_PLAN}),
      combos as (
        select l.supplier_id, l.part_id, count(*)::int as lots, max(l.received_at) as last_lot_at
        from lot l
        where l.decided_at is not null
          ${filter.supplierId ? sql`and l.supplier_id = ${filter.supplierId}` : sql``}
          ${filter.partId ? sql`and l.part_id = ${filter.partId}` : sql``}
        group by l.supplier_id, l.part_id
      ),
      open_signals as (
        select supplier_id, part_id, characteristic_code, count(*)::int as n
        from drift_signal where status = 'open' group by 1, 2, 3
      )
      select c.supplier_id, s.code as supplier_code, s.name as supplier_name,
             c.part_id, p.part_number, p.revision as part_revision,
             pc.code, pc.name, pc.unit, pc.chart_kind, pc.subgroup_size, pc.wear_driven,
             c.lots, c.last_lot_at,
             coalesce(os.n, 0)::int as open_signals,
             cl.version as limit_version,
             f.lots_to_limit, f.lots_to_limit_lower, f.service_lots, f.service_due
      from combos c
      join cur on cur.part_id = c.part_id
      join plan_characteristic pc on pc.plan_id = cur.id and pc.chart_kind <> 'none'
      join supplier s on s.id = c.supplier_id
      join part p on p.id = c.part_id
      left join open_signals os on os.supplier_id = c.supplier_id and os.part_id = c.part_id and os.characteristic_code = pc.code
      left join control_limit cl on cl.supplier_id = c.supplier_id and cl.part_id = c.part_id and cl.characteristic_code = pc.code and cl.active
      left join die_wear_forecast f on f.supplier_id = c.supplier_id and f.part_id = c.part_id and f.characteristic_code = pc.code
      order by s.code, p.part_number, p.revision, pc.seq`);
    return rows;
  }

  async forecastRow(db: DbOrTx, supplierId: string, partId: string, code: string) {
    const [row] = await db
      .select()
      .from(dieWearForecast)
      .where(and(eq(dieWearForecast.supplierId, supplierId), eq(dieWearForecast.partId, partId), eq(dieWearForecast.characteristicCode, code)));
    return row ?? null;
  }
}
