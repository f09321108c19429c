import { asc, desc, type SQL } from 'drizzle-orm';
import type { AnyPgColumn } from 'drizzle-orm/pg-core';

/** `sort=name` / `sort=-name` → ORDER BY, from an allow-list of columns (never raw input). */
export function orderFrom(sort: string | undefined, columns: Record<string, AnyPgColumn>, fallback: SQL | AnyPgColumn): SQL[] {
  if (!sort) return [fallback instanceof Object && 'getSQL' in fallback ? (fallback as SQL) : asc(fallback as AnyPgColumn)];
  const descending = sort.startsWith('-');
  const col = columns[descending ? sort.slice(1) : sort];
  if (!col) return [asc(fallback as AnyPgColumn)];
  return [descending ? desc(col) : asc(col)];
}

export const offsetOf = (page: number, pageSize: number) => (page - 1) * pageSize;

/** `%` and `_` in user search text are literal. */
export const likeEscape = (s: string) => `%${s.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
