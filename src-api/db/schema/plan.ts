import { sql } from 'drizzle-orm';
import { boolean, doublePrecision, index, integer, jsonb, pgTable, text, timestamp, unique, uniqueIndex, uuid, check } from 'drizzle-orm/pg-core';
import { part } from './part';
import { appUser } from './app-user';

/** An inspection plan revision. Revised, never edited once active: draft → active → superseded. */
export const inspectionPlan = pgTable(
  'inspection_plan',
  {
    id: uuid().primaryKey().defaultRandom(),
    partId: uuid().notNull().references(() => part.id, { onDelete: 'restrict' }),
    revision: integer().notNull(),
    status: text({ enum: ['draft', 'active', 'superseded'] }).notNull().default('draft'),
    samplingKind: text({ enum: ['aql', 'zero-acceptance'] }).notNull(),
    inspectionLevel: text(),
    aql: doublePrecision(),
    zeroSampleSize: integer(),
    notes: text(),
    basedOnPlanId: uuid(),
    createdBy: uuid().references(() => appUser.id),
    activatedBy: uuid().references(() => appUser.id),
    activatedAt: timestamp({ withTimezone: true }),
    supersededAt: timestamp({ withTimezone: true }),
    version: integer().notNull().default(1),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    unique('inspection_plan_part_revision_uq').on(t.partId, t.revision),
    // Exactly one active plan per part revision, enforced by the database.
    uniqueIndex('inspection_plan_one_active_uq').on(t.partId).where(sql`${t.status} = 'active'`),
  ],
);

/** One thing to measure or check, in the plan's reading layout. */
export const planCharacteristic = pgTable(
  'plan_characteristic',
  {
    id: uuid().primaryKey().defaultRandom(),
    planId: uuid().notNull().references(() => inspectionPlan.id, { onDelete: 'cascade' }),
    seq: integer().notNull(),
    code: text().notNull(),
    name: text().notNull(),
    kind: text({ enum: ['variable', 'attribute', 'derived'] }).notNull(),
    unit: text(),
    nominal: doublePrecision(),
    lsl: doublePrecision(),
    usl: doublePrecision(),
    method: text(),
    gaugeKind: text(),
    layout: text().notNull(),
    angles: integer(),
    levels: integer(),
    readingsPerSample: integer().notNull().default(1),
    derivedFormula: text(),
    inputs: jsonb().$type<string[]>(),
    chartKind: text().notNull().default('none'),
    subgroupSize: integer(),
    severity: text({ enum: ['critical', 'major', 'minor'] }).notNull().default('major'),
    wearDriven: boolean().notNull().default(false),
    ruleSet: text().notNull().default('western-electric'),
  },
  (t) => [
    unique('plan_characteristic_plan_code_uq').on(t.planId, t.code),
    index('plan_characteristic_plan_idx').on(t.planId),
    check('plan_characteristic_limits_chk', sql`${t.lsl} is null or ${t.usl} is null or ${t.lsl} < ${t.usl}`),
  ],
);
