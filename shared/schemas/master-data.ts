import { z } from 'zod';
import { AQL_VALUES, INSPECTION_LEVELS } from '../compute/sampling';
import { pageQuerySchema, text } from './common';

// ───────────────────────── Suppliers ─────────────────────────
export const APPROVAL_STATUSES = ['approved', 'conditional', 'disapproved'] as const;
export const approvalStatusSchema = z.enum(APPROVAL_STATUSES, { message: 'approval must be approved, conditional or disapproved' });
export type ApprovalStatus = z.infer<typeof approvalStatusSchema>;

const contactEmail = z.string().trim().toLowerCase().pipe(z.email({ message: 'Enter a valid e-mail address' }));

export const supplierSchema = z.object({
  id: z.string(),
  code: z.string(),
  name: z.string(),
  contactEmails: z.array(z.string()),
  approvalStatus: approvalStatusSchema,
  approvalReason: z.string().nullable(),
  notes: z.string().nullable(),
  version: z.number().int(),
  updatedAt: z.string(),
});
export type Supplier = z.infer<typeof supplierSchema>;

export const supplierCodeSchema = z
  .string({ message: 'Enter a code' })
  .trim()
  .toUpperCase()
  .regex(/^[A-Z0-9][A-Z0-9-]{1,15}$/, 'Use 2–16 letters, digits or dashes');

export const createSupplierSchema = z
  .object({
    code: supplierCodeSchema,
    name: text(160, 'name'),
    contactEmails: z.array(contactEmail, { message: 'Give at least one contact e-mail' }).min(1, 'Give at least one contact e-mail').max(10, 'At most 10 contacts'),
    approvalStatus: approvalStatusSchema.default('approved'),
    approvalReason: z.string().trim().max(500).nullable().optional(),
    notes: z.string().trim().max(2000).nullable().optional(),
  })
  .strict();
export type CreateSupplierInput = z.input<typeof createSupplierSchema>;

export const updateSupplierSchema = z
  .object({
    name: text(160, 'name').optional(),
    contactEmails: z.array(contactEmail).min(1, 'Give at least one contact e-mail').max(10).optional(),
    approvalStatus: approvalStatusSchema.optional(),
    approvalReason: z.string().trim().max(500).nullable().optional(),
    notes: z.string().trim().max(2000).nullable().optional(),
    version: z.number({ message: 'version is required' }).int(),
  })
  .strict();
export type UpdateSupplierInput = z.infer<typeof updateSupplierSchema>;

export const supplierListQuerySchema = pageQuerySchema.extend({
  q: z.string().trim().max(80).optional(),
  approvalStatus: approvalStatusSchema.optional(),
  sort: z.enum(['code', '-code', 'name', '-name', 'approvalStatus', '-approvalStatus']).optional(),
});

// ───────────────────────── Parts ─────────────────────────
export const CONSTRUCTIONS = ['welded', 'interlocked', 'bonded', 'cleated', 'riveted', 'segmented'] as const;
export const constructionSchema = z.enum(CONSTRUCTIONS, { message: `construction must be one of ${CONSTRUCTIONS.join(', ')}` });
export type Construction = z.infer<typeof constructionSchema>;

const positive = (label: string, max: number) =>
  z.number({ message: `${label} must be a number` }).finite(`${label} must be a finite number`).positive(`${label} must be greater than zero`).max(max, `${label} is at most ${max}`);
const flux = (label: string) => z.number({ message: `${label} must be a number` }).finite().positive(`${label} must be greater than zero`).max(2.5, `${label} above 2.5 T is beyond any electrical steel`);

