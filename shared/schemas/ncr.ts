import { z } from 'zod';
import { emailSchema, PASSWORD_MAX } from './auth';
import { pageQuerySchema, text, uuidSchema } from './common';
import { DISPOSITION_KINDS, checkSplit, type DispositionKind } from '../compute/disposition';
import { NCR_STATUSES, type NcrStatus } from '../compute/workflow';

export { DISPOSITION_KINDS, NCR_STATUSES };
export type { DispositionKind, NcrStatus };

export const NCR_STATUS_LABELS: Record<NcrStatus, string> = {
  open: 'Open',
  'in-review': 'In review',
  dispositioned: 'Dispositioned',
  closed: 'Closed',
};
/** Red while the cores are held and undecided, amber once decided and being carried out. */
export const NCR_STATUS_TONE: Record<NcrStatus, 'bad' | 'pending' | 'ok' | 'info'> = {
  open: 'bad',
  'in-review': 'pending',
  dispositioned: 'info',
  closed: 'ok',
};

export const NCR_SOURCES = ['lot', 'core', 'signal', 'manual'] as const;
export type NcrSource = (typeof NCR_SOURCES)[number];
export const NCR_SOURCE_LABELS: Record<NcrSource, string> = { lot: 'Rejected lot', core: 'Core', signal: 'Drift signal', manual: 'By hand' };

export const DISPOSITION_LABELS: Record<DispositionKind, string> = {
  'use-as-is': 'Use as is (concession)',
  rework: 'Rework',
  repair: 'Repair',
  sort: 'Sort / 100 % screen',
  'return-to-supplier': 'Return to supplier',
  scrap: 'Scrap',
  regrade: 'Regrade',
};

/** The statements a signer makes; the exact words are part of what is signed. */
export const SIGNATURE_MEANINGS = {
  disposition: 'I approve this disposition',
  concession: 'I concur with this concession as second engineer',
} as const;

// ───────── Defect codes (our own list) ─────────
export const defectCodeValue = z
  .string({ message: 'Enter a code' })
  .trim()
  .toUpperCase()
  .regex(/^[A-Z0-9][A-Z0-9-]{1,15}$/, 'Use 2–16 letters, digits or dashes');

export const defectCodeSchema = z.object({
  id: z.string(),
  code: z.string(),
  name: z.string(),
  description: z.string().nullable(),
  active: z.boolean(),
  version: z.number().int(),
  updatedAt: z.string(),
});
export type DefectCode = z.infer<typeof defectCodeSchema>;

export const createDefectCodeSchema = z
  .object({ code: defectCodeValue, name: text(120, 'name'), description: z.string().trim().max(500).nullable().optional() })
  .strict();
export type CreateDefectCodeInput = z.input<typeof createDefectCodeSchema>;

export const updateDefectCodeSchema = z
  .object({
    name: text(120, 'name').optional(),
    description: z.string().trim().max(500).nullable().optional(),
    active: z.boolean({ message: 'active must be true or false' }).optional(),
    version: z.number({ message: 'version is required' }).int(),
  })
  .strict();
export type UpdateDefectCodeInput = z.infer<typeof updateDefectCodeSchema>;

// ───────── NCRs ─────────
const ids = (label: string, max: number) => z.array(z.uuid({ message: `each ${label} must be an id` })).max(max, `at most ${max} ${label}s`);

export const createNcrSchema = z
  .object({
    lotId: uuidSchema.optional(),
    sampleIds: ids('core', 500).optional(),
    readingIds: ids('reading', 500).optional(),
    signalId: uuidSchema.optional(),
    supplierId: uuidSchema.optional(),
    partId: uuidSchema.optional(),
    characteristicCode: z.string().trim().toUpperCase().min(1).max(24).optional(),
    title: text(160, 'title'),
    requirement: text(2000, 'the requirement'),
    found: text(2000, 'what was found'),
    defectCodes: z.array(defectCodeValue, { message: 'Choose at least one defect code' }).min(1, 'Choose at least one defect code').max(10, 'At most 10 defect codes'),
    suspectQuantity: z.number({ message: 'suspect quantity must be a number' }).int('a whole number of cores').min(1, 'at least one core').max(1_000_000),
    photoIds: ids('photo', 50).optional(),
  })
  .strict()
  .superRefine((v, ctx) => {
    if ((v.sampleIds?.length || v.readingIds?.length || v.photoIds?.length) && !v.lotId) {
      ctx.addIssue({ code: 'custom', path: ['lotId'], message: 'Cores, readings and photos belong to a lot: give the lot' });
    }
  });
export type CreateNcrInput = z.input<typeof createNcrSchema>;

export const updateNcrSchema = z
  .object({
    title: text(160, 'title').optional(),
    requirement: text(2000, 'the requirement').optional(),
    found: text(2000, 'what was found').optional(),
    defectCodes: z.array(defectCodeValue).min(1, 'Choose at least one defect code').max(10).optional(),
    suspectQuantity: z.number().int().min(1).max(1_000_000).optional(),
    version: z.number({ message: 'version is required' }).int(),
  })
  .strict();
