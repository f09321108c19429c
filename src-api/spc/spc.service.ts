import { BadRequestException, Inject, Injectable } from '@nestjs/common';
import { and, eq, max, sql } from 'drizzle-orm';
import { DB, type Db, type DbOrTx, type Tx } from '../db/client';
import { controlLimit, dieWearForecast, driftSignal } from '../db/schema';
import { AuditRepository } from '../audit/audit.repository';
import { conflict, notFound } from '../common/errors';
import { now as clockNow } from '../common/clock';
import { ValidationFailed, fieldsFromZod } from '../common/zod.pipe';
import { SupplierNoticesService } from '../supplier-desk/supplier-notices.service';
import { SpcRepository, type CharacteristicRow, type ControlLimitRow, type DriftSignalRow } from './spc.repository';
import { ComputeError } from '../../shared/compute/errors';
import { analyze } from '../../shared/compute/spc/analyze';
import { RULE_DESCRIPTIONS, type RuleId, type RuleSetName } from '../../shared/compute/spc/rules';
import {
  buildSeries,
  DEFAULT_SERVICE_LOTS,
  dieWearForecast as computeWear,
  driftCapability,
  fieldsNeeded,
  histogram,
  judgeSeries,
  measurements,
  proposeLimits,
  type DieWear,
  type DriftCharacteristic,
  type FrozenLimits,
  type Judgement,
  type Series,
} from '../../shared/compute/spc/drift';
import { spcAnalyzeInputSchema } from '../../shared/schemas/spc';
import {
  WATCH_STATUSES,
  type AckSignalInput,
  type AnalyzeResult,
  type ChartPoint,
  type ChartQuery,
  type ChartResponse,
  type ControlLimit,
  type DriftSignal,
  type Forecast,
  type FreezeLimitsInput,
  type WatchRow,
} from '../../shared/schemas/drift';
import type { SessionUser } from '../../shared/schemas/auth';

type Loaded = { supplierId: string; partId: string; char: CharacteristicRow; series: Series; versions: ControlLimitRow[]; judgement: Judgement };

const toDrift = (c: CharacteristicRow): DriftCharacteristic => ({
  code: c.code,
  kind: c.kind,
  layout: c.layout,
  readingsPerSample: c.readingsPerSample,
  chartKind: c.chartKind as DriftCharacteristic['chartKind'],
  subgroupSize: c.subgroupSize,
  lsl: c.lsl,
  usl: c.usl,
  ruleSet: (c.ruleSet as RuleSetName) ?? 'western-electric',
});

const toFrozen = (v: ControlLimitRow): FrozenLimits => ({ version: v.version, frozenAt: v.frozenAt.toISOString(), chart: v.chartKind, center: v.center, sigma: v.sigma });

export function toLimitView(v: ControlLimitRow): ControlLimit {
  return {
    id: v.id,
    version: v.version,
    active: v.active,
    chart: v.chartKind,
    subgroupSize: v.subgroupSize,
    ruleSet: v.ruleSet,
    center: v.center,
    ucl: v.ucl,
    lcl: v.lcl,
    sigma: v.sigma,
    rangeCenter: v.rangeCenter,
    rangeUcl: v.rangeUcl,
    rangeLcl: v.rangeLcl,
    baseline: v.baseline,
    baselineSubgroups: v.baselineSubgroups,
    excluded: v.excluded,
    excludedPoints: v.excludedPoints,
    iterations: v.iterations,
    serviceLots: v.serviceLots,
    reason: v.reason,
    frozenBy: v.frozenBy,
    frozenByEmail: v.frozenByEmail,
    frozenAt: v.frozenAt.toISOString(),
  };
}

/** Signals to raise for supplier × part, worked out by SpcService.planSignals. */
export interface SignalPlan {
  supplierId: string;
  partId: string;
  actor?: SessionUser;
  charts: { loaded: Loaded; rows: Omit<typeof driftSignal.$inferInsert, 'createdAt'>[] }[];
}

