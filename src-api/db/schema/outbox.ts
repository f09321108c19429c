import { index, integer, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';

/**
 * Transactional outbox: a mail is written here in the same transaction as the change that
 * causes it, and a worker delivers it (SELECT … FOR UPDATE SKIP LOCKED, retries with backoff).
 */
export const outboxMessage = pgTable(
  'outbox_message',
  {
    id: uuid().primaryKey().defaultRandom(),
    kind: text().notNull(),
    to: text().array().notNull(),
    subject: text().notNull(),
    text: text().notNull(),
    html: text(),
    entity: text(),
    entityId: uuid(),
    /** Stops the same notice being queued twice (reminders, overdue notices). */
    dedupeKey: text().unique('outbox_message_dedupe_uq'),
    /** Sent as the Message-ID header: the idempotency key receivers can de-duplicate by. */
    messageId: text().notNull(),
    status: text({ enum: ['pending', 'sent', 'failed'] }).notNull().default('pending'),
    attempts: integer().notNull().default(0),
    nextAttemptAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    lastError: text(),
    sentAt: timestamp({ withTimezone: true }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('outbox_message_due_idx').on(t.status, t.nextAttemptAt), index('outbox_message_entity_idx').on(t.entityId)],
);

export type OutboxRow = typeof outboxMessage.$inferSelect;
