import { sql } from 'drizzle-orm';
import { check, doublePrecision, index, integer, jsonb, pgTable, primaryKey, text, timestamp, unique, uniqueIndex, uuid, bigint, boolean } from 'drizzle-orm/pg-core';
import { supplier } from './supplier';
import { part } from './part';
import { lot, photo } from './lot';
import { appUser } from './app-user';
import { DISPOSITION_KINDS } from '../../../shared/compute/disposition';
import { NCR_STATUSES } from '../../../shared/compute/workflow';

/** Our own list of defect codes; engineers add, rename and retire them (never delete: NCRs cite them). */
export const defectCode = pgTable('defect_code', {
  id: uuid().primaryKey().defaultRandom(),
  code: text().notNull().unique('defect_code_code_uq'),
  name: text().notNull(),
  description: text(),
  active: boolean().notNull().default(true),
  version: integer().notNull().default(1),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});

/**
 * Per-year sequence of document numbers (NCR, SCAR). The row is locked FOR UPDATE and bumped in
 * the transaction that creates the document, so a rolled-back creation leaves no gap.
 */
export const documentCounter = pgTable(
  'document_counter',
  {
    kind: text({ enum: ['ncr', 'scar'] }).notNull(),
    year: integer().notNull(),
    last: integer().notNull().default(0),
  },
  (t) => [primaryKey({ name: 'document_counter_pkey', columns: [t.kind, t.year] })],
);

/** A nonconformance report (ISO 9001 §8.7): what was required, what was found, and what became of it. */
export const ncr = pgTable(
  'ncr',
  {
    id: uuid().primaryKey().defaultRandom(),
    number: text().notNull().unique('ncr_number_uq'),
    year: integer().notNull(),
    seq: integer().notNull(),
    source: text({ enum: ['lot', 'core', 'signal', 'manual'] }).notNull(),
    status: text({ enum: NCR_STATUSES }).notNull().default('open'),
    title: text().notNull(),
    requirement: text().notNull(),
    found: text().notNull(),
    defectCodes: text().array().notNull().default([]),
    suspectQuantity: integer().notNull(),
    lotId: uuid().references(() => lot.id, { onDelete: 'restrict' }),
    supplierId: uuid().references(() => supplier.id, { onDelete: 'restrict' }),
    partId: uuid().references(() => part.id, { onDelete: 'restrict' }),
    characteristicCode: text(),
    /** A drift signal; a plain id (no foreign key) so this table does not depend on Drift watch's. */
    signalId: uuid(),
    sampleIds: uuid().array().notNull().default([]),
    readingIds: uuid().array().notNull().default([]),
    raisedBy: uuid().references(() => appUser.id),
    raisedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    reviewStartedAt: timestamp({ withTimezone: true }),
    dispositionedAt: timestamp({ withTimezone: true }),
    closedAt: timestamp({ withTimezone: true }),
    closedBy: uuid().references(() => appUser.id),
    version: integer().notNull().default(1),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    unique('ncr_year_seq_uq').on(t.year, t.seq),
    index('ncr_status_raised_idx').on(t.status, t.raisedAt),
    index('ncr_supplier_idx').on(t.supplierId, t.raisedAt),
    index('ncr_lot_idx').on(t.lotId),
    check('ncr_suspect_quantity_chk', sql`${t.suspectQuantity} >= 1`),
  ],
);

/** A photo on an NCR: linked from the lot's photos, or uploaded to the NCR (same checks). */
export const ncrPhoto = pgTable(
  'ncr_photo',
  {
    id: uuid().primaryKey().defaultRandom(),
    ncrId: uuid().notNull().references(() => ncr.id, { onDelete: 'cascade' }),
    photoId: uuid().references(() => photo.id, { onDelete: 'set null' }),
    caption: text(),
    webKey: text().notNull(),
    thumbKey: text().notNull(),
    width: integer().notNull(),
    height: integer().notNull(),
    bytes: bigint({ mode: 'number' }).notNull(),
    uploadedBy: uuid().references(() => appUser.id),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('ncr_photo_ncr_idx').on(t.ncrId), unique('ncr_photo_ncr_photo_uq').on(t.ncrId, t.photoId)],
);

/**
 * An electronic signature: who, when, the meaning they stated, and a SHA-256 over the canonical
 * JSON of exactly what they signed (kept beside it, so anyone can recompute the hash).
 */
export const eSignature = pgTable(
  'e_signature',
  {
    id: uuid().primaryKey().defaultRandom(),
    entity: text().notNull(),
    entityId: uuid().notNull(),
    purpose: text({ enum: ['disposition', 'concession'] }).notNull(),
    signerId: uuid().notNull().references(() => appUser.id, { onDelete: 'restrict' }),
    signerName: text().notNull(),
    signerEmail: text().notNull(),
    signerRole: text().notNull(),
    meaning: text().notNull(),
    signedAt: timestamp({ withTimezone: true }).notNull(),
    content: jsonb().notNull(),
    contentHash: text().notNull(),
  },
  (t) => [
    index('e_signature_entity_idx').on(t.entity, t.entityId),
    // One signed disposition set per NCR: a second, concurrent one cannot commit.
    uniqueIndex('e_signature_one_disposition_uq').on(t.entityId, t.purpose).where(sql`${t.entity} = 'ncr'`),
    check('e_signature_hash_chk', sql`${t.contentHash} ~ '^[0-9a-f]{64}$'`),
  ],
);

/** One line of the review board's decision: a quantity, what happens to it, why, and what it costs. */
export const disposition = pgTable(
  'disposition',
  {
    id: uuid().primaryKey().defaultRandom(),
    ncrId: uuid().notNull().references(() => ncr.id, { onDelete: 'cascade' }),
    seq: integer().notNull(),
    kind: text({ enum: DISPOSITION_KINDS }).notNull(),
    quantity: integer().notNull(),
    rationale: text().notNull(),
    concessionRef: text(),
    hours: doublePrecision(),
    rate: doublePrecision(),
    scrapValue: doublePrecision(),
    freight: doublePrecision(),
    cost: doublePrecision().notNull(),
    signatureId: uuid().notNull().references(() => eSignature.id, { onDelete: 'restrict' }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    unique('disposition_ncr_seq_uq').on(t.ncrId, t.seq),
    check('disposition_quantity_chk', sql`${t.quantity} >= 1`),
    check('disposition_concession_chk', sql`${t.kind} <> 'use-as-is' or ${t.concessionRef} is not null`),
  ],
);

export type NcrRow = typeof ncr.$inferSelect;
export type DefectCodeRow = typeof defectCode.$inferSelect;
export type ESignatureRow = typeof eSignature.$inferSelect;
export type DispositionRow = typeof disposition.$inferSelect;
