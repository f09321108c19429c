import { Inject, Injectable } from '@nestjs/common';
import { sql, type SQL } from 'drizzle-orm';
import type { Response } from 'express';
import { DB, type Db, type Tx } from '../db/client';
import { likeEscape } from '../common/paging';
import { rangeInstant, type ExportAuditQuery, type ExportLotsQuery, type ExportReadingsQuery } from '../../shared/schemas/ledger';
import { cursorRows, exportFileName, sendCsv, type CsvColumn } from './csv-stream';

/** A timestamp as ISO 8601 UTC text, the same in every export whatever the server's zone. */
const ts = (col: string) => sql.raw(`to_char(${col} at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"')`);
const and = (parts: (SQL | undefined)[]): SQL => {
  const p = parts.filter((x): x is SQL => !!x);
  return p.length ? sql.join(p, sql` and `) : sql`true`;
};
const rowsOf = <T>(r: unknown): T[] => ((r as { rows?: T[] }).rows ?? (r as T[])) as T[];

type Row = Record<string, unknown>;
/** Columns named as in the query, in order: the CSV header is the query's own vocabulary. */
const cols = (names: string[]): CsvColumn<Row>[] => names.map((n) => ({ header: n, value: (r) => r[n] }));

const LOT_COLUMNS = cols([
  'lot_ref', 'supplier_lot_number', 'po_number', 'supplier_code', 'supplier_name', 'part_number', 'part_revision', 'plan_revision',
  'quantity', 'received_at', 'received_by', 'heat_numbers', 'packaging', 'status', 'sampling_kind', 'inspection_level', 'aql',
  'severity', 'code_letter', 'sample_size', 'accept', 'reject', 'decision', 'nonconforming_cores', 'decided_by', 'decided_at', 'decision_comment',
]);
const READING_COLUMNS = cols([
  'lot_ref', 'supplier_lot_number', 'supplier_code', 'part_number', 'part_revision', 'core_serial', 'characteristic', 'characteristic_name',
  'kind', 'value', 'unit', 'lsl', 'usl', 'raw_readings', 'pass', 'conforming', 'gauge_asset_tag', 'gauge_due_on_at_time', 'entered_by',
  'entered_at', 'source', 'note',
]);
const AUDIT_COLUMNS = cols(['id', 'at', 'actor_email', 'action', 'entity', 'entity_id', 'reason', 'before', 'after', 'prev_hash', 'hash']);

/**
 * CSV exports, streamed from a cursor inside one read-only REPEATABLE READ transaction: the row
 * count and every row come from the same snapshot, so the file is one consistent picture.
 */
@Injectable()
export class CsvExportsService {
  constructor(@Inject(DB) private readonly db: Db) {}

  private async stream(res: Response, what: string, from: SQL, select: SQL, order: SQL, columns: CsvColumn<Row>[]): Promise<void> {
    await this.db.transaction(
      async (tx: Tx) => {
        const [{ n }] = rowsOf<{ n: string }>(await tx.execute(sql`select count(*)::text as n ${from}`));
        await sendCsv(res, exportFileName(what, 'csv'), Number(n), columns, cursorRows<Row>(tx, sql`select ${select} ${from} ${order}`));
      },
      { isolationLevel: 'repeatable read', accessMode: 'read only' },
    );
  }

