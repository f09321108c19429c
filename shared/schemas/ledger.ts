import { z } from 'zod';
import { LOT_STATUSES, storedSamplingSchema } from './receiving';
import { planChangeSchema } from './master-data';

// ───────── The lot's story (GET /api/ledger/lots/:id) ─────────

/** What an entry on the timeline is about; the web colours and filters by it. */
export const LEDGER_KINDS = ['received', 'readings', 'photo', 'decision', 'switching', 'plan', 'audit', 'ncr', 'disposition', 'signature', 'scar', 'scar-step'] as const;
export type LedgerKind = (typeof LEDGER_KINDS)[number];
export const LEDGER_KIND_LABELS: Record<LedgerKind, string> = {
  received: 'Received',
  readings: 'Readings',
  photo: 'Photo',
  decision: 'Decision',
  switching: 'Switching',
  plan: 'Plan',
  audit: 'Audit record',
  ncr: 'NCR',
  disposition: 'Disposition',
  signature: 'Signature',
  scar: 'Corrective action',
  'scar-step': '8D step',
};

/** One reading as it was stored, with the gauge's calibration due date at the time it was taken. */
export const ledgerReadingSchema = z.object({
  serial: z.number().int(),
  characteristicCode: z.string(),
  kind: z.string().nullable(),
  unit: z.string().nullable(),
  value: z.number().nullable(),
  values: z.array(z.number()),
  pass: z.boolean().nullable(),
  conforming: z.boolean().nullable(),
  note: z.string().nullable(),
  gaugeId: z.string().nullable(),
  gaugeAssetTag: z.string().nullable(),
  /** reading.gauge_due_on: the due date when the reading was taken, not today's. */
  gaugeDueOn: z.string().nullable(),
});
export type LedgerReading = z.infer<typeof ledgerReadingSchema>;

export const switchingSnapshotSchema = z.object({
  severity: z.enum(['normal', 'tightened', 'reduced']),
  consecutiveAccepted: z.number(),
  switchingScore: z.number(),
  discontinued: z.boolean(),
  /** Where the state came from: the last switching event before the time, or the initial state. */
  since: z.string().nullable(),
});
export type SwitchingSnapshot = z.infer<typeof switchingSnapshotSchema>;

export const ledgerEventSchema = z.object({
  /** Stable within one response (React key, test handle): `received`, `audit:42`, `readings:<time>`… */
  key: z.string(),
  at: z.string(),
  kind: z.enum(LEDGER_KINDS),
  title: z.string(),
  detail: z.string().nullable(),
  actor: z.string().nullable(),
  auditId: z.number().nullable(),
  sampling: storedSamplingSchema.optional(),
  switching: switchingSnapshotSchema.optional(),
  readings: z.array(ledgerReadingSchema).optional(),
  gauges: z.array(z.object({ id: z.string(), assetTag: z.string(), dueOn: z.string().nullable(), overdueAtTime: z.boolean() })).optional(),
  photoId: z.string().optional(),
  audit: z.object({ action: z.string(), entity: z.string(), entityId: z.string(), before: z.unknown(), after: z.unknown(), reason: z.string().nullable(), hash: z.string() }).optional(),
  link: z.object({ entity: z.enum(['ncr', 'corrective_action', 'inspection_plan']), id: z.string(), label: z.string() }).optional(),
});
export type LedgerEvent = z.infer<typeof ledgerEventSchema>;

export const ledgerPlanSchema = z.object({
  id: z.string(),
  revision: z.number().int(),
  status: z.string(),
  createdAt: z.string(),
  activatedAt: z.string().nullable(),
  supersededAt: z.string().nullable(),
  /** The revision this lot was received and judged against. */
  isLotPlan: z.boolean(),
  fromRevision: z.number().int().nullable(),
  changes: z.array(planChangeSchema),
});
export type LedgerPlan = z.infer<typeof ledgerPlanSchema>;