export function toSignalView(s: DriftSignalRow): DriftSignal {
  return {
    id: s.id,
    supplierId: s.supplierId,
    partId: s.partId,
    characteristicCode: s.characteristicCode,
    rule: s.rule as RuleId,
    chart: s.chart,
    lotId: s.lotId,
    lotRef: s.lotRef,
    sampleId: s.sampleId,
    serial: s.serial,
    value: s.value,
    center: s.center,
    ucl: s.ucl,
    lcl: s.lcl,
    limitVersion: s.limitVersion,
    message: s.message,
    description: RULE_DESCRIPTIONS[s.rule as RuleId] ?? s.rule,
    status: s.status,
    ackNote: s.ackNote,
    ackBy: s.ackBy,
    ackAt: s.ackAt?.toISOString() ?? null,
    ncrId: s.ncrId,
    ncrNumber: s.ncrNumber ?? null,
    createdAt: s.createdAt.toISOString(),
  };
}

const forecastView = (f: DieWear): Forecast => ({
  slope: f.slope,
  intercept: f.intercept,
  r2: f.r2,
  n: f.n,
  residualSd: f.residualSd,
  usl: f.usl,
  confidence: f.confidence,
  lotsToLimit: f.lotsToLimit,
  lotsToLimitLower: f.lotsToLimitLower,
  lotsUsed: f.lotsUsed,
  firstLotSeq: f.firstLotSeq,
  lastLotSeq: f.lastLotSeq,
  serviceLots: f.serviceLots,
  serviceDue: f.serviceDue,
});

function asBadRequest(err: unknown): never {
  if (err instanceof ComputeError) throw new ValidationFailed({ [err.field ?? '_']: err.message }, err.message);
  throw err;
}

/** The chart's user-facing key in messages. */
const keyOf = (s: { supplierId: string; partId: string; characteristicCode: string }) => `${s.supplierId}:${s.partId}:${s.characteristicCode}`;

@Injectable()
export class SpcService {
  constructor(
    @Inject(DB) private readonly db: Db,
    private readonly repo: SpcRepository,
    private readonly audit: AuditRepository,
    private readonly notices: SupplierNoticesService,
  ) {}

  // ───────── reading ─────────

  async watch(filter: { supplierId?: string; partId?: string }): Promise<WatchRow[]> {
    const rows = await this.repo.watch(this.db, filter);
    return rows.map((r) => {
      const wear = r.wear_driven;
      const due = wear && r.service_due === true;
      const status: (typeof WATCH_STATUSES)[number] = due ? 'die-service-due' : r.open_signals > 0 ? 'signal' : r.lots < 2 ? 'insufficient-data' : 'in-control';
      return {
        supplierId: r.supplier_id,
        supplierCode: r.supplier_code,
        supplierName: r.supplier_name,
        partId: r.part_id,
        partNumber: r.part_number,
        partRevision: r.part_revision,
        characteristicCode: r.code,
        characteristicName: r.name,
        unit: r.unit,
        chart: (r.chart_kind === 'xbar-r' && (r.subgroup_size ?? 0) > 10 ? 'xbar-s' : r.chart_kind) as WatchRow['chart'],
        wearDriven: wear,
        status,
        openSignals: r.open_signals,
        lots: r.lots,
        lastLotAt: r.last_lot_at ? new Date(r.last_lot_at).toISOString() : null,
        limitVersion: r.limit_version,
        ...(wear ? { lotsToLimit: r.lots_to_limit, lotsToLimitLower: r.lots_to_limit_lower, serviceLots: r.service_lots ?? DEFAULT_SERVICE_LOTS } : {}),
      };
    });
  }

