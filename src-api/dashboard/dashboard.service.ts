import { Inject, Injectable } from '@nestjs/common';
import { sql } from 'drizzle-orm';
import { DB, type Db } from '../db/client';
import { AuditService } from '../audit/audit.service';
import { now } from '../common/clock';
import { addCalendarDays, isoDateOf } from '../../shared/compute/working-days';
import { ROLES, type Role, type SessionUser } from '../../shared/schemas/auth';
import type { AuditVerify } from '../../shared/schemas/audit';
import { STEP_INFO, type EightDStep } from '../../shared/schemas/corrective-action';
import {
  CHAIN_STATUS_CACHE_SECONDS, DASHBOARD_GAUGE_DAYS, DASHBOARD_STEP_DAYS,
  type AdminDashboard, type AuditorDashboard, type Dashboard, type DashboardDueStep, type EngineerDashboard, type InspectorDashboard, type SupplierDashboard,
} from '../../shared/schemas/dashboard';

const rowsOf = <T>(r: unknown): T[] => ((r as { rows?: T[] }).rows ?? (r as T[])) as T[];
const NO_SUPPLIER = '00000000-0000-0000-0000-000000000000';
const DAY_MS = 86_400_000;
const HOUR_MS = 3_600_000;
const LIST = 8;

/** A timestamp column as ISO 8601 UTC text (raw queries get Postgres' own format otherwise). */
const ts = (col: string) => sql.raw(`to_char((${col}) at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"')`);

interface StepRow {
  scar_id: string;
  scar_number: string;
  supplier_code: string;
  step: EightDStep;
  status: string;
  due_on: string | null;
}

const dueStep = (r: StepRow, today: string): DashboardDueStep => ({
  scarId: r.scar_id,
  scarNumber: r.scar_number,
  supplierCode: r.supplier_code,
  step: r.step,
  title: STEP_INFO[r.step]?.title ?? r.step,
  dueOn: r.due_on ?? '',
  overdue: !!r.due_on && r.due_on < today,
});

/**
 * The home page's figures, one set per role, each a handful of aggregate queries. The audit
 * chain's verification re-hashes every row, so its result is reused for a minute per process.
 */
@Injectable()
export class DashboardService {
  private chain: { at: number; value: Promise<AuditVerify> } | null = null;

  constructor(
    @Inject(DB) private readonly db: Db,
    private readonly audit: AuditService,
  ) {}

  for(user: SessionUser): Promise<Dashboard> {
    switch (user.role) {
      case 'inspector':
        return this.inspector();
      case 'engineer':
        return this.engineer();
      case 'supplier':
        return this.supplier(user.supplierId ?? NO_SUPPLIER);
      case 'auditor':
        return this.auditor();
      case 'admin':
        return this.admin();
    }
  }

  /** Today as a UTC day: its first instant and the next day's. */
  private today() {
    const at = now();
    const date = isoDateOf(at);
    const start = new Date(`${date}T00:00:00.000Z`);
    return { at, date, start, end: new Date(start.getTime() + DAY_MS) };
  }

  async inspector(): Promise<InspectorDashboard> {
    const d = this.today();
    const r = await this.db.execute(sql`
      select (count(*) filter (where status in ('received', 'inspecting')))::int as queue,
             (count(*) filter (where status = 'inspecting'))::int as inspecting,
             ${ts('min(received_at) filter (where status in (\'received\', \'inspecting\'))')} as oldest,
             (count(*) filter (where received_at >= ${d.start} and received_at < ${d.end}))::int as received,
             (count(*) filter (where decided_at >= ${d.start} and decided_at < ${d.end}))::int as decided,
             (count(*) filter (where decided_at >= ${d.start} and decided_at < ${d.end} and decision = 'accept'))::int as accepted,
             (count(*) filter (where decided_at >= ${d.start} and decided_at < ${d.end} and decision = 'reject'))::int as rejected
      from lot
    `);
    const [x] = rowsOf<{ queue: number; inspecting: number; oldest: string | null; received: number; decided: number; accepted: number; rejected: number }>(r);
    return {
      role: 'inspector',
      dock: {
        queue: x.queue,
        inspecting: x.inspecting,
        oldestReceivedAt: x.oldest,
        oldestAgeHours: x.oldest ? Math.max(0, Math.round(((d.at.getTime() - Date.parse(x.oldest)) / HOUR_MS) * 10) / 10) : null,
      },
      today: { date: d.date, received: x.received, decided: x.decided, accepted: x.accepted, rejected: x.rejected },
    };
  }

