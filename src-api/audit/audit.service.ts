import { Inject, Injectable } from '@nestjs/common';
import { and, asc, count, desc, eq, gt, gte, ilike, lte } from 'drizzle-orm';
import { DB, type Db } from '../db/client';
import { auditEvent } from '../db/schema';
import { offsetOf } from '../common/paging';
import { chainHash } from './audit-hash';
import type { AuditEvent, AuditVerify, auditQuerySchema } from '../../shared/schemas/audit';
import type { z } from 'zod';

type Row = typeof auditEvent.$inferSelect;
export const toAuditEvent = (r: Row): AuditEvent => ({
  id: r.id,
  actorId: r.actorId,
  actorEmail: r.actorEmail,
  at: r.at.toISOString(),
  action: r.action,
  entity: r.entity,
  entityId: r.entityId,
  before: r.before,
  after: r.after,
  reason: r.reason,
  hash: r.hash,
  prevHash: r.prevHash,
});

@Injectable()
export class AuditService {
  constructor(@Inject(DB) private readonly db: Db) {}

  where(q: Partial<z.infer<typeof auditQuerySchema>>) {
    return and(
      q.entity ? eq(auditEvent.entity, q.entity) : undefined,
      q.entityId ? eq(auditEvent.entityId, q.entityId) : undefined,
      q.actor ? ilike(auditEvent.actorEmail, `%${q.actor.replace(/[\\%_]/g, (c) => `\\${c}`)}%`) : undefined,
      q.action ? eq(auditEvent.action, q.action) : undefined,
      q.from ? gte(auditEvent.at, new Date(q.from)) : undefined,
      q.to ? lte(auditEvent.at, new Date(q.to)) : undefined,
    );
  }

  async list(q: z.infer<typeof auditQuerySchema>): Promise<{ items: AuditEvent[]; total: number }> {
    const where = this.where(q);
    const rows = await this.db
      .select()
      .from(auditEvent)
      .where(where)
      .orderBy(q.sort === 'at' ? asc(auditEvent.id) : desc(auditEvent.id))
      .limit(q.pageSize)
      .offset(offsetOf(q.page, q.pageSize));
    const [{ n }] = await this.db.select({ n: count() }).from(auditEvent).where(where);
    return { items: rows.map(toAuditEvent), total: n };
  }

  /** Recomputes every hash in id order; the first row whose link or content does not match is named. */
  async verify(): Promise<AuditVerify> {
    let prev: string | null = null;
    let lastId = 0;
    let n = 0;
    for (;;) {
      const rows = await this.db.select().from(auditEvent).where(gt(auditEvent.id, lastId)).orderBy(asc(auditEvent.id)).limit(5000);
      if (!rows.length) break;
      for (const r of rows) {
        const expected = chainHash(prev, { actorId: r.actorId, actorEmail: r.actorEmail, at: r.at, action: r.action, entity: r.entity, entityId: r.entityId, before: r.before, after: r.after, reason: r.reason });
        if (r.prevHash !== prev || r.hash !== expected) return { ok: false, count: n, firstBrokenId: r.id, checkedAt: new Date().toISOString() };
        prev = r.hash;
        n++;
      }
      lastId = rows[rows.length - 1].id;
    }
    return { ok: true, count: n, checkedAt: new Date().toISOString() };
  }
}
