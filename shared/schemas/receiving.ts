import { z } from 'zod';
import { INSPECTION_LEVELS, AQL_VALUES, SEVERITIES } from '../compute/sampling';
import { pageQuerySchema, text } from './common';
import { LOT_STATUSES } from './vocabulary';

export { LOT_STATUSES, LOT_STATUS_LABELS, LOT_STATUS_TONE, type LotStatus } from './vocabulary';

export const PACKAGING = ['good', 'damaged', 'wet', 'poor'] as const;

// ───────── GET /api/sampling/plan ─────────
export const samplingQuerySchema = z.object({
  lotSize: z.coerce.number({ message: 'lotSize must be a number' }).int('lotSize is a whole number').min(2, 'lotSize must be at least 2'),
  level: z.enum(INSPECTION_LEVELS, { message: `level must be one of ${INSPECTION_LEVELS.join(', ')}` }),
  aql: z.coerce.number({ message: 'aql must be a number' }).refine((v) => (AQL_VALUES as readonly number[]).includes(v), { message: `aql must be one of ${AQL_VALUES.join(', ')}` }),
  severity: z.enum(SEVERITIES, { message: 'severity must be normal, tightened or reduced' }).default('normal'),
});
export const samplingResultSchema = z.object({
  codeLetter: z.string(),
  planLetter: z.string(),
  sampleSize: z.number().int(),
  accept: z.number().int(),
  reject: z.number().int(),
  inspectAll: z.boolean(),
  table: z.string(),
});

export const storedSamplingSchema = z.object({
  kind: z.enum(['aql', 'zero-acceptance']),
  codeLetter: z.string().nullable(),
  planLetter: z.string().nullable(),
  sampleSize: z.number().int(),
  accept: z.number().int(),
  reject: z.number().int(),
  severity: z.enum(SEVERITIES),
  aql: z.number().nullable(),
  level: z.string().nullable(),
  inspectAll: z.boolean(),
  table: z.string(),
});
export type StoredSampling = z.infer<typeof storedSamplingSchema>;

// ───────── Lots ─────────
export const createLotSchema = z
  .object({
    supplierId: z.uuid({ message: 'Choose a supplier' }),
    partId: z.uuid({ message: 'Choose a part revision' }),
    supplierLotNumber: text(60, 'supplier lot number'),
    poNumber: z.string().trim().max(40).nullable().optional(),
    quantity: z.number({ message: 'quantity must be a number' }).int('quantity is a whole number of cores').min(1, 'quantity must be at least 1').max(1_000_000, 'quantity is at most 1 000 000'),
    receivedAt: z.iso.datetime({ offset: true, message: 'receivedAt must be a date and time' }).optional(),
    heatNumbers: z.array(z.string().trim().min(1).max(40)).max(20).optional(),
    packagingCondition: z.enum(PACKAGING, { message: 'packaging must be good, damaged, wet or poor' }).default('good'),
    packagingNote: z.string().trim().max(500).nullable().optional(),
  })
  .strict();
export type CreateLotInput = z.input<typeof createLotSchema>;

export const sampleSchema = z.object({ id: z.string(), serial: z.number().int() });

export const readingSchema = z.object({
  sampleId: z.string(),
  characteristicCode: z.string(),
  values: z.array(z.number()),
  value: z.number().nullable(),
  pass: z.boolean().nullable(),
  conforming: z.boolean().nullable(),
  note: z.string().nullable(),
  gaugeId: z.string().nullable(),
  gaugeDueOn: z.string().nullable(),
  enteredBy: z.string().nullable(),
  enteredAt: z.string(),
  source: z.enum(['bench', 'import']),
});
export type Reading = z.infer<typeof readingSchema>;

export const photoSchema = z.object({
  id: z.string(),
  sampleId: z.string().nullable(),
  characteristicCode: z.string().nullable(),
  caption: z.string().nullable(),
  width: z.number(),
  height: z.number(),
  bytes: z.number(),
  createdAt: z.string(),
});
export type Photo = z.infer<typeof photoSchema>;

