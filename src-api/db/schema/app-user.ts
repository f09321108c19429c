import { boolean, integer, pgTable, text, timestamp, uuid, index } from 'drizzle-orm/pg-core';
import { supplier } from './supplier';

/** A person who signs in. Supplier users carry the supplier they belong to. */
export const appUser = pgTable(
  'app_user',
  {
    id: uuid().primaryKey().defaultRandom(),
    email: text().notNull().unique('app_user_email_uq'),
    name: text().notNull(),
    role: text({ enum: ['inspector', 'engineer', 'supplier', 'auditor', 'admin'] }).notNull(),
    supplierId: uuid().references(() => supplier.id, { onDelete: 'restrict' }),
    passwordHash: text().notNull(),
    active: boolean().notNull().default(true),
    failedLoginCount: integer().notNull().default(0),
    failedLoginWindowStart: timestamp({ withTimezone: true }),
    lockedUntil: timestamp({ withTimezone: true }),
    passwordChangedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('app_user_supplier_id_idx').on(t.supplierId)],
);
