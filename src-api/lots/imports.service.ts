import { Inject, Injectable, PayloadTooLargeException, UnsupportedMediaTypeException } from '@nestjs/common';
import { createHash } from 'node:crypto';
import { parse } from 'csv-parse/sync';
import { and, eq } from 'drizzle-orm';
import { DB, type Db } from '../db/client';
import { readingImport } from '../db/schema';
import { conflict, isUniqueViolation } from '../common/errors';
import { ValidationFailed, fieldsFromZod } from '../common/zod.pipe';
import { LotsService, evalChar } from './lots.service';
import { expectedReadings } from '../../shared/compute/evaluate';
import { importMappingSchema, type ReadingInput } from '../../shared/schemas/receiving';
import type { SessionUser } from '../../shared/schemas/auth';

export const MAX_CSV_BYTES = 50 * 1024 * 1024;
const MAX_REPORTED_ERRORS = 50;

const PASS = new Set(['pass', 'ok', 'p', 'yes', 'y', '1', 'true', 'go']);
const FAIL = new Set(['fail', 'nok', 'f', 'no', 'n', '0', 'false', 'no-go', 'nogo']);

/** Parses a number as gauges write it: a dot or a comma as the decimal mark, no thousands separators. */
export function parseGaugeNumber(s: string): number | null {
  const t = s.trim().replace(/^\+/, '');
  if (!/^-?(\d+([.,]\d*)?|[.,]\d+)([eE][-+]?\d+)?$/.test(t)) return null;
  const v = Number(t.replace(',', '.'));
  return Number.isFinite(v) ? v : null;
}

@Injectable()
export class ImportsService {
  constructor(
    @Inject(DB) private readonly db: Db,
    private readonly lots: LotsService,
  ) {}