export const partSchema = z.object({
  id: z.string(),
  partNumber: z.string(),
  revision: z.string(),
  description: z.string(),
  construction: constructionSchema,
  steelGrade: z.string(),
  lossWPerKg: z.number(),
  gradeThicknessMm: z.number(),
  laminationThicknessMm: z.number(),
  laminationAreaCm2: z.number(),
  densityGcm3: z.number(),
  densitySource: z.string(),
  nominalBoreMm: z.number(),
  nominalOdMm: z.number(),
  nominalStackLengthMm: z.number(),
  slotCount: z.number().int(),
  nominalMassKg: z.number(),
  designStackingFactor: z.number().nullable(),
  designToothT: z.number().nullable(),
  designYokeT: z.number().nullable(),
  drawing: z.object({ name: z.string(), size: z.number() }).nullable(),
  activePlanId: z.string().nullable(),
  version: z.number().int(),
  updatedAt: z.string(),
});
export type Part = z.infer<typeof partSchema>;

const partFields = {
  partNumber: z.string({ message: 'Enter a part number' }).trim().min(1, 'Enter a part number').max(40).regex(/^[A-Za-z0-9][A-Za-z0-9._/-]*$/, 'Letters, digits and . _ / - only'),
  revision: z.string({ message: 'Enter a revision' }).trim().min(1, 'Enter a revision').max(8).regex(/^[A-Za-z0-9.-]+$/, 'Letters, digits, dot or dash'),
  description: text(200, 'description'),
  construction: constructionSchema,
  steelGrade: z.string({ message: 'Enter the steel grade, e.g. M400-50A' }).trim().min(1, 'Enter the steel grade, e.g. M400-50A').max(20),
  laminationThicknessMm: positive('lamination thickness', 5),
  laminationAreaCm2: positive('lamination net area', 100000),
  /** Omit to take the grade's conventional density. */
  densityGcm3: z.number().finite().min(7.0, 'density below 7.0 g/cm³ is not electrical steel').max(8.2, 'density above 8.2 g/cm³ is not electrical steel').nullable().optional(),
  nominalBoreMm: positive('nominal bore', 5000),
  nominalOdMm: positive('nominal OD', 5000),
  nominalStackLengthMm: positive('stack length', 5000),
  slotCount: z.number({ message: 'slot count must be a number' }).int('slot count is a whole number').min(1, 'at least one slot').max(1000),
  nominalMassKg: positive('nominal core mass', 100000),
  designStackingFactor: z.number().finite().gt(0.5, 'stacking factor must be above 0.5').max(1, 'stacking factor is at most 1').nullable().optional(),
  designToothT: flux('tooth flux density').nullable().optional(),
  designYokeT: flux('yoke flux density').nullable().optional(),
};

function boreInsideOd<T extends { nominalBoreMm?: number; nominalOdMm?: number }>(v: T, ctx: z.RefinementCtx) {
  if (v.nominalBoreMm !== undefined && v.nominalOdMm !== undefined && v.nominalBoreMm >= v.nominalOdMm) {
    ctx.addIssue({ code: 'custom', path: ['nominalBoreMm'], message: 'The bore must be smaller than the OD' });
  }
}

export const createPartSchema = z.object(partFields).strict().superRefine(boreInsideOd);
export type CreatePartInput = z.input<typeof createPartSchema>;

export const updatePartSchema = z
  .object({ ...Object.fromEntries(Object.entries(partFields).filter(([k]) => k !== 'partNumber' && k !== 'revision').map(([k, s]) => [k, (s as z.ZodType).optional()])), version: z.number().int() })
  .strict()
  .superRefine((v, ctx) => boreInsideOd(v as { nominalBoreMm?: number; nominalOdMm?: number }, ctx));
export type UpdatePartInput = Partial<Omit<z.infer<typeof createPartSchema>, 'partNumber' | 'revision'>> & { version: number };

export const partListQuerySchema = pageQuerySchema.extend({
  q: z.string().trim().max(80).optional(),
  construction: constructionSchema.optional(),
  sort: z.enum(['partNumber', '-partNumber', 'construction', '-construction', 'updatedAt', '-updatedAt']).optional(),
});

