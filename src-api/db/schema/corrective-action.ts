import { sql } from 'drizzle-orm';
import { bigint, date, doublePrecision, index, integer, jsonb, pgTable, text, timestamp, unique, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { supplier } from './supplier';
import { part } from './part';
import { appUser } from './app-user';
import { ncr } from './ncr';
import { EIGHT_D_STEPS, SCAR_STATUSES, STEP_STATUSES } from '../../../shared/compute/workflow';

/** A supplier corrective action request, answered in the 8D steps (ISO 9001 §10.2). */
export const correctiveAction = pgTable(
  'corrective_action',
  {
    id: uuid().primaryKey().defaultRandom(),
    number: text().notNull().unique('corrective_action_number_uq'),
    year: integer().notNull(),
    seq: integer().notNull(),
    ncrId: uuid().notNull().references(() => ncr.id, { onDelete: 'restrict' }),
    supplierId: uuid().notNull().references(() => supplier.id, { onDelete: 'restrict' }),
    partId: uuid().references(() => part.id, { onDelete: 'restrict' }),
    title: text().notNull(),
    problem: text().notNull(),
    defectCodes: text().array().notNull().default([]),
    recipients: text().array().notNull().default([]),
    status: text({ enum: SCAR_STATUSES }).notNull().default('issued'),
    issuedBy: uuid().references(() => appUser.id),
    issuedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    acknowledgedAt: timestamp({ withTimezone: true }),
    acceptedAt: timestamp({ withTimezone: true }),
    verifyingSince: timestamp({ withTimezone: true }),
    closedAt: timestamp({ withTimezone: true }),
    closedBy: uuid().references(() => appUser.id),
    verifyLotsRequired: integer().notNull().default(3),
    /** Lots of this supplier × part accepted since verification began, in order. */
    verifyLots: jsonb().$type<{ lotId: string; at: string }[]>().notNull().default([]),
    recurrenceLotId: uuid(),
    recurrenceNcrId: uuid(),
    recurrenceAt: timestamp({ withTimezone: true }),
    version: integer().notNull().default(1),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    unique('corrective_action_year_seq_uq').on(t.year, t.seq),
    index('corrective_action_supplier_idx').on(t.supplierId, t.status),
    index('corrective_action_ncr_idx').on(t.ncrId),
    // At most one corrective action in progress per NCR.
    uniqueIndex('corrective_action_one_open_per_ncr_uq').on(t.ncrId).where(sql`${t.status} <> 'closed'`),
  ],
);

export const correctiveActionStep = pgTable(
  'corrective_action_step',
  {
    id: uuid().primaryKey().defaultRandom(),
    correctiveActionId: uuid().notNull().references(() => correctiveAction.id, { onDelete: 'cascade' }),
    step: text({ enum: EIGHT_D_STEPS }).notNull(),
    status: text({ enum: STEP_STATUSES }).notNull().default('locked'),
    answer: jsonb().$type<Record<string, unknown>>(),
    draft: jsonb().$type<Record<string, unknown>>(),
    draftSavedAt: timestamp({ withTimezone: true }),
    submittedAt: timestamp({ withTimezone: true }),
    submittedBy: uuid().references(() => appUser.id),
    reviewedAt: timestamp({ withTimezone: true }),
    reviewedBy: uuid().references(() => appUser.id),
    reviewDecision: text({ enum: ['accept', 'return'] }),
    reviewComment: text(),
    dueOn: date({ mode: 'string' }),
    /** The due date a reminder / overdue notice was sent for (a moved due date gets its own). */
    reminderSentFor: date({ mode: 'string' }),
    overdueSentFor: date({ mode: 'string' }),
    version: integer().notNull().default(1),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [unique('corrective_action_step_uq').on(t.correctiveActionId, t.step), index('corrective_action_step_due_idx').on(t.dueOn)],
);

/** A file the supplier sent as evidence for a step: PDF kept as sent, images re-encoded without metadata. */
export const correctiveActionEvidence = pgTable(
  'corrective_action_evidence',
  {
    id: uuid().primaryKey().defaultRandom(),
    correctiveActionId: uuid().notNull().references(() => correctiveAction.id, { onDelete: 'cascade' }),
    step: text({ enum: EIGHT_D_STEPS }).notNull(),
    key: text().notNull(),
    name: text().notNull(),
    contentType: text().notNull(),
    bytes: bigint({ mode: 'number' }).notNull(),
    caption: text(),
    uploadedBy: uuid().references(() => appUser.id),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('corrective_action_evidence_ca_idx').on(t.correctiveActionId, t.step)],
);

/** A notice to a supplier shown on its desk (first: a die due for service, from Drift watch). */
export const supplierNotice = pgTable(
  'supplier_notice',
  {
    id: uuid().primaryKey().defaultRandom(),
    supplierId: uuid().notNull().references(() => supplier.id, { onDelete: 'cascade' }),
    kind: text({ enum: ['die-service-due'] }).notNull(),
    title: text().notNull(),
    body: text().notNull(),
    partId: uuid().references(() => part.id, { onDelete: 'set null' }),
    characteristicCode: text(),
    lotsRemaining: doublePrecision(),
    signalId: uuid(),
    createdBy: uuid().references(() => appUser.id),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('supplier_notice_supplier_idx').on(t.supplierId, t.createdAt)],
);

export type CorrectiveActionRow = typeof correctiveAction.$inferSelect;
export type CorrectiveActionStepRow = typeof correctiveActionStep.$inferSelect;