export const lotSummarySchema = z.object({
  id: z.string(),
  ref: z.number().int(),
  supplierId: z.string(),
  supplierCode: z.string(),
  supplierName: z.string(),
  partId: z.string(),
  partNumber: z.string(),
  partRevision: z.string(),
  supplierLotNumber: z.string(),
  poNumber: z.string().nullable(),
  quantity: z.number().int(),
  receivedAt: z.string(),
  status: z.enum(LOT_STATUSES),
  sampling: storedSamplingSchema,
  decision: z.enum(['accept', 'reject']).nullable(),
  version: z.number().int(),
});
export type LotSummary = z.infer<typeof lotSummarySchema>;

export const lotSchema = lotSummarySchema.extend({
  planId: z.string(),
  planRevision: z.number().int(),
  heatNumbers: z.array(z.string()),
  packagingCondition: z.enum(PACKAGING),
  packagingNote: z.string().nullable(),
  certificate: z.object({ name: z.string(), type: z.string() }).nullable(),
  decisionComment: z.string().nullable(),
  nonconformingCount: z.number().nullable(),
  decidedBy: z.string().nullable(),
  decidedAt: z.string().nullable(),
  samples: z.array(sampleSchema),
  readings: z.array(readingSchema),
  photos: z.array(photoSchema),
});
export type Lot = z.infer<typeof lotSchema>;

export const lotListQuerySchema = pageQuerySchema.extend({
  status: z.union([z.enum(LOT_STATUSES), z.literal('waiting')]).optional(),
  supplierId: z.uuid().optional(),
  partId: z.uuid().optional(),
  q: z.string().trim().max(60).optional(),
  receivedFrom: z.iso.date({ message: 'receivedFrom must be a date like 2026-01-31' }).optional(),
  receivedTo: z.iso.date({ message: 'receivedTo must be a date like 2026-01-31' }).optional(),
  sort: z.enum(['receivedAt', '-receivedAt', 'ref', '-ref', 'status', '-status']).optional(),
});

// ───────── Readings ─────────
const finite = z.number({ message: 'each reading must be a number' }).finite('each reading must be a finite number');
export const readingInputSchema = z
  .object({
    sampleId: z.uuid({ message: 'sampleId must be a sample of this lot' }),
    characteristicCode: z.string().trim().toUpperCase().min(1).max(24),
    values: z.array(finite).max(512, 'at most 512 readings').default([]),
    gaugeId: z.uuid({ message: 'gaugeId must be a gauge id' }).nullable().optional(),
    pass: z.boolean({ message: 'pass must be true or false' }).nullable().optional(),
    note: z.string().trim().max(1000).nullable().optional(),
  })
  .strict()
  .superRefine((r, ctx) => {
    if (r.pass === false && !r.note) ctx.addIssue({ code: 'custom', path: ['note'], message: 'Say what was wrong: a failed check needs a note' });
  });
export type ReadingInput = z.input<typeof readingInputSchema>;

export const putReadingsSchema = z.object({ readings: z.array(readingInputSchema).min(1, 'send at least one reading').max(5000, 'at most 5 000 readings at once') }).strict();

export const decisionSchema = z
  .object({
    decision: z.enum(['accept', 'reject'], { message: 'decision must be accept or reject' }),
    comment: z.string({ message: 'Add a comment' }).trim().min(1, 'Add a comment for the record').max(2000),
    version: z.number({ message: 'version is required' }).int(),
  })
  .strict();

export const importMappingSchema = z
  .object({
    /** Column holding the core serial (1…n). */
    serialColumn: z.string().min(1, 'Choose the column with the core serial'),
    /** characteristic code → one or more value columns (in reading order). */
    columns: z.record(z.string(), z.array(z.string()).min(1)).refine((m) => Object.keys(m).length > 0, 'Map at least one characteristic'),
    gaugeIds: z.record(z.string(), z.uuid()).optional(),
  })
  .strict();
export type ImportMapping = z.infer<typeof importMappingSchema>;

export const switchingViewSchema = z.object({
  state: z.object({
    severity: z.enum(SEVERITIES),
    consecutiveAccepted: z.number(),
    recentResults: z.array(z.boolean()),
    switchingScore: z.number(),
    notAcceptedOnTightened: z.number(),
    discontinued: z.boolean(),
    reducedEligible: z.boolean(),
  }),
  history: z.array(z.object({ id: z.string(), lotId: z.string().nullable(), event: z.string().nullable(), reason: z.string(), at: z.string(), severityBefore: z.string(), severityAfter: z.string() })),
});

export const supplierActionSchema = z.object({ partId: z.uuid({ message: 'Choose the part' }), note: text(1000, 'note') }).strict();