// ───────────────────────── Gauges ─────────────────────────
export const GAUGE_KINDS = [
  'bore-gauge',
  'micrometer',
  'caliper',
  'height-gauge',
  'dial-indicator',
  'cmm',
  'insulation-tester',
  'franklin-tester',
  'scale',
  'go-no-go',
  'feeler-gauge',
  'burr-gauge',
  'visual',
] as const;
export const gaugeKindSchema = z.enum(GAUGE_KINDS, { message: 'unknown gauge kind' });
export type GaugeKind = z.infer<typeof gaugeKindSchema>;
export const GAUGE_KIND_LABELS: Record<GaugeKind, string> = {
  'bore-gauge': 'Bore gauge',
  micrometer: 'Micrometer',
  caliper: 'Caliper',
  'height-gauge': 'Height gauge',
  'dial-indicator': 'Dial indicator',
  cmm: 'CMM',
  'insulation-tester': 'Insulation tester',
  'franklin-tester': 'Franklin tester',
  scale: 'Scale',
  'go-no-go': 'Go/no-go gauge',
  'feeler-gauge': 'Feeler gauge',
  'burr-gauge': 'Burr gauge',
  visual: 'Visual aid (loupe, light)',
};

export const UNITS = ['mm', 'µm', 'g', 'kg', 'MΩ', 'A', 'Ω·cm²', '°C', 'W/kg', '%', 'T', 'N', 'count'] as const;
export const unitSchema = z.enum(UNITS, { message: `unit must be one of ${UNITS.join(', ')}` });
export type Unit = z.infer<typeof unitSchema>;

export const GAUGE_STATUSES = ['in-service', 'out-of-service'] as const;
export const gaugeStatusSchema = z.enum(GAUGE_STATUSES, { message: 'status must be in-service or out-of-service' });

const isoDate = z.string({ message: 'Enter a date' }).regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2026-12-31').refine((s) => !Number.isNaN(Date.parse(s)), 'Not a real date');

export const gaugeSchema = z.object({
  id: z.string(),
  assetTag: z.string(),
  kind: gaugeKindSchema,
  description: z.string(),
  resolution: z.number(),
  unit: unitSchema,
  rangeMin: z.number().nullable(),
  rangeMax: z.number().nullable(),
  calibrationDueOn: z.string(),
  status: gaugeStatusSchema,
  /** Computed: in service but past its calibration due date. */
  calibrationOverdue: z.boolean(),
  dueInDays: z.number().int(),
  version: z.number().int(),
});
export type Gauge = z.infer<typeof gaugeSchema>;

const gaugeFields = {
  assetTag: z.string({ message: 'Enter an asset tag' }).trim().toUpperCase().regex(/^[A-Z0-9][A-Z0-9-]{1,23}$/, 'Use 2–24 letters, digits or dashes'),
  kind: gaugeKindSchema,
  description: text(160, 'description'),
  resolution: positive('resolution', 1000),
  unit: unitSchema,
  rangeMin: z.number().finite().nullable().optional(),
  rangeMax: z.number().finite().nullable().optional(),
  calibrationDueOn: isoDate,
  status: gaugeStatusSchema.default('in-service'),
};
function rangeOrdered<T extends { rangeMin?: number | null; rangeMax?: number | null }>(v: T, ctx: z.RefinementCtx) {
  if (v.rangeMin != null && v.rangeMax != null && v.rangeMin >= v.rangeMax) {
    ctx.addIssue({ code: 'custom', path: ['rangeMax'], message: 'The range top must be above its bottom' });
  }
}
export const createGaugeSchema = z.object(gaugeFields).strict().superRefine(rangeOrdered);
export type CreateGaugeInput = z.input<typeof createGaugeSchema>;
export const updateGaugeSchema = z
  .object({ ...Object.fromEntries(Object.entries(gaugeFields).filter(([k]) => k !== 'assetTag').map(([k, s]) => [k, (s as z.ZodType).optional()])), version: z.number().int() })
  .strict()
  .superRefine((v, ctx) => rangeOrdered(v as { rangeMin?: number | null; rangeMax?: number | null }, ctx));
export type UpdateGaugeInput = Partial<Omit<z.infer<typeof createGaugeSchema>, 'assetTag'>> & { version: number };

