import { Injectable } from '@nestjs/common';
import { desc, sql } from 'drizzle-orm';
import { auditEvent } from '../db/schema';
import type { DbOrTx } from '../db/client';
import { now } from '../common/clock';
import { chainHash } from './audit-hash';

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

/** One key for the transaction-scoped advisory lock that serialises writes to the chain. */
export const AUDIT_CHAIN_LOCK = 0x59_4b_4c_41; // "YKLA"

/**
 * Writes audit events inside the caller's transaction, so a change never commits without its
 * record. Each row's hash chains to the previous row's; the advisory lock (held to commit) keeps
 * concurrent writers in one line, so the chain never forks.
 */
@Injectable()
export class AuditRepository {
  async record(tx: DbOrTx, entry: AuditEntry): Promise<void> {
    await tx.execute(sql`select pg_advisory_xact_lock(${AUDIT_CHAIN_LOCK})`);
    const [last] = await tx.select({ hash: auditEvent.hash }).from(auditEvent).orderBy(desc(auditEvent.id)).limit(1);
    const content = {
      actorId: entry.actorId,
      actorEmail: entry.actorEmail ?? null,
      at: now(),
      action: entry.action,
      entity: entry.entity,
      entityId: entry.entityId,
      // Stored as jsonb: normalise through JSON so what is hashed is what is stored.
      before: entry.before === undefined ? null : JSON.parse(JSON.stringify(entry.before ?? null)),
      after: entry.after === undefined ? null : JSON.parse(JSON.stringify(entry.after ?? null)),
      reason: entry.reason ?? null,
    };
    const prevHash = last?.hash ?? null;
    await tx.insert(auditEvent).values({ ...content, prevHash, hash: chainHash(prevHash, content) });
  }
}