  async import(actor: SessionUser, lotId: string, file: { buffer: Buffer; originalname: string; size: number } | undefined, mappingText: string | undefined) {
    if (!file) throw new ValidationFailed({ file: 'Attach the CSV file (multipart field "file")' });
    if (file.size > MAX_CSV_BYTES) throw new PayloadTooLargeException({ error: 'too_large', message: 'A CSV may be at most 50 MB' });
    if (file.buffer.includes(0)) throw new UnsupportedMediaTypeException({ error: 'unsupported_media_type', message: 'This is not a text CSV file' });
    let mappingJson: unknown;
    try {
      mappingJson = JSON.parse(mappingText ?? '');
    } catch {
      throw new ValidationFailed({ mapping: 'Send the column mapping as JSON in the field "mapping"' });
    }
    const mapped = importMappingSchema.safeParse(mappingJson);
    if (!mapped.success) throw new ValidationFailed(Object.fromEntries(Object.entries(fieldsFromZod(mapped.error)).map(([k, v]) => [`mapping.${k}`, v])));
    const mapping = mapped.data;
    const sha256 = createHash('sha256').update(file.buffer).digest('hex');
    const [dup] = await this.db.select().from(readingImport).where(and(eq(readingImport.lotId, lotId), eq(readingImport.sha256, sha256)));
    if (dup) throw conflict(`This file was already imported into this lot on ${dup.createdAt.toISOString().slice(0, 16).replace('T', ' ')} (${dup.readingCount} readings); it was not imported again.`);

    let records: string[][];
    try {
      const text = file.buffer.toString('utf8').replace(/^\uFEFF/, '');
      const firstLine = text.slice(0, text.indexOf('\n') >>> 0);
      const delimiter = (firstLine.match(/;/g)?.length ?? 0) > (firstLine.match(/,/g)?.length ?? 0) ? ';' : ',';
      records = parse(text, { delimiter, relax_column_count: true, skip_empty_lines: true, trim: true }) as string[][];
    } catch (err) {
      throw new ValidationFailed({ file: `The CSV cannot be read: ${(err as Error).message}` });
    }
    if (records.length < 2) throw new ValidationFailed({ file: 'The CSV needs a header row and at least one data row' });
    const header = records[0];
    const col = (name: string) => header.indexOf(name);
    const headerErrors: Record<string, string> = {};
    if (col(mapping.serialColumn) < 0) headerErrors['mapping.serialColumn'] = `No column “${mapping.serialColumn}” in the file`;
    for (const [code, cols] of Object.entries(mapping.columns)) for (const c of cols) if (col(c) < 0) headerErrors[`mapping.columns.${code}`] = `No column “${c}” in the file`;
    if (Object.keys(headerErrors).length) throw new ValidationFailed(headerErrors);

    const ctx = await this.lots.context(this.db, lotId);
    const bySerial = new Map(ctx.samples.map((s) => [s.serial, s.id]));
    const charByCode = new Map(ctx.chars.map((c) => [c.code, c]));
    const errors: string[] = [];
    const readings: ReadingInput[] = [];
    for (const [code, cols] of Object.entries(mapping.columns)) {
      const c = charByCode.get(code);
      if (!c) errors.push(`mapping: ${code} is not a characteristic of this lot's plan`);
      else if (c.kind === 'derived') errors.push(`mapping: ${code} is computed, not imported`);
      else if (c.kind !== 'attribute' && cols.length !== expectedReadings(evalChar(c))) errors.push(`mapping: ${code} takes ${expectedReadings(evalChar(c))} readings per core; ${cols.length} columns are mapped`);
      else if (c.kind === 'attribute' && cols.length !== 1) errors.push(`mapping: ${code} is pass/fail and takes one column`);
    }
    if (errors.length) throw new ValidationFailed({ mapping: errors.join('; ') }, 'The column mapping does not fit this lot');
    const seen = new Map<number, number>();
    for (let i = 1; i < records.length && errors.length < MAX_REPORTED_ERRORS; i++) {
      const line = i + 1;
      const row = records[i];
      const serialText = row[col(mapping.serialColumn)] ?? '';
      const serial = Number(serialText);
      const sampleId = Number.isInteger(serial) ? bySerial.get(serial) : undefined;
      if (!sampleId) {
        errors.push(`line ${line}: core “${serialText}” is not a sampled core of this lot (1–${ctx.samples.length})`);
        continue;
      }
      if (seen.has(serial)) {
        errors.push(`line ${line}: core ${serial} already appears on line ${seen.get(serial)}`);
        continue;
      }
      seen.set(serial, line);
      for (const [code, cols] of Object.entries(mapping.columns)) {
        const c = charByCode.get(code)!;
        if (c.kind === 'attribute') {
          const v = (row[col(cols[0])] ?? '').toLowerCase();
          if (!PASS.has(v) && !FAIL.has(v)) {
            errors.push(`line ${line}: ${code} “${v}” is not pass or fail`);
            continue;
          }
          readings.push({ sampleId, characteristicCode: code, values: [], pass: PASS.has(v), note: FAIL.has(v) ? `Failed (imported from ${file.originalname}, line ${line})` : null, gaugeId: mapping.gaugeIds?.[code] ?? null });
          continue;
        }
        const values: number[] = [];
        for (const name of cols) {
          const raw = row[col(name)] ?? '';
          const v = parseGaugeNumber(raw);
          if (v === null) errors.push(`line ${line}: ${code} column “${name}” has “${raw.slice(0, 20)}”, not a number`);
          else values.push(v);
        }
        if (values.length === cols.length) readings.push({ sampleId, characteristicCode: code, values, gaugeId: mapping.gaugeIds?.[code] ?? null });
      }
    }
    if (errors.length) {
      const more = errors.length >= MAX_REPORTED_ERRORS ? ' (first 50 shown)' : '';
      throw new ValidationFailed({ rows: errors.join('\n') }, `${errors.length} row problem${errors.length === 1 ? '' : 's'}${more}; nothing was imported`);
    }
    try {
      return await this.db.transaction(async (tx) => {
        const [imp] = await tx.insert(readingImport).values({ lotId, sha256, fileName: file.originalname.slice(0, 200), rowCount: records.length - 1, readingCount: readings.length, importedBy: actor.id }).returning();
        await this.lots.putReadings(actor, lotId, readings, 'import', tx);
        return { importId: imp.id, rows: records.length - 1, readings: readings.length };
      });
    } catch (err) {
      if (isUniqueViolation(err)) throw conflict('This file was already imported into this lot; it was not imported again.');
      if (err instanceof ValidationFailed) {
        // Readings refused by the lot's rules (e.g. an overdue gauge): report by line where we can.
        throw err;
      }
      throw err;
    }
  }
}