export const gaugeListQuerySchema = pageQuerySchema.extend({
  q: z.string().trim().max(80).optional(),
  kind: gaugeKindSchema.optional(),
  /** 'overdue' (past due, in service), 'due-soon' (within 30 days), 'ok' */
  calibration: z.enum(['overdue', 'due-soon', 'ok']).optional(),
  status: gaugeStatusSchema.optional(),
  sort: z.enum(['assetTag', '-assetTag', 'calibrationDueOn', '-calibrationDueOn', 'kind', '-kind']).optional(),
});

// ───────────────────────── Inspection plans ─────────────────────────
export const PLAN_STATUSES = ['draft', 'active', 'superseded'] as const;
export const planStatusSchema = z.enum(PLAN_STATUSES);
export type PlanStatus = z.infer<typeof planStatusSchema>;

export const CHARACTERISTIC_KINDS = ['variable', 'attribute', 'derived'] as const;
export const LAYOUTS = ['single', 'two-point', 'probed', 'heights', 'pass-fail'] as const;
export const LAYOUT_LABELS: Record<(typeof LAYOUTS)[number], string> = {
  single: 'Single value',
  'two-point': 'Two-point diameters at N angles',
  probed: 'Probed points at N angles on M levels',
  heights: 'Heights at N angles',
  'pass-fail': 'Pass / fail',
};
export const DERIVED_FORMULAS = [
  'circle-fit-diameter',
  'circle-fit-roundness',
  'eccentricity',
  'runout-eccentricity',
  'mean-diameter',
  'ovality',
  'stack-length',
  'parallelism',
  'squareness',
  'stacking-factor-mass',
  'stacking-factor-count',
  'insulation-resistance',
  'flux-penalty',
] as const;
export const CHART_KINDS = ['xbar-r', 'xbar-s', 'i-mr', 'p', 'none'] as const;
export const SEVERITY_CLASSES = ['critical', 'major', 'minor'] as const;
export const RULE_SETS = ['western-electric', 'nelson'] as const;

export const aqlSchema = z
  .number({ message: 'AQL must be a number' })
  .refine((v) => (AQL_VALUES as readonly number[]).includes(v), { message: `AQL must be one of the ISO 2859-1 preferred values ${AQL_VALUES.join(', ')}` });
export const inspectionLevelSchema = z.enum(INSPECTION_LEVELS, { message: `level must be one of ${INSPECTION_LEVELS.join(', ')}` });

