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
const NCR_COLUMNS = cols([
  'ncr_number', 'status', 'source', 'title', 'supplier_code', 'supplier_name', 'part_number', 'part_revision', 'lot_ref', 'supplier_lot_number',
  'characteristic', 'requirement', 'found', 'defect_codes', 'suspect_quantity', 'raised_by', 'raised_at', 'dispositioned_at', 'dispositions',
  'disposed_quantity', 'total_cost', 'signatures', 'scar_numbers', 'closed_at',
]);
const SCAR_COLUMNS = cols([
  'scar_number', 'status', 'title', 'supplier_code', 'supplier_name', 'part_number', 'part_revision', 'ncr_number', 'defect_codes', 'recipients',
  'issued_by', 'issued_at', 'acknowledged_at', 'accepted_at', 'closed_at', 'steps_accepted', 'steps_waiting_review', 'steps_returned',
  'next_due_step', 'next_due_on', 'verify_lots_passed', 'verify_lots_required',
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
  /** One row per NCR, oldest first; dispositions summarised as "scrap 40; sort 60" with their total cost. */
  ncrs(res: Response): Promise<void> {
    const from = sql`from ncr n
      left join supplier s on s.id = n.supplier_id
      left join part p on p.id = n.part_id
      left join lot l on l.id = n.lot_id
      left join app_user u on u.id = n.raised_by`;
    const select = sql`n.number as ncr_number, n.status, n.source, n.title, s.code as supplier_code, s.name as supplier_name,
      p.part_number, p.revision as part_revision, l.ref as lot_ref, l.supplier_lot_number, n.characteristic_code as characteristic,
      n.requirement, n.found, n.defect_codes, n.suspect_quantity, u.email as raised_by, ${ts('n.raised_at')} as raised_at,
      ${ts('n.dispositioned_at')} as dispositioned_at,
      (select string_agg(d.kind || ' ' || d.quantity, '; ' order by d.seq) from disposition d where d.ncr_id = n.id) as dispositions,
      (select sum(d.quantity)::int from disposition d where d.ncr_id = n.id) as disposed_quantity,
      (select round(sum(d.cost)::numeric, 2)::float8 from disposition d where d.ncr_id = n.id) as total_cost,
      (select string_agg(es.signer_email || ' (' || es.purpose || ')', '; ' order by es.signed_at) from e_signature es where es.entity = 'ncr' and es.entity_id = n.id) as signatures,
      (select string_agg(ca.number, '; ' order by ca.issued_at) from corrective_action ca where ca.ncr_id = n.id) as scar_numbers,
      ${ts('n.closed_at')} as closed_at`;
    return this.stream(res, 'ncrs', from, select, sql`order by n.raised_at, n.number`, NCR_COLUMNS);
  }

  /** One row per corrective action request, oldest first, with where its 8D steps stand. */
  correctiveActions(res: Response): Promise<void> {
    const from = sql`from corrective_action ca
      join supplier s on s.id = ca.supplier_id
      join ncr n on n.id = ca.ncr_id
      left join part p on p.id = ca.part_id
      left join app_user u on u.id = ca.issued_by`;
    const steps = (status: string) => sql.raw(`(select count(*)::int from corrective_action_step st where st.corrective_action_id = ca.id and st.status = '${status}')`);
    const select = sql`ca.number as scar_number, ca.status, ca.title, s.code as supplier_code, s.name as supplier_name, p.part_number,
      p.revision as part_revision, n.number as ncr_number, ca.defect_codes, ca.recipients, u.email as issued_by, ${ts('ca.issued_at')} as issued_at,
      ${ts('ca.acknowledged_at')} as acknowledged_at, ${ts('ca.accepted_at')} as accepted_at, ${ts('ca.closed_at')} as closed_at,
      ${steps('accepted')} as steps_accepted, ${steps('submitted')} as steps_waiting_review, ${steps('returned')} as steps_returned,
      nd.step as next_due_step, nd.due_on::text as next_due_on, jsonb_array_length(ca.verify_lots)::int as verify_lots_passed,
      ca.verify_lots_required`;
    // The earliest due date among the steps still with the supplier.
    const withNext = sql`${from}
      left join lateral (select st.step, st.due_on from corrective_action_step st
        where st.corrective_action_id = ca.id and st.status in ('open', 'returned') and st.due_on is not null
        order by st.due_on, st.step limit 1) nd on true`;
    return this.stream(res, 'corrective-actions', withNext, select, sql`order by ca.issued_at, ca.number`, SCAR_COLUMNS);
  }
}
