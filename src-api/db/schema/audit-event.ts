import { bigserial, index, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { appUser } from './app-user';

/**
 * One row per change, written in the same transaction as the change. Append-only: the history
 * ledger work adds the trigger and the hash chain.
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
  },
  (t) => [index('audit_event_entity_idx').on(t.entity, t.entityId), index('audit_event_at_idx').on(t.at)],
);
