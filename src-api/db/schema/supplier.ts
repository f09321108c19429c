import { integer, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';

/** A stamping supplier. A disapproved supplier cannot have new lots received. */
export const supplier = pgTable('supplier', {
  id: uuid().primaryKey().defaultRandom(),
  code: text().notNull().unique('supplier_code_uq'),
  name: text().notNull(),
  contactEmails: text().array().notNull().default([]),
  approvalStatus: text({ enum: ['approved', 'conditional', 'disapproved'] }).notNull().default('approved'),
  approvalReason: text(),
  notes: text(),
  version: integer().notNull().default(1),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});