  lots(res: Response, q: ExportLotsQuery): Promise<void> {
    const where = and([
      q.status ? sql`l.status = ${q.status}` : undefined,
      q.supplierId ? sql`l.supplier_id = ${q.supplierId}` : undefined,
      q.partId ? sql`l.part_id = ${q.partId}` : undefined,
      q.q
        ? sql`(l.supplier_lot_number ilike ${likeEscape(q.q)} or l.po_number ilike ${likeEscape(q.q)} or l.heat_numbers::text ilike ${likeEscape(q.q)} or l.ref::text = ${q.q.replace(/\D/g, '') || '-1'})`
        : undefined,
      q.receivedFrom ? sql`l.received_at >= ${rangeInstant(q.receivedFrom, false).toISOString()}` : undefined,
      q.receivedTo ? sql`l.received_at <= ${rangeInstant(q.receivedTo, true).toISOString()}` : undefined,
    ]);
    const from = sql`from lot l
      join supplier s on s.id = l.supplier_id
      join part p on p.id = l.part_id
      join inspection_plan ip on ip.id = l.plan_id
      left join app_user ru on ru.id = l.received_by
      left join app_user du on du.id = l.decided_by
      where ${where}`;
    const select = sql`l.ref as lot_ref, l.supplier_lot_number, l.po_number, s.code as supplier_code, s.name as supplier_name,
      p.part_number, p.revision as part_revision, ip.revision as plan_revision, l.quantity, ${ts('l.received_at')} as received_at,
      ru.email as received_by, l.heat_numbers, l.packaging_condition as packaging, l.status, l.sampling->>'kind' as sampling_kind,
      l.sampling->>'level' as inspection_level, (l.sampling->>'aql')::float8 as aql, l.sampling->>'severity' as severity,
      l.sampling->>'codeLetter' as code_letter, (l.sampling->>'sampleSize')::int as sample_size, (l.sampling->>'accept')::int as accept,
      (l.sampling->>'reject')::int as reject, l.decision, l.nonconforming_count as nonconforming_cores, du.email as decided_by,
      ${ts('l.decided_at')} as decided_at, l.decision_comment`;
    return this.stream(res, 'lots', from, select, sql`order by l.ref`, LOT_COLUMNS);
  }

  readings(res: Response, q: ExportReadingsQuery): Promise<void> {
    const where = and([
      q.lotId ? sql`r.lot_id = ${q.lotId}` : undefined,
      q.from ? sql`r.entered_at >= ${rangeInstant(q.from, false).toISOString()}` : undefined,
      q.to ? sql`r.entered_at <= ${rangeInstant(q.to, true).toISOString()}` : undefined,
    ]);
    const from = sql`from reading r
      join lot l on l.id = r.lot_id
      join lot_sample ls on ls.id = r.sample_id
      join supplier s on s.id = l.supplier_id
      join part p on p.id = l.part_id
      left join plan_characteristic pc on pc.plan_id = l.plan_id and pc.code = r.characteristic_code
      left join gauge g on g.id = r.gauge_id
      left join app_user u on u.id = r.entered_by
      where ${where}`;
    const select = sql`l.ref as lot_ref, l.supplier_lot_number, s.code as supplier_code, p.part_number, p.revision as part_revision,
      ls.serial as core_serial, r.characteristic_code as characteristic, pc.name as characteristic_name, pc.kind, r.value, pc.unit,
      pc.lsl, pc.usl, r.values as raw_readings, r.pass, r.conforming, g.asset_tag as gauge_asset_tag,
      r.gauge_due_on::text as gauge_due_on_at_time, u.email as entered_by, ${ts('r.entered_at')} as entered_at, r.source, r.note`;
    return this.stream(res, q.lotId ? 'readings-lot' : 'readings', from, select, sql`order by l.ref, ls.serial, pc.seq nulls last, r.characteristic_code`, READING_COLUMNS);
  }

  auditEvents(res: Response, q: ExportAuditQuery): Promise<void> {
    const where = and([
      q.entity ? sql`entity = ${q.entity}` : undefined,
      q.entityId ? sql`entity_id = ${q.entityId}` : undefined,
      q.actor ? sql`actor_email ilike ${likeEscape(q.actor)}` : undefined,
      q.action ? sql`action = ${q.action}` : undefined,
      q.from ? sql`at >= ${new Date(q.from).toISOString()}` : undefined,
      q.to ? sql`at <= ${new Date(q.to).toISOString()}` : undefined,
    ]);
    const select = sql`id::text as id, ${ts('at')} as at, actor_email, action, entity, entity_id, reason, before, after, prev_hash, hash`;
    // Same order as the list: newest first unless sort=at.
    return this.stream(res, 'audit-events', sql`from audit_event where ${where}`, select, q.sort === 'at' ? sql`order by audit_event.id asc` : sql`order by audit_event.id desc`, AUDIT_COLUMNS);
  }
}
