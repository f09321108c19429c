import { randomBytes } from 'node:crypto';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type { Response } from 'express';
import { sql, type SQL } from 'drizzle-orm';
import { stringify } from 'csv-stringify';
import type { Tx } from '../db/client';
import { csvText } from './csv-cell';

export interface CsvColumn<R> {
  header: string;
  value: (row: R) => unknown;
}

/** Rows per FETCH: big enough to keep round trips few, small enough to keep memory flat. */
export const CURSOR_BATCH = 1000;

const rowsOf = <T>(r: unknown): T[] => ((r as { rows?: T[] }).rows ?? (r as T[])) as T[];

/**
 * Reads a query through a server-side cursor, one batch at a time: the database sorts once and
 * the process never holds more than one batch, whatever the size of the result. Needs a transaction.
 */
export async function* cursorRows<T>(tx: Tx, query: SQL, batch = CURSOR_BATCH): AsyncGenerator<T[]> {
  const name = sql.raw(`export_${randomBytes(6).toString('hex')}`);
  await tx.execute(sql`declare ${name} no scroll cursor for ${query}`);
  try {
    for (;;) {
      const rows = rowsOf<T>(await tx.execute(sql`fetch forward ${sql.raw(String(batch))} from ${name}`));
      if (rows.length) yield rows;
      if (rows.length < batch) return;
    }
  } finally {
    // The transaction may already be failing (client gone); closing then is moot.
    await tx.execute(sql`close ${name}`).catch(() => undefined);
  }
}

/**
 * Streams rows as CSV with csv-stringify: a BOM so spreadsheets read UTF-8 (µm), CRLF records
 * (RFC 4180), every text cell neutralised against formula injection. X-Total-Rows lets the web
 * show progress. A client that goes away stops the query at the next batch.
 */
export async function sendCsv<R>(res: Response, fileName: string, total: number, columns: CsvColumn<R>[], batches: AsyncIterable<R[]>): Promise<void> {
  res.status(200);
  res.setHeader('Content-Type', 'text/csv; charset=utf-8');
  res.setHeader('Content-Disposition', `attachment; filename="${fileName}"`);
  res.setHeader('X-Total-Rows', String(total));
  res.setHeader('Cache-Control', 'no-store');
  res.setHeader('X-Content-Type-Options', 'nosniff');
  async function* records() {
    for await (const batch of batches) for (const r of batch) yield columns.map((c) => csvText(c.value(r)));
  }
  const out = stringify({ bom: true, header: true, columns: columns.map((c) => c.header), record_delimiter: 'windows' });
  try {
    await pipeline(Readable.from(records()), out, res);
  } catch (err) {
    // A closed connection is the client's choice (cancel, navigate away); anything else is ours.
    if (res.destroyed || (err as { code?: string }).code === 'ERR_STREAM_PREMATURE_CLOSE') return;
    res.destroy(err as Error);
    throw err;
  }
}

/** `yokeline-lots-20260314-0912.csv` */
export function exportFileName(what: string, ext: string, at = new Date()): string {
  const stamp = at.toISOString().slice(0, 16).replace(/[-:]/g, '').replace('T', '-');
  return `yokeline-${what}-${stamp}.${ext}`;
}
