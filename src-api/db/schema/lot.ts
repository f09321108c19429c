import { sql } from 'drizzle-orm';
import { bigint, check, date, doublePrecision, index, integer, jsonb, pgTable, primaryKey, serial, text, timestamp, unique, uuid, boolean } from 'drizzle-orm/pg-core';
import { supplier } from './supplier';
import { part } from './part';
import { inspectionPlan } from './plan';
import { appUser } from './app-user';
import { gauge } from './gauge';

export const LOT_STATUSES = ['received', 'inspecting', 'accepted', 'rejected', 'on-hold', 'released', 'returned', 'scrapped', 'closed'] as const;

/** The sampling plan computed when the lot was received, stored with it (never recomputed). */
export interface StoredSampling {
  kind: 'aql' | 'zero-acceptance';
  codeLetter: string | null;
  planLetter: string | null;
  sampleSize: number;
  accept: number;
  reject: number;
  severity: 'normal' | 'tightened' | 'reduced';
  aql: number | null;
  level: string | null;
  inspectAll: boolean;
  table: string;
  /** The full ISO 2859-1 plan as computed (for the switching rules), absent for zero-acceptance. */
  plan?: Record<string, unknown>;
  lotSize: number;
}

/** One shipment of one part revision from one supplier. */
export const lot = pgTable(
  'lot',
  {
    id: uuid().primaryKey().defaultRandom(),
    ref: serial().notNull().unique('lot_ref_uq'),
    supplierId: uuid().notNull().references(() => supplier.id, { onDelete: 'restrict' }),
    partId: uuid().notNull().references(() => part.id, { onDelete: 'restrict' }),
    planId: uuid().notNull().references(() => inspectionPlan.id, { onDelete: 'restrict' }),
    supplierLotNumber: text().notNull(),
    poNumber: text(),
    quantity: integer().notNull(),
    receivedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    heatNumbers: text().array().notNull().default([]),
    packagingCondition: text({ enum: ['good', 'damaged', 'wet', 'poor'] }).notNull().default('good'),
    packagingNote: text(),
    certificateKey: text(),
    certificateName: text(),
    certificateType: text(),
    status: text({ enum: LOT_STATUSES }).notNull().default('received'),
    sampling: jsonb().$type<StoredSampling>().notNull(),
    decision: text({ enum: ['accept', 'reject'] }),
    decisionComment: text(),
    nonconformingCount: integer(),
    decidedBy: uuid().references(() => appUser.id),
    decidedAt: timestamp({ withTimezone: true }),
    receivedBy: uuid().references(() => appUser.id),
    version: integer().notNull().default(1),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('lot_status_received_idx').on(t.status, t.receivedAt),
    index('lot_supplier_part_idx').on(t.supplierId, t.partId, t.receivedAt),
    check('lot_quantity_chk', sql`${t.quantity} >= 1`),
  ],
);

/** A sampled core, serial 1…n within its lot. */
export const lotSample = pgTable(
  'lot_sample',
  {
    id: uuid().primaryKey().defaultRandom(),
    lotId: uuid().notNull().references(() => lot.id, { onDelete: 'cascade' }),
    serial: integer().notNull(),
  },
  (t) => [unique('lot_sample_lot_serial_uq').on(t.lotId, t.serial)],
);

/**
 * The latest reading for one sample × characteristic (last write wins; every write is audited).
 * Raw readings are kept as numbers; `value` is the server-computed result the limits judge.
 */
export const reading = pgTable(
  'reading',
  {
    id: uuid().primaryKey().defaultRandom(),
    lotId: uuid().notNull().references(() => lot.id, { onDelete: 'cascade' }),
    sampleId: uuid().notNull().references(() => lotSample.id, { onDelete: 'cascade' }),
    characteristicCode: text().notNull(),
    values: doublePrecision().array().notNull().default([]),
    value: doublePrecision(),
    pass: boolean(),
    conforming: boolean(),
    note: text(),
    gaugeId: uuid().references(() => gauge.id, { onDelete: 'restrict' }),
    gaugeDueOn: date({ mode: 'string' }),
    enteredBy: uuid().references(() => appUser.id),
    enteredAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    source: text({ enum: ['bench', 'import'] }).notNull().default('bench'),
  },
  (t) => [
    unique('reading_sample_characteristic_uq').on(t.sampleId, t.characteristicCode),
    index('reading_lot_idx').on(t.lotId),
    // Drift watch charts read one characteristic across a supplier × part's lots.
    index('reading_lot_code_idx').on(t.lotId, t.characteristicCode),
  ],
);

/** A photo of a lot, optionally of one core and one characteristic. Stored re-encoded, metadata stripped. */
export const photo = pgTable(
  'photo',
  {
    id: uuid().primaryKey().defaultRandom(),
    lotId: uuid().notNull().references(() => lot.id, { onDelete: 'cascade' }),
    sampleId: uuid().references(() => lotSample.id, { onDelete: 'set null' }),
    characteristicCode: text(),
    caption: text(),
    webKey: text().notNull(),
    thumbKey: text().notNull(),
    width: integer().notNull(),
    height: integer().notNull(),
    bytes: bigint({ mode: 'number' }).notNull(),
    uploadedBy: uuid().references(() => appUser.id),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('photo_lot_idx').on(t.lotId)],
);

/** A gauge/CMM CSV imported into a lot; the same file twice is recognised by its hash. */
export const readingImport = pgTable(
  'reading_import',
  {
    id: uuid().primaryKey().defaultRandom(),
    lotId: uuid().notNull().references(() => lot.id, { onDelete: 'cascade' }),
    sha256: text().notNull(),
    fileName: text().notNull(),
    rowCount: integer().notNull(),
    readingCount: integer().notNull(),
    importedBy: uuid().references(() => appUser.id),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [unique('reading_import_lot_sha_uq').on(t.lotId, t.sha256)],
);

/** ISO 2859-1 switching state per supplier × part, updated after every lot decision. */
export const switchingState = pgTable(
  'switching_state',
  {
    supplierId: uuid().notNull().references(() => supplier.id, { onDelete: 'cascade' }),
    partId: uuid().notNull().references(() => part.id, { onDelete: 'cascade' }),
    state: jsonb().notNull(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ name: 'switching_state_pkey', columns: [t.supplierId, t.partId] })],
);

export const switchingEvent = pgTable(
  'switching_event',
  {
    id: uuid().primaryKey().defaultRandom(),
    supplierId: uuid().notNull().references(() => supplier.id, { onDelete: 'cascade' }),
    partId: uuid().notNull().references(() => part.id, { onDelete: 'cascade' }),
    lotId: uuid().references(() => lot.id, { onDelete: 'set null' }),
    event: text(),
    reason: text().notNull(),
    before: jsonb().notNull(),
    after: jsonb().notNull(),
    actorId: uuid().references(() => appUser.id),
    at: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('switching_event_sp_idx').on(t.supplierId, t.partId, t.at)],
);


