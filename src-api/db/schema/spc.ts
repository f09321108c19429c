import { sql } from 'drizzle-orm';
import { boolean, check, doublePrecision, index, integer, jsonb, pgTable, primaryKey, text, timestamp, unique, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { supplier } from './supplier';
import { part } from './part';
import { lot, lotSample } from './lot';
import { appUser } from './app-user';

export const SPC_CHARTS = ['xbar-r', 'xbar-s', 'i-mr', 'p'] as const;
export const DRIFT_SIGNAL_STATUSES = ['open', 'acknowledged', 'ncr-opened'] as const;

export interface StoredBaseline {
  kind: 'first' | 'dates';
  count?: number;
  from?: string;
  to?: string;
  description: string;
}

/**
 * Frozen control limits, one row per version per supplier × part × characteristic code (codes are
 * stable across plan revisions). A new freeze adds a version and makes it the active one; lots
 * decided from `frozenAt` on are judged against it, earlier ones keep the version they had.
 */
export const controlLimit = pgTable(
  'control_limit',
  {
    id: uuid().primaryKey().defaultRandom(),
    supplierId: uuid().notNull().references(() => supplier.id, { onDelete: 'restrict' }),
    partId: uuid().notNull().references(() => part.id, { onDelete: 'restrict' }),
    characteristicCode: text().notNull(),
    version: integer().notNull(),
    active: boolean().notNull().default(true),
    chartKind: text({ enum: SPC_CHARTS }).notNull(),
    subgroupSize: integer(),
    ruleSet: text({ enum: ['western-electric', 'nelson'] }).notNull(),
    center: doublePrecision().notNull(),
    /** Limits of the plotted statistic at subgroupSize (null for p: they vary with each lot's size). */
    ucl: doublePrecision(),
    lcl: doublePrecision(),
    /** σ of individual measurements (p chart: √(p̄(1 − p̄))). Phase II judges with it. */
    sigma: doublePrecision().notNull(),
    /** The companion R, s or moving-range chart. */
    rangeCenter: doublePrecision(),
    rangeUcl: doublePrecision(),
    rangeLcl: doublePrecision(),
    baseline: jsonb().$type<StoredBaseline>().notNull(),
    baselineSubgroups: integer().notNull(),
    /** 0-based indices (in the series at freeze time) of the baseline subgroups excluded. */
    excluded: integer().array().notNull().default([]),
    excludedPoints: jsonb().$type<{ lotId: string; lotRef: number; serial: number | null }[]>().notNull().default([]),
    iterations: integer().notNull().default(1),
    /** "Die service due" when fewer than this many lots remain (conservative forecast). */
    serviceLots: integer().notNull().default(5),
    reason: text().notNull(),
    frozenBy: uuid().references(() => appUser.id),
    frozenAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    unique('control_limit_version_uq').on(t.supplierId, t.partId, t.characteristicCode, t.version),
    uniqueIndex('control_limit_one_active_uq').on(t.supplierId, t.partId, t.characteristicCode).where(sql`${t.active}`),
    check('control_limit_version_chk', sql`${t.version} >= 1`),
  ],
);

/**
 * A run-rule violation, raised once when the lot it concerns is decided. It keeps the limit
 * version that judged it (null = trial limits before any freeze) and the values of that moment.
 */
export const driftSignal = pgTable(
  'drift_signal',
  {
    id: uuid().primaryKey().defaultRandom(),
    supplierId: uuid().notNull().references(() => supplier.id, { onDelete: 'restrict' }),
    partId: uuid().notNull().references(() => part.id, { onDelete: 'restrict' }),
    characteristicCode: text().notNull(),
    rule: text().notNull(),
    /** 'location' (X-bar, I, p chart) or 'dispersion' (its R, s or MR chart). */
    chart: text({ enum: ['location', 'dispersion'] }).notNull(),
    lotId: uuid().notNull().references(() => lot.id, { onDelete: 'restrict' }),
    lotRef: integer().notNull(),
    sampleId: uuid().references(() => lotSample.id, { onDelete: 'set null' }),
    serial: integer(),
    value: doublePrecision().notNull(),
    center: doublePrecision(),
    ucl: doublePrecision(),
    lcl: doublePrecision(),
    limitVersion: integer(),
    message: text().notNull(),
    status: text({ enum: DRIFT_SIGNAL_STATUSES }).notNull().default('open'),
    ackNote: text(),
    ackBy: uuid().references(() => appUser.id),
    ackAt: timestamp({ withTimezone: true }),
    /** Set when a nonconformance is opened from the signal (the NCR work links it). */
    ncrId: uuid(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    // Created once: the same rule on the same chart for the same lot is one signal.
    unique('drift_signal_once_uq').on(t.supplierId, t.partId, t.characteristicCode, t.chart, t.rule, t.lotId),
    index('drift_signal_status_idx').on(t.supplierId, t.partId, t.characteristicCode, t.status),
    index('drift_signal_open_idx').on(t.status, t.createdAt),
  ],
);

/**
 * The latest die-wear forecast per supplier × part × wear-driven characteristic, refreshed when a
 * lot is decided: the record behind the "die service due" notice (Drift watch, supplier desk, and
 * later its e-mail, which sets notifiedAt).
 */
export const dieWearForecast = pgTable(
  'die_wear_forecast',
  {
    supplierId: uuid().notNull().references(() => supplier.id, { onDelete: 'cascade' }),
    partId: uuid().notNull().references(() => part.id, { onDelete: 'cascade' }),
    characteristicCode: text().notNull(),
    lastLotId: uuid().references(() => lot.id, { onDelete: 'set null' }),
    lotsUsed: integer().notNull(),
    slope: doublePrecision().notNull(),
    intercept: doublePrecision().notNull(),
    usl: doublePrecision().notNull(),
    lotsToLimit: doublePrecision(),
    lotsToLimitLower: doublePrecision(),
    serviceLots: integer().notNull(),
    serviceDue: boolean().notNull(),
    /** When the notice first became due (kept while it stays due). */
    dueSince: timestamp({ withTimezone: true }),
    notifiedAt: timestamp({ withTimezone: true }),
    computedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ name: 'die_wear_forecast_pkey', columns: [t.supplierId, t.partId, t.characteristicCode] }), index('die_wear_forecast_due_idx').on(t.serviceDue)],
);
