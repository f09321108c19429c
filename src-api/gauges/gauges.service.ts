import { Inject, Injectable } from '@nestjs/common';
import { and, count, eq, gte, ilike, lt, lte, or, sql } from 'drizzle-orm';
import { now as clockNow } from '../common/clock';
import { DB, type Db, type DbOrTx } from '../db/client';
import { gauge } from '../db/schema';
import { AuditRepository } from '../audit/audit.repository';
import { conflict, isUniqueViolation, notFound, stale } from '../common/errors';
import { likeEscape, offsetOf, orderFrom } from '../common/paging';
import type { SessionUser } from '../../shared/schemas/auth';
import { ValidationFailed } from '../common/zod.pipe';
import type { CreateGaugeInput, Gauge, UpdateGaugeInput, gaugeListQuerySchema } from '../../shared/schemas/master-data';
import type { z } from 'zod';

type Row = typeof gauge.$inferSelect;
export const DUE_SOON_DAYS = 30;

/** Today as a calendar date in UTC: calibration is due on a date, not at an instant. */
export function todayIso(now = clockNow()): string {
  return now.toISOString().slice(0, 10);
}

export function daysBetween(fromIso: string, toIso: string): number {
  return Math.round((Date.parse(toIso) - Date.parse(fromIso)) / 86_400_000);
}

export function toGauge(r: Row, today = todayIso()): Gauge {
  const dueInDays = daysBetween(today, r.calibrationDueOn);
  return {
    id: r.id,
    assetTag: r.assetTag,
    kind: r.kind as Gauge['kind'],
    description: r.description,
    resolution: r.resolution,
    unit: r.unit as Gauge['unit'],
    rangeMin: r.rangeMin,
    rangeMax: r.rangeMax,
    calibrationDueOn: r.calibrationDueOn,
    status: r.status,
    calibrationOverdue: dueInDays < 0,
    dueInDays,
    version: r.version,
  };
}

@Injectable()
export class GaugesService {
  constructor(
    @Inject(DB) private readonly db: Db,
    private readonly audit: AuditRepository,
  ) {}

  async list(q: z.infer<typeof gaugeListQuerySchema>): Promise<{ items: Gauge[]; total: number }> {
    const today = todayIso();
    const soon = todayIso(new Date(Date.now() + DUE_SOON_DAYS * 86_400_000));
    const where = and(
      q.q ? or(ilike(gauge.assetTag, likeEscape(q.q)), ilike(gauge.description, likeEscape(q.q))) : undefined,
      q.kind ? eq(gauge.kind, q.kind) : undefined,
      q.status ? eq(gauge.status, q.status) : undefined,
      q.calibration === 'overdue' ? lt(gauge.calibrationDueOn, today) : undefined,
      q.calibration === 'due-soon' ? and(gte(gauge.calibrationDueOn, today), lte(gauge.calibrationDueOn, soon)) : undefined,
      q.calibration === 'ok' ? sql`${gauge.calibrationDueOn} > ${soon}` : undefined,
    );
    const rows = await this.db
      .select()
      .from(gauge)
      .where(where)
      .orderBy(...orderFrom(q.sort, { assetTag: gauge.assetTag, calibrationDueOn: gauge.calibrationDueOn, kind: gauge.kind }, gauge.assetTag))
      .limit(q.pageSize)
      .offset(offsetOf(q.page, q.pageSize));
    const [{ n }] = await this.db.select({ n: count() }).from(gauge).where(where);
    return { items: rows.map((r) => toGauge(r, today)), total: n };
  }

  async get(id: string, tx: DbOrTx = this.db): Promise<Gauge> {
    const [row] = await tx.select().from(gauge).where(eq(gauge.id, id));
    if (!row) throw notFound('gauge');
    return toGauge(row);
  }

  async create(actor: SessionUser, input: CreateGaugeInput): Promise<Gauge> {
    try {
      return await this.db.transaction(async (tx) => {
        const [row] = await tx
          .insert(gauge)
          .values({
            assetTag: input.assetTag,
            kind: input.kind,
            description: input.description,
            resolution: input.resolution,
            unit: input.unit,
            rangeMin: input.rangeMin ?? null,
            rangeMax: input.rangeMax ?? null,
            calibrationDueOn: input.calibrationDueOn,
            status: input.status ?? 'in-service',
          })
          .returning();
        await this.audit.record(tx, { actorId: actor.id, actorEmail: actor.email, action: 'gauge.created', entity: 'gauge', entityId: row.id, after: toGauge(row) });
        return toGauge(row);
      });
    } catch (err) {
      if (isUniqueViolation(err)) throw conflict(`Asset tag ${input.assetTag} is already in use`, { assetTag: 'Already in use' });
      throw err;
    }
  }

  async update(actor: SessionUser, id: string, input: UpdateGaugeInput): Promise<Gauge> {
    return this.db.transaction(async (tx) => {
      const [before] = await tx.select().from(gauge).where(eq(gauge.id, id)).for('update');
      if (!before) throw notFound('gauge');
      if (before.version !== input.version) throw stale('gauge');
      const { version: _v, ...rest } = input;
      const min = rest.rangeMin !== undefined ? rest.rangeMin : before.rangeMin;
      const max = rest.rangeMax !== undefined ? rest.rangeMax : before.rangeMax;
      if (min != null && max != null && min >= max) throw new ValidationFailed({ rangeMax: 'The range top must be above its bottom' });
      const [row] = await tx
        .update(gauge)
        .set({ ...rest, version: before.version + 1, updatedAt: clockNow() } as Partial<Row>)
        .where(eq(gauge.id, id))
        .returning();
      const recal = rest.calibrationDueOn && rest.calibrationDueOn !== before.calibrationDueOn;
      await this.audit.record(tx, { actorId: actor.id, actorEmail: actor.email, action: recal ? 'gauge.calibrated' : 'gauge.updated', entity: 'gauge', entityId: id, before: toGauge(before), after: toGauge(row) });
      return toGauge(row);
    });
  }
}
