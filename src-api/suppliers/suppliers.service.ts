import { Inject, Injectable } from '@nestjs/common';
import { and, count, eq, ilike, or, type SQL } from 'drizzle-orm';
import { now as clockNow } from '../common/clock';
import { DB, type Db } from '../db/client';
import { supplier } from '../db/schema';
import { AuditRepository } from '../audit/audit.repository';
import { notFound, stale, isUniqueViolation, conflict } from '../common/errors';
import { likeEscape, offsetOf, orderFrom } from '../common/paging';
import { ValidationFailed } from '../common/zod.pipe';
import type { SessionUser } from '../../shared/schemas/auth';
import type { CreateSupplierInput, Supplier, UpdateSupplierInput } from '../../shared/schemas/master-data';
import type { z } from 'zod';
import type { supplierListQuerySchema } from '../../shared/schemas/master-data';

type Row = typeof supplier.$inferSelect;
const NO_SUPPLIER = '00000000-0000-0000-0000-000000000000';

export function toSupplier(r: Row): Supplier {
  return {
    id: r.id,
    code: r.code,
    name: r.name,
    contactEmails: r.contactEmails,
    approvalStatus: r.approvalStatus,
    approvalReason: r.approvalReason,
    notes: r.notes,
    version: r.version,
    updatedAt: r.updatedAt.toISOString(),
  };
}

/** A supplier user sees its own supplier only; everyone else sees all. */
export function supplierScope(user: SessionUser): SQL | undefined {
  return user.role === 'supplier' ? eq(supplier.id, user.supplierId ?? NO_SUPPLIER) : undefined;
}

@Injectable()
export class SuppliersService {
  constructor(
    @Inject(DB) private readonly db: Db,
    private readonly audit: AuditRepository,
  ) {}

  async list(user: SessionUser, q: z.infer<typeof supplierListQuerySchema>): Promise<{ items: Supplier[]; total: number }> {
    const where = and(
      supplierScope(user),
      q.q ? or(ilike(supplier.code, likeEscape(q.q)), ilike(supplier.name, likeEscape(q.q))) : undefined,
      q.approvalStatus ? eq(supplier.approvalStatus, q.approvalStatus) : undefined,
    );
    const rows = await this.db
      .select()
      .from(supplier)
      .where(where)
      .orderBy(...orderFrom(q.sort, { code: supplier.code, name: supplier.name, approvalStatus: supplier.approvalStatus }, supplier.code))
      .limit(q.pageSize)
      .offset(offsetOf(q.page, q.pageSize));
    const [{ n }] = await this.db.select({ n: count() }).from(supplier).where(where);
    return { items: rows.map(toSupplier), total: n };
  }

  async get(user: SessionUser, id: string): Promise<Supplier> {
    const [row] = await this.db.select().from(supplier).where(and(eq(supplier.id, id), supplierScope(user)));
    if (!row) throw notFound('supplier');
    return toSupplier(row);
  }

  async create(actor: SessionUser, input: CreateSupplierInput): Promise<Supplier> {
    if (input.approvalStatus && input.approvalStatus !== 'approved' && !input.approvalReason) {
      throw new ValidationFailed({ approvalReason: 'Give the reason for a conditional or disapproved status' });
    }
    try {
      return await this.db.transaction(async (tx) => {
        const [row] = await tx
          .insert(supplier)
          .values({
            code: input.code,
            name: input.name,
            contactEmails: [...new Set(input.contactEmails)],
            approvalStatus: input.approvalStatus ?? 'approved',
            approvalReason: input.approvalReason ?? null,
            notes: input.notes ?? null,
          })
          .returning();
        await this.audit.record(tx, { actorId: actor.id, actorEmail: actor.email, action: 'supplier.created', entity: 'supplier', entityId: row.id, after: toSupplier(row) });
        return toSupplier(row);
      });
    } catch (err) {
      if (isUniqueViolation(err)) throw conflict(`Supplier code ${input.code} is already in use`, { code: 'Already in use' });
      throw err;
    }
  }

  async update(actor: SessionUser, id: string, input: UpdateSupplierInput): Promise<Supplier> {
    return this.db.transaction(async (tx) => {
      const [before] = await tx.select().from(supplier).where(eq(supplier.id, id)).for('update');
      if (!before) throw notFound('supplier');
      if (before.version !== input.version) throw stale('supplier');
      const statusChanged = input.approvalStatus !== undefined && input.approvalStatus !== before.approvalStatus;
      if (statusChanged && !input.approvalReason) {
        throw new ValidationFailed({ approvalReason: 'Say why the approval status changes' });
      }
      const [row] = await tx
        .update(supplier)
        .set({
          name: input.name ?? before.name,
          contactEmails: input.contactEmails ? [...new Set(input.contactEmails)] : before.contactEmails,
          approvalStatus: input.approvalStatus ?? before.approvalStatus,
          approvalReason: input.approvalReason !== undefined ? input.approvalReason : before.approvalReason,
          notes: input.notes !== undefined ? input.notes : before.notes,
          version: before.version + 1,
          updatedAt: clockNow(),
        })
        .where(eq(supplier.id, id))
        .returning();
      await this.audit.record(tx, {
        actorId: actor.id,
        actorEmail: actor.email,
        action: statusChanged ? 'supplier.approval_changed' : 'supplier.updated',
        entity: 'supplier',
        entityId: id,
        before: toSupplier(before),
        after: toSupplier(row),
        reason: statusChanged ? (input.approvalReason ?? null) : null,
      });
      return toSupplier(row);
    });
  }
}