  /** Loads and judges one chart: the current plan's characteristic, the lots, the limit versions. */
  /** `char`: the row when already read (null = read and not found). */
  private async load(db: DbOrTx, supplierId: string, partId: string, code: string, char?: CharacteristicRow | null): Promise<Loaded> {
    const c = char === undefined ? (await this.repo.characteristics(db, partId, code))[0] : char;
    if (!c) throw notFound('characteristic on this part’s plan');
    if (c.chartKind === 'none') throw new ValidationFailed({ characteristicCode: `${c.code} is not charted: its plan sets no chart kind` }, `${c.code} is not charted`);
    const [lots, versions] = await Promise.all([this.repo.lotResults(db, supplierId, partId, c.code, fieldsNeeded(toDrift(c))), this.repo.versions(db, supplierId, partId, c.code)]);
    let series: Series;
    try {
      series = buildSeries(toDrift(c), lots);
    } catch (err) {
      asBadRequest(err);
    }
    const judgement = judgeSeries(series, versions.map(toFrozen), toDrift(c).ruleSet);
    return { supplierId, partId, char: c, series, versions, judgement };
  }

  private forecastFor(l: Loaded): DieWear | null {
    if (!l.char.wearDriven || l.char.usl == null) return null;
    const active = l.versions.find((v) => v.active);
    try {
      return computeWear(l.series, l.char.usl, { serviceLots: active?.serviceLots ?? DEFAULT_SERVICE_LOTS });
    } catch (err) {
      if (err instanceof ComputeError) return null;
      throw err;
    }
  }

  async chart(q: ChartQuery): Promise<ChartResponse> {
    // Independent reads in parallel: names, the characteristic, then the series with its versions and signals.
    const [{ supplier, part }, [char]] = await Promise.all([this.repo.supplierAndPart(this.db, q.supplierId, q.partId), this.repo.characteristics(this.db, q.partId, q.characteristicCode)]);
    if (!supplier) throw notFound('supplier');
    if (!part) throw notFound('part');
    const [l, signals] = await Promise.all([this.load(this.db, q.supplierId, q.partId, q.characteristicCode, char ?? null), this.repo.signals(this.db, q.supplierId, q.partId, q.characteristicCode)]);
    const byKey = new Map(signals.map((s) => [`${s.chart}|${s.rule}|${s.lotId}`, s.id]));
    const inRange = (iso: string) => {
      const d = iso.slice(0, 10);
      return (!q.from || d >= q.from) && (!q.to || d <= q.to);
    };
    const pts = l.judgement.points.filter((p) => inRange(p.receivedAt));
    const cap = driftCapability(l.series, pts, l.char.lsl, l.char.usl);
    const wear = this.forecastFor(l);
    const active = l.versions.find((v) => v.active) ?? null;
    return {
      supplier,
      part,
      characteristic: {
        code: l.char.code,
        name: l.char.name,
        kind: l.char.kind,
        unit: l.char.unit,
        lsl: l.char.lsl,
        usl: l.char.usl,
        chartKind: l.char.chartKind,
        subgroupSize: l.char.subgroupSize,
        readingsPerSample: l.char.readingsPerSample,
        ruleSet: toDrift(l.char).ruleSet,
        wearDriven: l.char.wearDriven,
        planRevision: l.char.planRevision,
      },
      chart: l.series.chart,
      subgrouping: { mode: l.series.mode, n: l.series.n, explanation: l.series.explanation },
      points: pts.map((p) => {
        const v: ChartPoint = { index: p.index, lotId: p.lotId, lotRef: p.lotRef, lotSeq: p.lotSeq, receivedAt: p.receivedAt, value: p.value, segment: p.segment };
        if (p.serial !== null) v.serial = p.serial;
        if (p.chunk !== null) v.chunk = p.chunk;
        if (p.dispersion !== null) v.dispersion = p.dispersion;
        if (p.defectives !== undefined) {
          v.defectives = p.defectives;
          v.size = p.size;
          if (p.limits) {
            v.ucl = p.limits.ucl;
            v.lcl = p.limits.lcl;
          }
        }
        if (p.flags.length) v.flags = p.flags.map((f) => ({ ...f, signalId: byKey.get(`${f.chart}|${f.rule}|${p.lotId}`) ?? null }));
        return v;
      }),
      totalPoints: l.judgement.points.length,
      segments: l.judgement.segments,
      skipped: l.series.skipped,
      limits: active ? toLimitView(active) : null,
      versions: l.versions.map(toLimitView),
      trial: l.judgement.trial,
      trialNote: l.judgement.trialNote,
      signals: signals.map(toSignalView),
      capability: cap.result ? { ...cap.result, cp: cap.result.cp ?? null, pp: cap.result.pp ?? null } : null,
      capabilityWarnings: cap.warnings,
      histogram: histogram(measurements(l.series, pts), l.char.lsl, l.char.usl),
      forecast: wear ? forecastView(wear) : null,
      forecastNote:
        l.char.wearDriven && l.char.usl == null
          ? 'No upper limit to forecast against.'
          : l.char.wearDriven && !wear
            ? 'The forecast needs measurements from at least 3 lots.'
            : wear && wear.lotsToLimit === null
              ? 'No upward trend over the recent lots: nothing to forecast.'
              : null,
    };
  }

