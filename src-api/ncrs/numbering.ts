import { and, eq, sql } from 'drizzle-orm';
import type { Tx } from '../db/client';
import { documentCounter } from '../db/schema';

/**
 * The next number of a document kind in a year, gapless: the counter row is created if missing,
 * locked FOR UPDATE and bumped inside the caller's transaction. Concurrent creations queue on the
 * row; a creation that rolls back takes its increment with it, so no number is skipped.
 */
export async function nextDocumentNumber(tx: Tx, kind: 'ncr' | 'scar', year: number): Promise<{ seq: number; number: string }> {
  await tx.insert(documentCounter).values({ kind, year, last: 0 }).onConflictDoNothing();
  const [row] = await tx
    .select({ last: documentCounter.last })
    .from(documentCounter)
    .where(and(eq(documentCounter.kind, kind), eq(documentCounter.year, year)))
    .for('update');
  const seq = row.last + 1;
  await tx.update(documentCounter).set({ last: sql`${documentCounter.last} + 1` }).where(and(eq(documentCounter.kind, kind), eq(documentCounter.year, year)));
  return { seq, number: `${kind.toUpperCase()}-${year}-${String(seq).padStart(4, '0')}` };
}