export const characteristicInputSchema = z
  .object({
    code: z.string({ message: 'Enter a code' }).trim().toUpperCase().regex(/^[A-Z][A-Z0-9_-]{0,23}$/, 'Start with a letter; letters, digits, _ or -'),
    name: text(120, 'name'),
    kind: z.enum(CHARACTERISTIC_KINDS, { message: 'kind must be variable, attribute or derived' }),
    unit: unitSchema.nullable().optional(),
    nominal: z.number().finite().nullable().optional(),
    lsl: z.number({ message: 'lower limit must be a number' }).finite('lower limit must be finite').nullable().optional(),
    usl: z.number({ message: 'upper limit must be a number' }).finite('upper limit must be finite').nullable().optional(),
    method: z.string().trim().max(1000).nullable().optional(),
    gaugeKind: gaugeKindSchema.nullable().optional(),
    layout: z.enum(LAYOUTS, { message: 'unknown reading layout' }).default('single'),
    angles: z.number().int().min(1).max(64).nullable().optional(),
    levels: z.number().int().min(1).max(8).nullable().optional(),
    readingsPerSample: z.number({ message: 'readings per sample must be a number' }).int().min(1, 'at least 1 reading').max(64, 'at most 64 readings').default(1),
    derivedFormula: z.enum(DERIVED_FORMULAS, { message: 'unknown derived formula' }).nullable().optional(),
    /** For derived values: which characteristic codes feed the formula. */
    inputs: z.array(z.string()).max(4).nullable().optional(),
    chartKind: z.enum(CHART_KINDS).default('none'),
    subgroupSize: z.number().int().min(1).max(64).nullable().optional(),
    severity: z.enum(SEVERITY_CLASSES, { message: 'severity must be critical, major or minor' }).default('major'),
    wearDriven: z.boolean().default(false),
    ruleSet: z.enum(RULE_SETS).default('western-electric'),
  })
  .strict()
  .superRefine((c, ctx) => {
    if (c.kind !== 'attribute') {
      if (c.lsl == null && c.usl == null) ctx.addIssue({ code: 'custom', path: ['usl'], message: 'A measured value needs a lower or an upper limit' });
      if (!c.unit) ctx.addIssue({ code: 'custom', path: ['unit'], message: 'A measured value needs a unit' });
    }
    if (c.lsl != null && c.usl != null && c.lsl >= c.usl) ctx.addIssue({ code: 'custom', path: ['lsl'], message: 'The lower limit must be below the upper limit' });
    if (c.kind === 'attribute' && c.layout !== 'pass-fail') ctx.addIssue({ code: 'custom', path: ['layout'], message: 'An attribute check uses the pass / fail layout' });
    if (c.kind !== 'attribute' && c.layout === 'pass-fail') ctx.addIssue({ code: 'custom', path: ['layout'], message: 'Pass / fail is for attribute checks' });
    if (c.kind === 'derived' && !c.derivedFormula) ctx.addIssue({ code: 'custom', path: ['derivedFormula'], message: 'A derived value needs its formula' });
    if ((c.layout === 'two-point' || c.layout === 'probed' || c.layout === 'heights') && !c.angles) {
      ctx.addIssue({ code: 'custom', path: ['angles'], message: 'Give the number of angles for this layout' });
    }
    if (c.layout === 'probed' && c.angles != null && c.angles < 3) ctx.addIssue({ code: 'custom', path: ['angles'], message: 'A circle fit needs at least 3 probed points' });
    if (c.layout === 'heights' && c.angles != null && c.angles < 3) ctx.addIssue({ code: 'custom', path: ['angles'], message: 'A plane fit needs at least 3 heights' });
  });
export type CharacteristicInput = z.input<typeof characteristicInputSchema>;

export const characteristicSchema = z.object({
  id: z.string(),
  seq: z.number().int(),
  code: z.string(),
  name: z.string(),
  kind: z.enum(CHARACTERISTIC_KINDS),
  unit: unitSchema.nullable(),
  nominal: z.number().nullable(),
  lsl: z.number().nullable(),
  usl: z.number().nullable(),
  method: z.string().nullable(),
  gaugeKind: gaugeKindSchema.nullable(),
  layout: z.enum(LAYOUTS),
  angles: z.number().nullable(),
  levels: z.number().nullable(),
  readingsPerSample: z.number().int(),
  derivedFormula: z.enum(DERIVED_FORMULAS).nullable(),
  inputs: z.array(z.string()).nullable(),
  chartKind: z.enum(CHART_KINDS),
  subgroupSize: z.number().nullable(),
  severity: z.enum(SEVERITY_CLASSES),
  wearDriven: z.boolean(),
  ruleSet: z.enum(RULE_SETS),
});
export type Characteristic = z.infer<typeof characteristicSchema>;

export const SAMPLING_KINDS = ['aql', 'zero-acceptance'] as const;

const samplingFields = {
  samplingKind: z.enum(SAMPLING_KINDS, { message: 'sampling must be aql or zero-acceptance' }),
  inspectionLevel: inspectionLevelSchema.nullable().optional(),
  aql: aqlSchema.nullable().optional(),
  zeroSampleSize: z.number().int().min(1, 'at least 1 core').max(2000).nullable().optional(),
};
function samplingComplete(v: { samplingKind?: string; inspectionLevel?: string | null; aql?: number | null; zeroSampleSize?: number | null }, ctx: z.RefinementCtx) {
  if (v.samplingKind === 'aql') {
    if (!v.inspectionLevel) ctx.addIssue({ code: 'custom', path: ['inspectionLevel'], message: 'Choose an inspection level' });
    if (v.aql == null) ctx.addIssue({ code: 'custom', path: ['aql'], message: 'Choose an AQL' });
  }
  if (v.samplingKind === 'zero-acceptance' && v.zeroSampleSize == null) ctx.addIssue({ code: 'custom', path: ['zeroSampleSize'], message: 'Give the fixed sample size' });
}