export type UpdateNcrInput = z.infer<typeof updateNcrSchema>;

export const ncrTransitionSchema = z
  .object({
    to: z.enum(NCR_STATUSES, { message: `to must be one of ${NCR_STATUSES.join(', ')}` }),
    version: z.number({ message: 'version is required' }).int(),
    note: z.string().trim().max(2000).nullable().optional(),
  })
  .strict();
export type NcrTransitionInput = z.infer<typeof ncrTransitionSchema>;

export const ncrListQuerySchema = pageQuerySchema.extend({
  status: z.union([z.enum(NCR_STATUSES), z.literal('active')]).optional(),
  supplierId: z.uuid().optional(),
  lotId: z.uuid().optional(),
  q: z.string().trim().max(60).optional(),
  sort: z.enum(['raisedAt', '-raisedAt', 'number', '-number', 'status', '-status']).optional(),
});
export type NcrListQuery = z.infer<typeof ncrListQuerySchema>;

// ───────── Dispositions and e-signatures ─────────
const money = (label: string) => z.number({ message: `${label} must be a number` }).finite().min(0, `${label} cannot be negative`).max(10_000_000).nullable().optional();

export const dispositionLineSchema = z
  .object({
    kind: z.enum(DISPOSITION_KINDS, { message: 'Choose a disposition' }),
    quantity: z.number({ message: 'quantity must be a number' }).int('a whole number of cores').min(1, 'at least one core'),
    rationale: text(2000, 'the rationale'),
    concessionRef: z.string().trim().max(60).nullable().optional(),
    hours: money('hours'),
    rate: money('the rate'),
    scrapValue: money('the scrap value'),
    freight: money('freight'),
  })
  .strict()
  .superRefine((l, ctx) => {
    if (l.kind === 'use-as-is' && !l.concessionRef) ctx.addIssue({ code: 'custom', path: ['concessionRef'], message: 'Use as is needs the concession reference (ISO 9001 §8.7)' });
  });
export type DispositionLineInput = z.input<typeof dispositionLineSchema>;

export const signatureSchema = z
  .object({
    password: z.string({ message: 'Enter your password to sign' }).min(1, 'Enter your password to sign').max(PASSWORD_MAX),
    meaning: z.literal(SIGNATURE_MEANINGS.disposition, { message: `Confirm: “${SIGNATURE_MEANINGS.disposition}”` }),
  })
  .strict();

export const countersignatureSchema = z
  .object({
    email: emailSchema,
    password: z.string({ message: 'The second engineer enters their password' }).min(1, 'The second engineer enters their password').max(PASSWORD_MAX),
    meaning: z.literal(SIGNATURE_MEANINGS.concession, { message: `Confirm: “${SIGNATURE_MEANINGS.concession}”` }),
  })
  .strict();

export const dispositionLinesSchema = z.array(dispositionLineSchema).min(1, 'Add at least one disposition').max(20, 'At most 20 lines');

/** The lines with the quantity check the review board shows live. */
export const dispositionLinesFor = (suspectQuantity: number) =>
  z.object({ lines: dispositionLinesSchema }).superRefine((v, ctx) => {
    const c = checkSplit(v.lines, suspectQuantity);
    if (!c.ok && c.message) ctx.addIssue({ code: 'custom', path: ['lines'], message: c.message });
  });

export const createDispositionsSchema = z
  .object({
    version: z.number({ message: 'version is required' }).int(),
    lines: dispositionLinesSchema,
    signature: signatureSchema,
    countersignature: countersignatureSchema.optional(),
  })
  .strict();
export type CreateDispositionsInput = z.input<typeof createDispositionsSchema>;

// ───────── Responses ─────────
export const ncrSummarySchema = z.object({
  id: z.string(),
  number: z.string(),
  status: z.enum(NCR_STATUSES),
  source: z.enum(NCR_SOURCES),
  title: z.string(),
  supplierId: z.string().nullable(),
  supplierCode: z.string().nullable(),
  supplierName: z.string().nullable(),
  partId: z.string().nullable(),
  partNumber: z.string().nullable(),
  partRevision: z.string().nullable(),
  lotId: z.string().nullable(),
  lotRef: z.number().nullable(),
  supplierLotNumber: z.string().nullable(),
  defectCodes: z.array(z.string()),
  suspectQuantity: z.number().int(),
  raisedAt: z.string(),
  raisedByName: z.string().nullable(),
  scarId: z.string().nullable(),
  scarNumber: z.string().nullable(),
  version: z.number().int(),
});
export type NcrSummary = z.infer<typeof ncrSummarySchema>;

export const ncrPhotoSchema = z.object({ id: z.string(), caption: z.string().nullable(), width: z.number(), height: z.number(), fromLot: z.boolean(), createdAt: z.string() });
export type NcrPhoto = z.infer<typeof ncrPhotoSchema>;

