import { index, json, pgTable, timestamp, varchar } from 'drizzle-orm/pg-core';

/** The table connect-pg-simple expects (its table.sql), created by a migration, never at run time. */
export const session = pgTable(
  'session',
  {
    sid: varchar().primaryKey(),
    sess: json().notNull(),
    expire: timestamp({ precision: 6, withTimezone: false }).notNull(),
  },
  (t) => [index('IDX_session_expire').on(t.expire)],
);