  async engineer(): Promise<EngineerDashboard> {
    const { date: today } = this.today();
    const stepsUntil = addCalendarDays(today, DASHBOARD_STEP_DAYS);
    const gaugesUntil = addCalendarDays(today, DASHBOARD_GAUGE_DAYS);
    // Steps still owed, as the corrective-action list and its reminders count them: not submitted
    // or accepted, of an open corrective action, and D8 only once the actions are accepted.
    const owed = sql`
      from corrective_action_step s
      join corrective_action ca on ca.id = s.corrective_action_id
      join supplier sp on sp.id = ca.supplier_id
      where ca.status <> 'closed'
        and s.status not in ('submitted', 'accepted')
        and s.due_on is not null
        and s.due_on <= ${stepsUntil}::date
        and (s.step <> 'D8' or ca.status in ('accepted', 'verifying'))`;
    const [ncrs, signals, stepCounts, steps, gaugeCounts, gauges] = await Promise.all([
      this.db.execute(sql`
        select (count(*) filter (where status <> 'closed'))::int as not_closed,
               (count(*) filter (where status = 'open'))::int as open,
               (count(*) filter (where status = 'in-review'))::int as in_review,
               (count(*) filter (where status = 'dispositioned'))::int as dispositioned,
               (select count(*) from lot l where l.status = 'on-hold' and not exists (select 1 from ncr n where n.lot_id = l.id and n.status <> 'closed'))::int as held
        from ncr`),
      this.db.execute(sql`select count(*)::int as open, ${ts('max(created_at)')} as latest from drift_signal where status = 'open'`),
      this.db.execute(sql`select (count(*) filter (where s.due_on < ${today}::date))::int as overdue, (count(*) filter (where s.due_on >= ${today}::date))::int as due_soon ${owed}`),
      this.db.execute(sql`select ca.id as scar_id, ca.number as scar_number, sp.code as supplier_code, s.step, s.status, s.due_on::text as due_on ${owed} order by s.due_on, ca.number, s.step limit ${LIST}`),
      this.db.execute(sql`
        select (count(*) filter (where calibration_due_on < ${today}::date))::int as overdue,
               (count(*) filter (where calibration_due_on >= ${today}::date and calibration_due_on <= ${gaugesUntil}::date))::int as due_soon
        from gauge`),
      this.db.execute(sql`
        select id, asset_tag, description, calibration_due_on::text as due_on from gauge
        where calibration_due_on <= ${gaugesUntil}::date
        order by calibration_due_on, asset_tag limit ${LIST}`),
    ]);
    const [n] = rowsOf<{ not_closed: number; open: number; in_review: number; dispositioned: number; held: number }>(ncrs);
    const [sig] = rowsOf<{ open: number; latest: string | null }>(signals);
    const [sc] = rowsOf<{ overdue: number; due_soon: number }>(stepCounts);
    const [gc] = rowsOf<{ overdue: number; due_soon: number }>(gaugeCounts);
    return {
      role: 'engineer',
      ncrs: { notClosed: n.not_closed, open: n.open, inReview: n.in_review, dispositioned: n.dispositioned, heldLotsWithoutNcr: n.held },
      driftSignals: { open: sig.open, latestAt: sig.latest },
      scarSteps: { dueSoon: sc.due_soon, overdue: sc.overdue, items: rowsOf<StepRow>(steps).map((r) => dueStep(r, today)) },
      gauges: {
        dueSoon: gc.due_soon,
        overdue: gc.overdue,
        items: rowsOf<{ id: string; asset_tag: string; description: string; due_on: string }>(gauges).map((g) => ({ id: g.id, assetTag: g.asset_tag, description: g.description, calibrationDueOn: g.due_on, overdue: g.due_on < today })),
      },
    };
  }

