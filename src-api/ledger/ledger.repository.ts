import { Inject, Injectable, Logger } from '@nestjs/common';
import { and, asc, eq, inArray, or, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { DB, type Db, type DbOrTx } from '../db/client';
import { appUser, auditEvent, gauge, inspectionPlan, lot, lotSample, part, photo, planCharacteristic, reading, supplier, switchingEvent } from '../db/schema';
import { notFound } from '../common/errors';

const receiver = alias(appUser, 'receiver');
const decider = alias(appUser, 'decider');

/** "Ines Varga <inspector@harrowgate.test>" — the name people know, the address that identifies. */
export const person = (u: { name: string | null; email: string | null } | null | undefined): string | null =>
  u && u.email ? (u.name ? `${u.name} <${u.email}>` : u.email) : null;

export type LotHeader = Awaited<ReturnType<LedgerRepository['lotHeader']>>;
export type LotReadingRow = Awaited<ReturnType<LedgerRepository['readings']>>[number];

/** Rows of the nonconformance and corrective-action tables, read only where those tables exist. */
export interface LinkedRecords {
  ncrs: { id: string; number: string; status: string; title: string; raised_at: string; raised_by: string | null; review_started_at: string | null; dispositioned_at: string | null; closed_at: string | null; closed_by: string | null; suspect_quantity: number; defect_codes: string[] }[];
  dispositions: { id: string; ncr_id: string; seq: number; kind: string; quantity: number; rationale: string; concession_ref: string | null; cost: number; created_at: string }[];
  signatures: { id: string; entity: string; entity_id: string; purpose: string; signer_name: string; signer_email: string; signer_role: string; meaning: string; signed_at: string; content_hash: string }[];
  scars: { id: string; number: string; ncr_id: string; status: string; title: string; issued_at: string; issued_by: string | null; acknowledged_at: string | null; accepted_at: string | null; verifying_since: string | null; closed_at: string | null; closed_by: string | null }[];
  steps: { id: string; corrective_action_id: string; step: string; status: string; due_on: string | null; submitted_at: string | null; submitted_by: string | null; reviewed_at: string | null; reviewed_by: string | null; review_decision: string | null; review_comment: string | null }[];
  /** What could not be read, in words for the auditor. */
  notes: string[];
}

/** A timestamp column as ISO 8601 UTC text: raw queries get Postgres' own text format otherwise. */
const ts = (col: string) => sql.raw(`to_char(${col} at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"')`);

const rowsOf = <T>(r: unknown): T[] => ((r as { rows?: T[] }).rows ?? (r as T[])) as T[];

/** Queries behind the History ledger and the lot exports: read-only, one lot at a time. */
@Injectable()
export class LedgerRepository {
  private readonly log = new Logger('LedgerRepository');

  constructor(@Inject(DB) readonly db: Db) {}

  async lotHeader(id: string, tx: DbOrTx = this.db) {
    const [row] = await tx
      .select({
        l: lot,
        s: { code: supplier.code, name: supplier.name },
        p: { partNumber: part.partNumber, revision: part.revision, description: part.description, construction: part.construction, steelGrade: part.steelGrade },
        plan: { revision: inspectionPlan.revision, status: inspectionPlan.status, activatedAt: inspectionPlan.activatedAt, activatedBy: inspectionPlan.activatedBy },
        receivedBy: { name: receiver.name, email: receiver.email },
        decidedBy: { name: decider.name, email: decider.email },
      })
      .from(lot)
      .innerJoin(supplier, eq(supplier.id, lot.supplierId))
      .innerJoin(part, eq(part.id, lot.partId))
      .innerJoin(inspectionPlan, eq(inspectionPlan.id, lot.planId))
      .leftJoin(receiver, eq(receiver.id, lot.receivedBy))
      .leftJoin(decider, eq(decider.id, lot.decidedBy))
      .where(eq(lot.id, id));
    if (!row) throw notFound('lot');
    return row;
  }

  characteristics(planId: string, tx: DbOrTx = this.db) {
    return tx.select().from(planCharacteristic).where(eq(planCharacteristic.planId, planId)).orderBy(asc(planCharacteristic.seq));
  }

  samples(lotId: string, tx: DbOrTx = this.db) {
    return tx.select({ id: lotSample.id, serial: lotSample.serial }).from(lotSample).where(eq(lotSample.lotId, lotId)).orderBy(asc(lotSample.serial));
  }

  /** Every stored reading of the lot with its core serial, the gauge's tag and who entered it. */
  readings(lotId: string, tx: DbOrTx = this.db) {
    return tx
      .select({
        r: reading,
        serial: lotSample.serial,
        gaugeAssetTag: gauge.assetTag,
        enteredBy: { name: appUser.name, email: appUser.email },
      })
      .from(reading)
      .innerJoin(lotSample, eq(lotSample.id, reading.sampleId))
      .leftJoin(gauge, eq(gauge.id, reading.gaugeId))
      .leftJoin(appUser, eq(appUser.id, reading.enteredBy))
      .where(eq(reading.lotId, lotId))
      .orderBy(asc(reading.enteredAt), asc(lotSample.serial), asc(reading.characteristicCode));
  }

  photos(lotId: string, tx: DbOrTx = this.db) {
    return tx
      .select({ p: photo, serial: lotSample.serial, by: { name: appUser.name, email: appUser.email } })
      .from(photo)
      .leftJoin(lotSample, eq(lotSample.id, photo.sampleId))
      .leftJoin(appUser, eq(appUser.id, photo.uploadedBy))
      .where(eq(photo.lotId, lotId))
      .orderBy(asc(photo.createdAt));
  }

  switchingEvents(supplierId: string, partId: string, tx: DbOrTx = this.db) {
    return tx
      .select({ e: switchingEvent, by: { name: appUser.name, email: appUser.email } })
      .from(switchingEvent)
      .leftJoin(appUser, eq(appUser.id, switchingEvent.actorId))
      .where(and(eq(switchingEvent.supplierId, supplierId), eq(switchingEvent.partId, partId)))
      .orderBy(asc(switchingEvent.at));
  }

  /** Audit rows about any of the given entities, in chain order. */
  audit(targets: { entity: string; ids: string[] }[], tx: DbOrTx = this.db) {
    const conds = targets.filter((t) => t.ids.length).map((t) => and(eq(auditEvent.entity, t.entity), inArray(auditEvent.entityId, t.ids)));
    if (!conds.length) return Promise.resolve([]);
    return tx.select().from(auditEvent).where(or(...conds)).orderBy(asc(auditEvent.id));
  }

  plansOfPart(partId: string, tx: DbOrTx = this.db) {
    return tx.select().from(inspectionPlan).where(eq(inspectionPlan.partId, partId)).orderBy(asc(inspectionPlan.revision));
  }

  /**
   * NCRs, dispositions, signatures and corrective actions linked to the lot. These tables belong to
   * another area; each is read only if it exists (to_regclass), and a query that fails is reported
   * as a note rather than breaking the lot's story.
   */
  async linked(lotId: string, tx: DbOrTx = this.db): Promise<LinkedRecords> {
    const out: LinkedRecords = { ncrs: [], dispositions: [], signatures: [], scars: [], steps: [], notes: [] };
    const [present] = rowsOf<Record<string, string | null>>(
      await tx.execute(sql`select to_regclass('public.ncr')::text as ncr, to_regclass('public.disposition')::text as disposition,
        to_regclass('public.e_signature')::text as e_signature, to_regclass('public.corrective_action')::text as corrective_action,
        to_regclass('public.corrective_action_step')::text as corrective_action_step`),
    );
    const has = (t: string) => !!present?.[t];
    if (!has('ncr')) {
      out.notes.push('Nonconformance records are not kept in this installation yet, so none are shown.');
      return out;
    }
    const attempt = async <T>(what: string, q: () => Promise<unknown>): Promise<T[]> => {
      try {
        return rowsOf<T>(await q());
      } catch (err) {
        this.log.warn({ err, lotId }, `ledger: could not read ${what}`);
        out.notes.push(`The ${what} of this lot could not be read; ask an administrator to check the server log.`);
        return [];
      }
    };
    out.ncrs = await attempt('nonconformance reports', () =>
      tx.execute(sql`select n.id::text, n.number, n.status, n.title, ${ts('n.raised_at')} as raised_at, u.email as raised_by, ${ts('n.review_started_at')} as review_started_at, ${ts('n.dispositioned_at')} as dispositioned_at,
          ${ts('n.closed_at')} as closed_at, c.email as closed_by, n.suspect_quantity, n.defect_codes
        from ncr n left join app_user u on u.id = n.raised_by left join app_user c on c.id = n.closed_by
        where n.lot_id = ${lotId} order by n.raised_at`),
    );
    const ncrIds = out.ncrs.map((n) => n.id);
    if (!ncrIds.length) return out;
    const ids = sql`${sql.param(ncrIds)}::uuid[]`;
    if (has('disposition')) {
      out.dispositions = await attempt('dispositions', () =>
        tx.execute(sql`select id::text, ncr_id::text, seq, kind, quantity, rationale, concession_ref, cost, ${ts('created_at')} as created_at from disposition where ncr_id = any(${ids}) order by created_at, seq`),
      );
    }
    if (has('e_signature')) {
      const dIds = out.dispositions.map((d) => d.id);
      out.signatures = await attempt('signatures', () =>
        tx.execute(sql`select id::text, entity, entity_id::text, purpose, signer_name, signer_email, signer_role, meaning, ${ts('signed_at')} as signed_at, content_hash
          from e_signature where (entity = 'ncr' and entity_id = any(${ids})) or (entity = 'disposition' and entity_id = any(${sql.param(dIds)}::uuid[])) order by signed_at`),
      );
    }
    if (has('corrective_action')) {
      out.scars = await attempt('corrective actions', () =>
        tx.execute(sql`select a.id::text, a.number, a.ncr_id::text, a.status, a.title, ${ts('a.issued_at')} as issued_at, u.email as issued_by, ${ts('a.acknowledged_at')} as acknowledged_at, ${ts('a.accepted_at')} as accepted_at,
            ${ts('a.verifying_since')} as verifying_since, ${ts('a.closed_at')} as closed_at, c.email as closed_by
          from corrective_action a left join app_user u on u.id = a.issued_by left join app_user c on c.id = a.closed_by
          where a.ncr_id = any(${ids}) order by a.issued_at`),
      );
      if (out.scars.length && has('corrective_action_step')) {
        out.steps = await attempt('8D steps', () =>
          tx.execute(sql`select s.id::text, s.corrective_action_id::text, s.step, s.status, s.due_on::text, ${ts('s.submitted_at')} as submitted_at, su.email as submitted_by,
              ${ts('s.reviewed_at')} as reviewed_at, ru.email as reviewed_by, s.review_decision, s.review_comment
            from corrective_action_step s left join app_user su on su.id = s.submitted_by left join app_user ru on ru.id = s.reviewed_by
            where s.corrective_action_id = any(${sql.param(out.scars.map((x) => x.id))}::uuid[]) and (s.submitted_at is not null or s.reviewed_at is not null)`),
        );
      }
    }
    return out;
  }
}
