import { Injectable } from '@nestjs/common';
import { auditEvent } from '../db/schema';
import type { DbOrTx } from '../db/client';
import { now } from '../common/clock';

export interface AuditEntry {
  actorId: string | null;
  actorEmail?: string | null;
  action: string;
  entity: string;
  entityId: string;
  before?: unknown;
  after?: unknown;
  reason?: string | null;
}

/** Writes audit events inside the caller's transaction, so a change never commits without its record. */
@Injectable()
export class AuditRepository {
  async record(tx: DbOrTx, entry: AuditEntry): Promise<void> {
    await tx.insert(auditEvent).values({
      actorId: entry.actorId,
      at: now(),
      actorEmail: entry.actorEmail ?? null,
      action: entry.action,
      entity: entry.entity,
      entityId: entry.entityId,
      before: entry.before ?? null,
      after: entry.after ?? null,
      reason: entry.reason ?? null,
    });
  }
}