  /** Only the supplier's own rows are read: every query here filters by its company. */
  async supplier(supplierId: string): Promise<SupplierDashboard> {
    const { date: today } = this.today();
    const [name, steps, notices, held] = await Promise.all([
      this.db.execute(sql`select name from supplier where id = ${supplierId}`),
      this.db.execute(sql`
        select ca.id as scar_id, ca.number as scar_number, sp.code as supplier_code, s.step, s.status, s.due_on::text as due_on
        from corrective_action_step s
        join corrective_action ca on ca.id = s.corrective_action_id
        join supplier sp on sp.id = ca.supplier_id
        where ca.supplier_id = ${supplierId} and ca.status <> 'closed' and s.status in ('open', 'returned')
        order by s.due_on nulls last, ca.number, s.step
        limit 20`),
      this.db.execute(sql`select id, title, body, ${ts('created_at')} as created_at from supplier_notice where supplier_id = ${supplierId} order by created_at desc limit 5`),
      this.db.execute(sql`select count(*)::int as n from lot where supplier_id = ${supplierId} and status = 'on-hold'`),
    ]);
    return {
      role: 'supplier',
      supplierName: rowsOf<{ name: string }>(name)[0]?.name ?? '',
      openSteps: rowsOf<StepRow>(steps).map((r) => ({ ...dueStep(r, today), dueOn: r.due_on, status: r.status })),
      notices: rowsOf<{ id: string; title: string; body: string; created_at: string }>(notices).map((x) => ({ id: x.id, title: x.title, body: x.body, createdAt: x.created_at })),
      lotsOnHold: rowsOf<{ n: number }>(held)[0]?.n ?? 0,
    };
  }

  async auditor(): Promise<AuditorDashboard> {
    const [recent, chain] = await Promise.all([
      this.db.execute(sql`select id::float8 as id, ${ts('at')} as at, actor_email, action, entity, entity_id, reason from audit_event order by id desc limit 20`),
      this.chainStatus(),
    ]);
    return {
      role: 'auditor',
      recent: rowsOf<{ id: number; at: string; actor_email: string | null; action: string; entity: string; entity_id: string; reason: string | null }>(recent).map((r) => ({
        id: Number(r.id),
        at: r.at,
        actorEmail: r.actor_email,
        action: r.action,
        entity: r.entity,
        entityId: r.entity_id,
        reason: r.reason,
      })),
      chain,
    };
  }

  /**
   * The chain's verification, reused for CHAIN_STATUS_CACHE_SECONDS in this process so a home
   * page load does not re-hash the whole chain each time; concurrent loads share one run. The
   * History ledger's verify (GET /api/audit-events/verify) always recomputes.
   */
  async chainStatus(): Promise<AuditorDashboard['chain']> {
    const t = Date.now();
    const fresh = this.chain && t - this.chain.at < CHAIN_STATUS_CACHE_SECONDS * 1000;
    if (!fresh) {
      const value = this.audit.verify();
      this.chain = { at: t, value };
      // A failed run is not remembered: the next load tries again.
      value.catch(() => {
        if (this.chain?.value === value) this.chain = null;
      });
    }
    const v = await this.chain!.value;
    return { ...v, cached: !!fresh };
  }

  async admin(): Promise<AdminDashboard> {
    const at = now();
    const [counts, locked] = await Promise.all([
      this.db.execute(sql`
        select role, count(*)::int as total,
               (count(*) filter (where active))::int as active,
               (count(*) filter (where locked_until > ${at}))::int as locked
        from app_user group by role`),
      this.db.execute(sql`select id, email, name, role, ${ts('locked_until')} as locked_until from app_user where locked_until > ${at} order by locked_until desc limit 20`),
    ]);
    const rows = rowsOf<{ role: Role; total: number; active: number; locked: number }>(counts);
    const byRole = Object.fromEntries(ROLES.map((r) => [r, rows.find((x) => x.role === r)?.total ?? 0])) as Record<Role, number>;
    const sum = (k: 'total' | 'active' | 'locked') => rows.reduce((a, x) => a + x[k], 0);
    return {
      role: 'admin',
      users: { total: sum('total'), active: sum('active'), inactive: sum('total') - sum('active'), locked: sum('locked'), byRole },
      lockedAccounts: rowsOf<{ id: string; email: string; name: string; role: Role; locked_until: string }>(locked).map((u) => ({ id: u.id, email: u.email, name: u.name, role: u.role, lockedUntil: u.locked_until })),
    };
  }
}