function uniqueCodes(list: { code: string }[] | undefined, ctx: z.RefinementCtx) {
  const seen = new Map<string, number>();
  (list ?? []).forEach((c, i) => {
    const code = c.code.trim().toUpperCase();
    if (seen.has(code)) ctx.addIssue({ code: 'custom', path: ['characteristics', i, 'code'], message: `Code ${code} is used twice in this plan` });
    seen.set(code, i);
  });
}

export const createPlanSchema = z
  .object({
    partId: z.uuid({ message: 'Choose a part' }),
    ...samplingFields,
    notes: z.string().trim().max(2000).nullable().optional(),
    characteristics: z.array(characteristicInputSchema).max(80, 'At most 80 characteristics').default([]),
  })
  .strict()
  .superRefine((v, ctx) => {
    samplingComplete(v, ctx);
    uniqueCodes(v.characteristics, ctx);
  });
export type CreatePlanInput = z.input<typeof createPlanSchema>;

export const updatePlanSchema = z
  .object({
    ...samplingFields,
    samplingKind: samplingFields.samplingKind.optional(),
    notes: z.string().trim().max(2000).nullable().optional(),
    characteristics: z.array(characteristicInputSchema).max(80).optional(),
    version: z.number({ message: 'version is required' }).int(),
  })
  .strict()
  .superRefine((v, ctx) => {
    if (v.samplingKind) samplingComplete(v, ctx);
    uniqueCodes(v.characteristics, ctx);
  });
export type UpdatePlanInput = z.input<typeof updatePlanSchema>;

export const planSchema = z.object({
  id: z.string(),
  partId: z.string(),
  partNumber: z.string(),
  partRevision: z.string(),
  revision: z.number().int(),
  status: planStatusSchema,
  samplingKind: z.enum(SAMPLING_KINDS),
  inspectionLevel: inspectionLevelSchema.nullable(),
  aql: z.number().nullable(),
  zeroSampleSize: z.number().nullable(),
  notes: z.string().nullable(),
  characteristics: z.array(characteristicSchema),
  basedOnPlanId: z.string().nullable(),
  createdAt: z.string(),
  activatedAt: z.string().nullable(),
  supersededAt: z.string().nullable(),
  version: z.number().int(),
});
export type Plan = z.infer<typeof planSchema>;
export type PlanSummary = Omit<Plan, 'characteristics'> & { characteristicCount: number };

export const planListQuerySchema = pageQuerySchema.extend({
  partId: z.uuid().optional(),
  status: planStatusSchema.optional(),
  sort: z.enum(['revision', '-revision', 'createdAt', '-createdAt']).optional(),
});

export const planActionSchema = z.object({ version: z.number({ message: 'version is required' }).int() }).strict();

export const fromTemplateSchema = z
  .object({
    partId: z.uuid({ message: 'Choose a part' }),
    template: z.enum([...CONSTRUCTIONS, 'vented'] as const, { message: 'unknown template' }),
  })
  .strict();

export const planTemplateSchema = z.object({
  id: z.string(),
  name: z.string(),
  description: z.string(),
  characteristics: z.array(characteristicInputSchema),
});

/** One line of the change view between two plan revisions. */
export const planChangeSchema = z.object({
  kind: z.enum(['added', 'removed', 'changed']),
  scope: z.enum(['sampling', 'characteristic']),
  code: z.string().nullable(),
  field: z.string().nullable(),
  before: z.unknown(),
  after: z.unknown(),
});
export type PlanChange = z.infer<typeof planChangeSchema>;