  // ───────── the calculator ─────────

  analyze(body: unknown): AnalyzeResult {
    const parsed = spcAnalyzeInputSchema.safeParse(body);
    if (!parsed.success) {
      const fields = fieldsFromZod(parsed.error);
      throw new ValidationFailed(fields, Object.entries(fields).map(([k, m]) => (k === '_' ? m : `${k}: ${m}`)).join('; '));
    }
    let r: ReturnType<typeof analyze>;
    try {
      r = analyze(parsed.data);
    } catch (err) {
      asBadRequest(err);
    }
    const { capability, ...rest } = r;
    return {
      ...rest,
      signals: r.signals.map((s) => ({ rule: s.rule as RuleId, index: s.index, chart: s.chart, message: s.message })),
      ...(capability
        ? { capability: { cp: capability.cp, cpk: capability.cpk, pp: capability.pp, ppk: capability.ppk, mean: capability.mean, sigmaWithin: capability.sigmaWithin, sigmaOverall: capability.sigmaOverall, n: capability.n } }
        : {}),
    };
  }

  // ───────── writing ─────────

  /** Phase I on the chosen baseline, stored as the next limit version (audited with the reason). */
  async freeze(actor: SessionUser, body: FreezeLimitsInput): Promise<ControlLimit> {
    const id = await this.db.transaction(async (tx) => {
      const { supplier, part } = await this.repo.supplierAndPart(tx, body.supplierId, body.partId);
      if (!supplier) throw new ValidationFailed({ supplierId: 'No such supplier' });
      if (!part) throw new ValidationFailed({ partId: 'No such part' });
      // One freezer at a time per chart, so version numbers never collide.
      await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${`spc:${keyOf(body)}`}))`);
      const l = await this.load(tx, body.supplierId, body.partId, body.characteristicCode);
      const pts = l.series.points;
      let baseline: number[];
      let description: string;
      if (body.baseline.kind === 'first') {
        const k = body.baseline.count;
        if (k > pts.length) throw new ValidationFailed({ 'baseline.count': `Only ${pts.length} subgroup${pts.length === 1 ? '' : 's'} so far; choose at most ${pts.length}` });
        baseline = pts.slice(0, k).map((_, i) => i);
        description = `first ${k} subgroups (lots ${pts[0]?.lotRef}–${pts[k - 1]?.lotRef})`;
      } else {
        const { from, to } = body.baseline;
        baseline = pts.flatMap((p, i) => (p.receivedAt.slice(0, 10) >= from && p.receivedAt.slice(0, 10) <= to ? [i] : []));
        if (baseline.length < 2) throw new ValidationFailed({ 'baseline.from': `Only ${baseline.length} subgroup${baseline.length === 1 ? '' : 's'} were received from ${from} to ${to}; the baseline needs at least 2` });
        description = `lots received ${from} to ${to} (${baseline.length} subgroups)`;
      }
      let prop: ReturnType<typeof proposeLimits>;
      try {
        prop = proposeLimits(l.series, baseline, toDrift(l.char).ruleSet);
      } catch (err) {
        asBadRequest(err);
      }
      const previous = l.versions.find((v) => v.active) ?? null;
      const [{ top }] = await tx
        .select({ top: max(controlLimit.version) })
        .from(controlLimit)
        .where(and(eq(controlLimit.supplierId, body.supplierId), eq(controlLimit.partId, body.partId), eq(controlLimit.characteristicCode, l.char.code)));
      const version = (top ?? 0) + 1;
      if (previous) await tx.update(controlLimit).set({ active: false }).where(eq(controlLimit.id, previous.id));
      const excludedPoints = prop.excluded.map((i) => ({ lotId: pts[i].lotId, lotRef: pts[i].lotRef, serial: pts[i].serial }));
      const [row] = await tx
        .insert(controlLimit)
        .values({
          supplierId: body.supplierId,
          partId: body.partId,
          characteristicCode: l.char.code,
          version,
          active: true,
          chartKind: prop.chart,
          subgroupSize: prop.n,
          ruleSet: toDrift(l.char).ruleSet,
          center: prop.center,
          ucl: prop.ucl,
          lcl: prop.lcl,
          sigma: prop.sigma,
          rangeCenter: prop.rangeCenter,
          rangeUcl: prop.rangeUcl,
          rangeLcl: prop.rangeLcl,
          baseline: { ...body.baseline, description },
          baselineSubgroups: prop.baselineCount,
          excluded: prop.excluded,
          excludedPoints,
          iterations: prop.iterations,
          serviceLots: body.serviceLots ?? previous?.serviceLots ?? DEFAULT_SERVICE_LOTS,
          reason: body.reason,
          frozenBy: actor.id,
          frozenAt: clockNow(),
        })
        .returning();
      await this.audit.record(tx, {
        actorId: actor.id,
        actorEmail: actor.email,
        action: 'spc.limits_frozen',
        entity: 'control_limit',
        entityId: row.id,
        before: previous ? { version: previous.version, center: previous.center, sigma: previous.sigma } : null,
        after: { supplier: supplier.code, part: `${part.partNumber}/${part.revision}`, code: l.char.code, version, chart: prop.chart, n: prop.n, center: prop.center, sigma: prop.sigma, ucl: prop.ucl, lcl: prop.lcl, baseline: description, excluded: excludedPoints.map((p) => p.lotRef) },
        reason: body.reason,
      });
      // The notice threshold may have changed with the new version.
      await this.storeForecast(tx, { ...l, versions: [...l.versions.map((v) => ({ ...v, active: false })), { ...row, frozenByEmail: actor.email }] }, actor);
      return row.id;
    });
    const [v] = (await this.repo.versions(this.db, body.supplierId, body.partId, body.characteristicCode)).filter((x) => x.id === id);
    return toLimitView(v);
  }

  async acknowledge(actor: SessionUser, id: string, body: AckSignalInput): Promise<DriftSignal> {
    const row = await this.db.transaction(async (tx) => {
      const [s] = await tx.select().from(driftSignal).where(eq(driftSignal.id, id)).for('update');
      if (!s) throw notFound('signal');
      if (s.status !== 'open') throw conflict(`This signal was already ${s.status === 'acknowledged' ? 'acknowledged' : 'taken into a nonconformance'}${s.ackAt ? ` on ${s.ackAt.toISOString().slice(0, 10)}` : ''}.`);
      const at = clockNow();
      const [u] = await tx.update(driftSignal).set({ status: 'acknowledged', ackNote: body.note, ackBy: actor.id, ackAt: at }).where(eq(driftSignal.id, id)).returning();
      await this.audit.record(tx, {
        actorId: actor.id,
        actorEmail: actor.email,
        action: 'spc.signal_acknowledged',
        entity: 'drift_signal',
        entityId: id,
        before: { status: s.status },
        after: { status: 'acknowledged', rule: s.rule, lot: s.lotRef, code: s.characteristicCode },
        reason: body.note,
      });
      return u;
    });
    return toSignalView(row);
  }

  /**
   * Raises drift signals for new run-rule violations of supplier × part, inside the caller's
   * transaction, and refreshes the die-wear forecast. With `lotId`, only that lot's points raise
   * signals — the violations the decision is "new" for; without it every flagged point not yet
   * recorded does (a backfill). A signal is raised once per chart × rule × lot (unique key),
   * keeping the version that judged it.
   */
  async refreshSignals(tx: Tx, supplierId: string, partId: string, opts: { lotId?: string; actor?: SessionUser } = {}): Promise<{ raised: number }> {
    return this.applySignals(tx, await this.planSignals(tx, supplierId, partId, opts));
  }

  /**
   * The reading half of refreshSignals: every charted characteristic's history judged, and the
   * signals to raise. It takes no lock, so a caller (LotsService.decide) runs it before its first
   * audit record: the audit chain's lock is then not held while whole histories are read.
   */
  async planSignals(tx: Tx, supplierId: string, partId: string, opts: { lotId?: string; actor?: SessionUser } = {}): Promise<SignalPlan> {
    const chars = (await this.repo.characteristics(tx, partId)).filter((c) => c.chartKind !== 'none');
    const charts: SignalPlan['charts'] = [];
    for (const c of chars) {
      let l: Loaded;
      try {
        l = await this.load(tx, supplierId, partId, c.code, c);
      } catch (err) {
        // A characteristic that cannot be charted must never block a lot decision.
        if (err instanceof BadRequestException) continue;
        throw err;
      }
      const first = new Map<string, { p: Judgement['points'][number]; f: Judgement['points'][number]['flags'][number] }>();
      for (const p of l.judgement.points) {
        if (opts.lotId && p.lotId !== opts.lotId) continue;
        for (const f of p.flags) {
          const key = `${f.chart}|${f.rule}|${p.lotId}`;
          if (!first.has(key)) first.set(key, { p, f });
        }
      }
      charts.push({
        loaded: l,
        rows: [...first.values()].map(({ p, f }) => ({
          supplierId,
          partId,
          characteristicCode: c.code,
          rule: f.rule,
          chart: f.chart,
          lotId: p.lotId,
          lotRef: p.lotRef,
          sampleId: p.sampleId,
          serial: p.serial,
          value: f.chart === 'dispersion' ? (p.dispersion ?? p.value) : p.value,
          center: f.chart === 'dispersion' ? (p.limits?.dispersionCenter ?? null) : (p.limits?.center ?? null),
          ucl: f.chart === 'dispersion' ? (p.limits?.dispersionUcl ?? null) : (p.limits?.ucl ?? null),
          lcl: f.chart === 'dispersion' ? (p.limits?.dispersionLcl ?? null) : (p.limits?.lcl ?? null),
          limitVersion: p.limitVersion,
          message: f.message,
        })),
      });
    }
    return { supplierId, partId, actor: opts.actor, charts };
  }

  /** The writing half: the planned signals inserted (once each) and audited, forecasts stored. */
  async applySignals(tx: Tx, plan: SignalPlan): Promise<{ raised: number }> {
    let raised = 0;
    for (const { loaded: l, rows } of plan.charts) {
      if (rows.length) {
        const at = clockNow();
        const inserted = await tx
          .insert(driftSignal)
          .values(rows.map((r) => ({ ...r, createdAt: at })))
          .onConflictDoNothing()
          .returning({ id: driftSignal.id, rule: driftSignal.rule, lotRef: driftSignal.lotRef, limitVersion: driftSignal.limitVersion });
        if (inserted.length) {
          raised += inserted.length;
          await this.audit.record(tx, {
            actorId: plan.actor?.id ?? null,
            actorEmail: plan.actor?.email ?? null,
            action: 'spc.signals_raised',
            entity: 'drift_chart',
            entityId: keyOf({ supplierId: plan.supplierId, partId: plan.partId, characteristicCode: l.char.code }),
            after: { code: l.char.code, signals: inserted.map((s) => ({ id: s.id, rule: s.rule, lot: s.lotRef, limitVersion: s.limitVersion })) },
          });
        }
      }
      await this.storeForecast(tx, l, plan.actor);
    }
    return { raised };
  }

  /** Upserts the die-wear forecast row behind the "die service due" notice. */
  private async storeForecast(tx: Tx, l: Loaded, actor?: SessionUser): Promise<void> {
    if (!l.char.wearDriven) return;
    const ids = { supplierId: l.supplierId, partId: l.partId };
    const where = and(eq(dieWearForecast.supplierId, ids.supplierId), eq(dieWearForecast.partId, ids.partId), eq(dieWearForecast.characteristicCode, l.char.code));
    const wear = this.forecastFor(l);
    const before = await this.repo.forecastRow(tx, ids.supplierId, ids.partId, l.char.code);
    if (!wear || wear.lotsToLimit === null) {
      if (before) await tx.delete(dieWearForecast).where(where);
      return;
    }
    const at = clockNow();
    const lastLot = l.series.points[l.series.points.length - 1]?.lotId ?? null;
    const values = {
      lastLotId: lastLot,
      lotsUsed: wear.lotsUsed,
      slope: wear.slope,
      intercept: wear.intercept,
      usl: wear.usl,
      lotsToLimit: wear.lotsToLimit,
      lotsToLimitLower: wear.lotsToLimitLower,
      serviceLots: wear.serviceLots,
      serviceDue: wear.serviceDue,
      dueSince: wear.serviceDue ? (before?.serviceDue ? before.dueSince : at) : null,
      notifiedAt: wear.serviceDue && before?.serviceDue ? before.notifiedAt : null,
      computedAt: at,
    };
    await tx
      .insert(dieWearForecast)
      .values({ supplierId: ids.supplierId, partId: ids.partId, characteristicCode: l.char.code, ...values })
      .onConflictDoUpdate({ target: [dieWearForecast.supplierId, dieWearForecast.partId, dieWearForecast.characteristicCode], set: values });
    if (wear.serviceDue && !before?.serviceDue) {
      // The supplier's desk notice and its e-mail (quiet for a while after one was sent).
      await this.notices.dieServiceDue(
        {
          ...ids,
          characteristicCode: l.char.code,
          lotsRemaining: wear.lotsToLimit,
          detail: `The conservative forecast leaves ${Math.floor(wear.lotsToLimitLower ?? 0)} lot${Math.floor(wear.lotsToLimitLower ?? 0) === 1 ? '' : 's'} before the limit of ${wear.usl}${l.char.unit ? ` ${l.char.unit}` : ''} (trend ${wear.slope >= 0 ? '+' : ''}${wear.slope.toPrecision(3)}${l.char.unit ? ` ${l.char.unit}` : ''} per lot over the last ${wear.lotsUsed} lots).`,
          actor: actor ? { id: actor.id, email: actor.email } : null,
        },
        tx,
      );
      await this.audit.record(tx, {
        actorId: actor?.id ?? null,
        actorEmail: actor?.email ?? null,
        action: 'spc.die_service_due',
        entity: 'die_wear_forecast',
        entityId: keyOf({ ...ids, characteristicCode: l.char.code }),
        after: { code: l.char.code, lotsToLimit: wear.lotsToLimit, lotsToLimitLower: wear.lotsToLimitLower, serviceLots: wear.serviceLots, usl: wear.usl },
      });
    }
  }
}