export const ledgerLotSchema = z.object({
  lot: z.object({
    id: z.string(),
    ref: z.number().int(),
    supplierLotNumber: z.string(),
    poNumber: z.string().nullable(),
    supplierId: z.string(),
    supplierCode: z.string(),
    supplierName: z.string(),
    partId: z.string(),
    partNumber: z.string(),
    partRevision: z.string(),
    planId: z.string(),
    planRevision: z.number().int(),
    quantity: z.number().int(),
    heatNumbers: z.array(z.string()),
    status: z.enum(LOT_STATUSES),
    receivedAt: z.string(),
    receivedBy: z.string().nullable(),
    sampling: storedSamplingSchema,
    decision: z.enum(['accept', 'reject']).nullable(),
    decidedBy: z.string().nullable(),
    decidedAt: z.string().nullable(),
    coreCount: z.number().int(),
  }),
  events: z.array(ledgerEventSchema),
  plans: z.array(ledgerPlanSchema),
  linked: z.array(z.object({ entity: z.enum(['ncr', 'corrective_action']), id: z.string(), label: z.string(), status: z.string() })),
  /** Parts of the story that could not be told (a section not built yet, or unreadable), said plainly. */
  notes: z.array(z.string()),
});
export type LedgerLot = z.infer<typeof ledgerLotSchema>;

// ───────── Exports ─────────

/** A synchronous PDF renders in one request; more cores than this belongs in the readings CSV. */
export const MAX_PDF_CORES = 500;
/** A readings CSV by time (not by lot) covers at most this many days. */
export const MAX_READINGS_RANGE_DAYS = 366;

const DAY_MS = 86_400_000;
const dateOrDateTime = (label: string) =>
  z.union([z.iso.datetime({ offset: true }), z.iso.date()], { message: `${label} must be a date (2026-01-31) or a date-time with offset` });

/** `2026-01-31` as a start is its first instant, as an end its last. */
export function rangeInstant(v: string, end: boolean): Date {
  return /^\d{4}-\d{2}-\d{2}$/.test(v) ? new Date(`${v}T${end ? '23:59:59.999' : '00:00:00.000'}Z`) : new Date(v);
}

export const exportLotsQuerySchema = z
  .object({
    status: z.enum(LOT_STATUSES, { message: `status must be one of ${LOT_STATUSES.join(', ')}` }).optional(),
    supplierId: z.uuid({ message: 'supplierId must be a supplier id' }).optional(),
    partId: z.uuid({ message: 'partId must be a part id' }).optional(),
    q: z.string().trim().max(60).optional(),
    receivedFrom: z.iso.date({ message: 'receivedFrom must be a date like 2026-01-31' }).optional(),
    receivedTo: z.iso.date({ message: 'receivedTo must be a date like 2026-01-31' }).optional(),
  })
  .strict()
  .refine((q) => !q.receivedFrom || !q.receivedTo || q.receivedFrom <= q.receivedTo, { path: ['receivedTo'], message: 'receivedTo is before receivedFrom' });
export type ExportLotsQuery = z.infer<typeof exportLotsQuerySchema>;

export const exportReadingsQuerySchema = z
  .object({
    lotId: z.uuid({ message: 'lotId must be a lot id' }).optional(),
    from: dateOrDateTime('from').optional(),
    to: dateOrDateTime('to').optional(),
  })
  .strict()
  .superRefine((q, ctx) => {
    if (!q.lotId && (!q.from || !q.to)) {
      ctx.addIssue({ code: 'custom', path: [q.from ? 'to' : 'from'], message: `Give a lotId, or both from and to (at most ${MAX_READINGS_RANGE_DAYS} days apart)` });
      return;
    }
    if (q.from && q.to) {
      const a = rangeInstant(q.from, false).getTime();
      const b = rangeInstant(q.to, true).getTime();
      if (a > b) ctx.addIssue({ code: 'custom', path: ['to'], message: '`to` is before `from`' });
      else if (b - a > MAX_READINGS_RANGE_DAYS * DAY_MS) ctx.addIssue({ code: 'custom', path: ['to'], message: `The range is at most ${MAX_READINGS_RANGE_DAYS} days; export a year at a time` });
    }
  });
export type ExportReadingsQuery = z.infer<typeof exportReadingsQuerySchema>;

/** The filters of GET /api/audit-events, without paging (the export streams every matching row). */
export const exportAuditQuerySchema = z
  .object({
    entity: z.string().trim().max(40).regex(/^[a-z_]+$/, 'entity is a table name like lot or ncr').optional(),
    entityId: z.string().trim().max(80).optional(),
    actor: z.string().trim().max(254).optional(),
    action: z.string().trim().max(60).optional(),
    from: z.iso.datetime({ offset: true, message: 'from must be a date-time' }).optional(),
    to: z.iso.datetime({ offset: true, message: 'to must be a date-time' }).optional(),
    sort: z.enum(['at', '-at']).optional(),
  })
  .strict()
  .refine((q) => !q.from || !q.to || Date.parse(q.from) <= Date.parse(q.to), { path: ['to'], message: 'The end of the range is before its start' });
export type ExportAuditQuery = z.infer<typeof exportAuditQuerySchema>;