export const dispositionSchema = z.object({
  id: z.string(),
  kind: z.enum(DISPOSITION_KINDS),
  quantity: z.number().int(),
  rationale: z.string(),
  concessionRef: z.string().nullable(),
  hours: z.number().nullable(),
  rate: z.number().nullable(),
  scrapValue: z.number().nullable(),
  freight: z.number().nullable(),
  cost: z.number(),
  createdAt: z.string(),
});
export type Disposition = z.infer<typeof dispositionSchema>;

export const eSignatureSchema = z.object({
  id: z.string(),
  purpose: z.enum(['disposition', 'concession']),
  signerName: z.string(),
  signerEmail: z.string(),
  meaning: z.string(),
  signedAt: z.string(),
  contentHash: z.string(),
});
export type ESignature = z.infer<typeof eSignatureSchema>;

export const historyEntrySchema = z.object({ at: z.string(), action: z.string(), actorEmail: z.string().nullable(), reason: z.string().nullable(), detail: z.string().nullable() });

/** A reading linked to an NCR, with the plan's limits it was judged against. */
export const linkedReadingSchema = z.object({
  id: z.string(),
  sampleId: z.string(),
  serial: z.number().nullable(),
  characteristicCode: z.string(),
  name: z.string(),
  unit: z.string().nullable(),
  lsl: z.number().nullable(),
  usl: z.number().nullable(),
  /** Every reading is held to the limits (single values such as burr height, and diameters; see judgesEachReading); otherwise the readings are radii or heights the value is computed from. */
  eachReadingJudged: z.boolean(),
  value: z.number().nullable(),
  values: z.array(z.number()),
  pass: z.boolean().nullable(),
  conforming: z.boolean().nullable(),
  note: z.string().nullable(),
});
export type LinkedReading = z.infer<typeof linkedReadingSchema>;

export const ncrSchema = ncrSummarySchema.extend({
  requirement: z.string(),
  found: z.string(),
  characteristicCode: z.string().nullable(),
  signalId: z.string().nullable(),
  lot: z.object({ id: z.string(), ref: z.number(), status: z.string(), quantity: z.number(), supplierLotNumber: z.string(), version: z.number() }).nullable(),
  cores: z.array(z.object({ id: z.string(), serial: z.number() })),
  /** The linked readings, with the plan's limits they were judged against. */
  readings: z.array(linkedReadingSchema),
  photos: z.array(ncrPhotoSchema),
  dispositions: z.array(dispositionSchema),
  signatures: z.array(eSignatureSchema),
  totalCost: z.number(),
  closedAt: z.string().nullable(),
  history: z.array(historyEntrySchema),
  reviewBoard: z.object({ countersignUseAsIs: z.boolean() }),
});
export type Ncr = z.infer<typeof ncrSchema>;

/** What a supplier user sees of its own NCR: the facts and the outcome, no people, costs or internal notes. */
export const ncrSupplierSchema = z.object({
  id: z.string(),
  number: z.string(),
  status: z.enum(NCR_STATUSES),
  title: z.string(),
  partNumber: z.string().nullable(),
  partRevision: z.string().nullable(),
  lotId: z.string().nullable(),
  lotRef: z.number().nullable(),
  supplierLotNumber: z.string().nullable(),
  requirement: z.string(),
  found: z.string(),
  defectCodes: z.array(z.string()),
  suspectQuantity: z.number().int(),
  raisedAt: z.string(),
  dispositions: z.array(z.object({ kind: z.enum(DISPOSITION_KINDS), quantity: z.number().int() })),
  /** What was measured on the linked cores: the values and limits, without the inspectors' notes. */
  measured: z.array(linkedReadingSchema.omit({ id: true, sampleId: true, note: true })),
  photos: z.array(ncrPhotoSchema),
  scarId: z.string().nullable(),
  scarNumber: z.string().nullable(),
});
export type NcrForSupplier = z.infer<typeof ncrSupplierSchema>;

/** Rejected lots held without an NCR yet: the review board's in-tray. */
export const heldLotSchema = z.object({
  id: z.string(),
  ref: z.number(),
  supplierId: z.string(),
  supplierCode: z.string(),
  partId: z.string(),
  partNumber: z.string(),
  partRevision: z.string(),
  supplierLotNumber: z.string(),
  quantity: z.number(),
  decidedAt: z.string().nullable(),
  decisionComment: z.string().nullable(),
  nonconformingCount: z.number().nullable(),
  failures: z.array(z.object({ readingId: z.string(), sampleId: z.string(), serial: z.number(), characteristicCode: z.string(), name: z.string(), value: z.number().nullable(), unit: z.string().nullable(), lsl: z.number().nullable(), usl: z.number().nullable(), pass: z.boolean().nullable(), note: z.string().nullable() })),
  /** The lot's photos, linked to the NCR when it is raised from here. */
  photoIds: z.array(z.string()),
});
export type HeldLot = z.infer<typeof heldLotSchema>;
