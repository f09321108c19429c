import { bigserial, index, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { appUser } from './app-user';

/**
 * One row per change, written in the same transaction as the change. Append-only: a trigger
 * refuses UPDATE, DELETE and TRUNCATE, and each row carries a hash chained to the previous row's,
 * so a change made behind the trigger's back is found by verification.
 */
export const auditEvent = pgTable(
  'audit_event',
  {
    id: bigserial({ mode: 'number' }).primaryKey(),
    actorId: uuid().references(() => appUser.id, { onDelete: 'restrict' }),
    actorEmail: text(),
    at: timestamp({ withTimezone: true }).notNull().defaultNow(),
    action: text().notNull(),
    entity: text().notNull(),
    entityId: text().notNull(),
    before: jsonb(),
    after: jsonb(),
    reason: text(),
    /** SHA-256 (hex) of the previous row's hash and this row's canonical content. */
    prevHash: text(),
    hash: text().notNull(),
  },
  (t) => [index('audit_event_entity_idx').on(t.entity, t.entityId), index('audit_event_at_idx').on(t.at)],
);
