import { pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';

/** A stamping supplier. Extended by the master-data work (contacts, approval status). */
export const supplier = pgTable('supplier', {
  id: uuid().primaryKey().defaultRandom(),
  code: text().notNull().unique('supplier_code_uq'),
  name: text().notNull(),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});
