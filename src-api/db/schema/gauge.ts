import { date, doublePrecision, integer, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';

/** Measuring equipment. A reading taken with an overdue gauge is refused. */
export const gauge = pgTable('gauge', {
  id: uuid().primaryKey().defaultRandom(),
  assetTag: text().notNull().unique('gauge_asset_tag_uq'),
  kind: text().notNull(),
  description: text().notNull(),
  resolution: doublePrecision().notNull(),
  unit: text().notNull(),
  rangeMin: doublePrecision(),
  rangeMax: doublePrecision(),
  calibrationDueOn: date({ mode: 'string' }).notNull(),
  status: text({ enum: ['in-service', 'out-of-service'] }).notNull().default('in-service'),
  version: integer().notNull().default(1),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});
