import { Inject, Injectable } from '@nestjs/common';
import { asc, eq, inArray } from 'drizzle-orm';
import { DB, type Db, type DbOrTx } from '../db/client';
import { defectCode, type DefectCodeRow } from '../db/schema';
import { AuditRepository } from '../audit/audit.repository';
import { conflict, isUniqueViolation, notFound, stale } from '../common/errors';
import { ValidationFailed } from '../common/zod.pipe';
import { now } from '../common/clock';
import type { SessionUser } from '../../shared/schemas/auth';
import type { CreateDefectCodeInput, DefectCode, UpdateDefectCodeInput } from '../../shared/schemas/ncr';

export function toDefectCode(r: DefectCodeRow): DefectCode {
  return { id: r.id, code: r.code, name: r.name, description: r.description, active: r.active, version: r.version, updatedAt: r.updatedAt.toISOString() };
}

/** The plant's own list of defect codes. Codes are retired (inactive), never deleted: NCRs cite them. */
@Injectable()
export class DefectCodesService {
  constructor(
    @Inject(DB) private readonly db: Db,
    private readonly audit: AuditRepository,
  ) {}

  async list(includeInactive: boolean): Promise<DefectCode[]> {
    const rows = await this.db.select().from(defectCode).where(includeInactive ? undefined : eq(defectCode.active, true)).orderBy(asc(defectCode.code));
    return rows.map(toDefectCode);
  }

  /** Refuses codes that are unknown or retired, naming them (400 on `field`). */
  async assertUsable(tx: DbOrTx, codes: string[], field = 'defectCodes'): Promise<void> {
    const unique = [...new Set(codes)];
    const rows = await tx.select().from(defectCode).where(inArray(defectCode.code, unique));
    const by = new Map(rows.map((r) => [r.code, r]));
    const unknown = unique.filter((c) => !by.has(c));
    const retired = unique.filter((c) => by.get(c) && !by.get(c)!.active);
    if (unknown.length) throw new ValidationFailed({ [field]: `Unknown defect code${unknown.length > 1 ? 's' : ''}: ${unknown.join(', ')}` });
    if (retired.length) throw new ValidationFailed({ [field]: `Retired defect code${retired.length > 1 ? 's' : ''}: ${retired.join(', ')}` });
  }

  async create(actor: SessionUser, input: CreateDefectCodeInput): Promise<DefectCode> {
    try {
      return await this.db.transaction(async (tx) => {
        const [row] = await tx.insert(defectCode).values({ code: String(input.code), name: input.name, description: input.description ?? null }).returning();
        await this.audit.record(tx, { actorId: actor.id, actorEmail: actor.email, action: 'defect_code.created', entity: 'defect_code', entityId: row.id, after: { code: row.code, name: row.name } });
        return toDefectCode(row);
      });
    } catch (err) {
      if (isUniqueViolation(err, 'defect_code_code_uq')) throw conflict(`The defect code ${input.code} already exists`, { code: 'This code is already in the list' });
      throw err;
    }
  }

  async update(actor: SessionUser, id: string, input: UpdateDefectCodeInput): Promise<DefectCode> {
    return this.db.transaction(async (tx) => {
      const [row] = await tx.select().from(defectCode).where(eq(defectCode.id, id)).for('update');
      if (!row) throw notFound('defect code');
      if (row.version !== input.version) throw stale('defect code');
      const patch = {
        ...(input.name !== undefined ? { name: input.name } : {}),
        ...(input.description !== undefined ? { description: input.description } : {}),
        ...(input.active !== undefined ? { active: input.active } : {}),
      };
      const [saved] = await tx.update(defectCode).set({ ...patch, version: row.version + 1, updatedAt: now() }).where(eq(defectCode.id, id)).returning();
      await this.audit.record(tx, {
        actorId: actor.id,
        actorEmail: actor.email,
        action: input.active === false && row.active ? 'defect_code.retired' : 'defect_code.updated',
        entity: 'defect_code',
        entityId: id,
        before: { name: row.name, description: row.description, active: row.active },
        after: patch,
      });
      return toDefectCode(saved);
    });
  }
}
