import { Inject, Injectable } from '@nestjs/common';
import { and, count, desc, eq } from 'drizzle-orm';
import { randomUUID } from 'node:crypto';
import { DB, type Db, type DbOrTx } from '../db/client';
import { outboxMessage, type OutboxRow } from '../db/schema';
import { offsetOf } from '../common/paging';
import type { OutboxMessage } from '../../shared/schemas/corrective-action';

export interface MailDraft {
  kind: 'scar-issued' | 'step-returned' | 'due-reminder' | 'overdue' | 'die-service-due';
  to: string[];
  subject: string;
  text: string;
  html?: string | null;
  entity?: string | null;
  entityId?: string | null;
  /** The same key twice is queued once (reminders must not repeat). */
  dedupeKey?: string | null;
}

export function toOutboxMessage(r: OutboxRow): OutboxMessage {
  return {
    id: r.id,
    kind: r.kind,
    to: r.to,
    subject: r.subject,
    status: r.status,
    attempts: r.attempts,
    nextAttemptAt: r.status === 'pending' ? r.nextAttemptAt.toISOString() : null,
    lastError: r.lastError,
    sentAt: r.sentAt?.toISOString() ?? null,
    createdAt: r.createdAt.toISOString(),
  };
}

/**
 * Writes mails to the transactional outbox. Call it with the transaction of the change that
 * causes the mail: if that change rolls back, so does the mail; if it commits, the mail is
 * certain to be delivered by the worker, however long SMTP is away.
 */
@Injectable()
export class OutboxService {
  constructor(@Inject(DB) private readonly db: Db) {}

  /** Queues a mail; returns its id, or null when its dedupe key was already queued. */
  async enqueue(tx: DbOrTx, m: MailDraft): Promise<string | null> {
    const to = [...new Set(m.to.map((a) => a.trim().toLowerCase()).filter(Boolean))];
    if (!to.length) return null;
    const id = randomUUID();
    const rows = await tx
      .insert(outboxMessage)
      .values({ id, kind: m.kind, to, subject: m.subject, text: m.text, html: m.html ?? null, entity: m.entity ?? null, entityId: m.entityId ?? null, dedupeKey: m.dedupeKey ?? null, messageId: `<${id}@outbox.yokeline>` })
      .onConflictDoNothing({ target: outboxMessage.dedupeKey })
      .returning({ id: outboxMessage.id });
    return rows[0]?.id ?? null;
  }

  async forEntity(entityId: string): Promise<OutboxMessage[]> {
    const rows = await this.db.select().from(outboxMessage).where(eq(outboxMessage.entityId, entityId)).orderBy(desc(outboxMessage.createdAt));
    return rows.map(toOutboxMessage);
  }

  async list(q: { page: number; pageSize: number; status?: OutboxRow['status']; entityId?: string }): Promise<{ items: OutboxMessage[]; total: number }> {
    const where = and(q.status ? eq(outboxMessage.status, q.status) : undefined, q.entityId ? eq(outboxMessage.entityId, q.entityId) : undefined);
    const rows = await this.db.select().from(outboxMessage).where(where).orderBy(desc(outboxMessage.createdAt)).limit(q.pageSize).offset(offsetOf(q.page, q.pageSize));
    const [{ n }] = await this.db.select({ n: count() }).from(outboxMessage).where(where);
    return { items: rows.map(toOutboxMessage), total: n };
  }
}
