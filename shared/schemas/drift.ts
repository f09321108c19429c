import { z } from 'zod';
import { RULE_DESCRIPTIONS, type RuleId } from '../compute/spc/rules';
import { spcChartSchema, spcRuleSetSchema } from './spc';

/**
 * Drift watch: requests and responses of /api/spc (watch, charts, limits, signals, analyze).
 * Rule ids are stable identifiers; RULE_ID_DOC lists them for the OpenAPI description.
 */

export const RULE_IDS = Object.keys(RULE_DESCRIPTIONS) as RuleId[];
export const ruleIdSchema = z.enum(RULE_IDS as [RuleId, ...RuleId[]]);

export const RULE_ID_DOC =
  'Rule ids (stable): ' +
  RULE_IDS.map((r) => `${r} = ${RULE_DESCRIPTIONS[r]}`).join('; ') +
  '. Western Electric set: we1–we4 + trend6; Nelson set: nelson1–nelson8. A signal on the R, s or moving-range chart carries chart "dispersion" and rule we1/nelson1 (a point beyond that chart\u2019s limits).';

const uuid = (what: string) => z.uuid({ message: `${what} must be an id` });
const code = z.string({ message: 'Give the characteristic code' }).trim().toUpperCase().min(1, 'Give the characteristic code').max(24);
const isoDate = (what: string) => z.iso.date({ message: `${what} must be a date like 2026-01-31` });

export const WATCH_STATUSES = ['in-control', 'signal', 'die-service-due', 'insufficient-data'] as const;
export type WatchStatus = (typeof WATCH_STATUSES)[number];
export const WATCH_STATUS_LABELS: Record<WatchStatus, string> = {
  'in-control': 'In control',
  signal: 'Signal',
  'die-service-due': 'Die service due',
  'insufficient-data': 'Too few lots',
};

export const SIGNAL_STATUSES = ['open', 'acknowledged', 'ncr-opened'] as const;
export type SignalStatus = (typeof SIGNAL_STATUSES)[number];

// ───────── GET /api/spc/watch ─────────
export const watchQuerySchema = z
  .object({ supplierId: uuid('supplierId').optional(), partId: uuid('partId').optional() })
  .strict();

export const watchRowSchema = z.object({
  supplierId: z.string(),
  supplierCode: z.string(),
  supplierName: z.string(),
  partId: z.string(),
  partNumber: z.string(),
  partRevision: z.string(),
  characteristicCode: z.string(),
  characteristicName: z.string(),
  unit: z.string().nullable(),
  chart: spcChartSchema,
  wearDriven: z.boolean(),
  status: z.enum(WATCH_STATUSES),
  openSignals: z.number().int(),
  lots: z.number().int(),
  lastLotAt: z.string().nullable(),
  limitVersion: z.number().int().nullable(),
  /** Fitted line reaches the upper limit after about this many more lots (wear-driven only). */
  lotsToLimit: z.number().nullable().optional(),
  /** Conservative count (upper prediction bound), which decides "die service due". */
  lotsToLimitLower: z.number().nullable().optional(),
  serviceLots: z.number().int().optional(),
});
export type WatchRow = z.infer<typeof watchRowSchema>;

// ───────── GET /api/spc/charts ─────────
export const chartQuerySchema = z
  .object({
    partId: uuid('partId'),
    characteristicCode: code,
    supplierId: uuid('supplierId'),
    from: isoDate('from').optional(),
    to: isoDate('to').optional(),
  })
  .strict()
  .refine((q) => !q.from || !q.to || q.from <= q.to, { message: 'The end of the range is before its start', path: ['to'] });
export type ChartQuery = z.infer<typeof chartQuerySchema>;

const limitsSchema = z.object({
  center: z.number(),
  ucl: z.number(),
  lcl: z.number(),
  sigma: z.number(),
  dispersionCenter: z.number().nullable(),
  dispersionUcl: z.number().nullable(),
  dispersionLcl: z.number().nullable(),
});

export const pointFlagSchema = z.object({
  rule: ruleIdSchema,
  chart: z.enum(['location', 'dispersion']),
  message: z.string(),
  description: z.string(),
  /** The stored drift signal for this rule and lot, if one was raised when the lot was decided. */
  signalId: z.string().nullable(),
});

/** One plotted subgroup; fields that do not apply are left out (5 000 points stay small). */
export const chartPointSchema = z.object({
  /** Position in the whole history (the range filter keeps it). */
  index: z.number().int(),
  lotId: z.string(),
  lotRef: z.number().int(),
  /** 1-based lot sequence (the forecast's x). */
  lotSeq: z.number().int(),
  receivedAt: z.string(),
  /** The core (per-core subgroups and individuals). */
  serial: z.number().int().optional(),
  /** Which group of a core's readings, when a core gives several subgroups. */
  chunk: z.number().int().optional(),
  value: z.number(),
  /** Range, s or moving range. */
  dispersion: z.number().optional(),
  /** Index into `segments`: the limits that judged this point. */
  segment: z.number().int(),
  /** p charts: this lot's limits (they vary with its sample size). */
  ucl: z.number().optional(),
  lcl: z.number().optional(),
  defectives: z.number().int().optional(),
  size: z.number().int().optional(),
  flags: z.array(pointFlagSchema).optional(),
});
export const segmentSchema = z.object({
  from: z.number().int(),
  to: z.number().int(),
  /** null = trial limits (before any freeze). */
  limitVersion: z.number().int().nullable(),
  center: z.number().nullable(),
  sigmaWithin: z.number().nullable(),
  limits: limitsSchema.nullable(),
});
export type ChartPoint = z.infer<typeof chartPointSchema>;

export const controlLimitSchema = z.object({
  id: z.string(),
  version: z.number().int(),
  active: z.boolean(),
  chart: spcChartSchema,
  subgroupSize: z.number().int().nullable(),
  ruleSet: spcRuleSetSchema,
  center: z.number(),
  ucl: z.number().nullable(),
  lcl: z.number().nullable(),
  sigma: z.number(),
  rangeCenter: z.number().nullable(),
  rangeUcl: z.number().nullable(),
  rangeLcl: z.number().nullable(),
  baseline: z.object({ kind: z.enum(['first', 'dates']), count: z.number().int().optional(), from: z.string().optional(), to: z.string().optional(), description: z.string() }),
  baselineSubgroups: z.number().int(),
  excluded: z.array(z.number().int()),
  excludedPoints: z.array(z.object({ lotId: z.string(), lotRef: z.number().int(), serial: z.number().int().nullable() })),
  iterations: z.number().int(),
  serviceLots: z.number().int(),
  reason: z.string(),
  frozenBy: z.string().nullable(),
  frozenByEmail: z.string().nullable(),
  frozenAt: z.string(),
});
export type ControlLimit = z.infer<typeof controlLimitSchema>;

export const driftSignalSchema = z.object({
  id: z.string(),
  supplierId: z.string(),
  partId: z.string(),
  characteristicCode: z.string(),
  rule: ruleIdSchema,
  chart: z.enum(['location', 'dispersion']),
  lotId: z.string(),
  lotRef: z.number().int(),
  sampleId: z.string().nullable(),
  serial: z.number().int().nullable(),
  value: z.number(),
  center: z.number().nullable(),
  ucl: z.number().nullable(),
  lcl: z.number().nullable(),
  /** The frozen limit version that judged the point; null = trial limits (before any freeze). */
  limitVersion: z.number().int().nullable(),
  message: z.string(),
  description: z.string(),
  status: z.enum(SIGNAL_STATUSES),
  ackNote: z.string().nullable(),
  ackBy: z.string().nullable(),
  ackAt: z.string().nullable(),
  /** The nonconformance the signal was taken into (status 'ncr-opened'). */
  ncrId: z.string().nullable(),
  ncrNumber: z.string().nullable(),
  createdAt: z.string(),
});
export type DriftSignal = z.infer<typeof driftSignalSchema>;

export const capabilitySchema = z.object({
  cp: z.number().nullable(),
  cpk: z.number(),
  pp: z.number().nullable(),
  ppk: z.number(),
  mean: z.number(),
  sigmaWithin: z.number(),
  sigmaOverall: z.number(),
  n: z.number().int(),
  subgroups: z.number().int(),
});

export const forecastSchema = z.object({
  slope: z.number(),
  intercept: z.number(),
  r2: z.number(),
  n: z.number().int(),
  residualSd: z.number(),
  usl: z.number(),
  confidence: z.number(),
  /** Lots after the last one until the fitted line reaches the upper limit (null: no upward trend). */
  lotsToLimit: z.number().nullable(),
  /** The same from the one-sided upper prediction bound: the conservative count. */
  lotsToLimitLower: z.number().nullable(),
  lotsUsed: z.number().int(),
  firstLotSeq: z.number().int(),
  lastLotSeq: z.number().int(),
  serviceLots: z.number().int(),
  serviceDue: z.boolean(),
});
export type Forecast = z.infer<typeof forecastSchema>;

export const chartResponseSchema = z.object({
  supplier: z.object({ id: z.string(), code: z.string(), name: z.string() }),
  part: z.object({ id: z.string(), partNumber: z.string(), revision: z.string() }),
  characteristic: z.object({
    code: z.string(),
    name: z.string(),
    kind: z.enum(['variable', 'attribute', 'derived']),
    unit: z.string().nullable(),
    lsl: z.number().nullable(),
    usl: z.number().nullable(),
    chartKind: z.string(),
    subgroupSize: z.number().nullable(),
    readingsPerSample: z.number().int(),
    ruleSet: spcRuleSetSchema,
    wearDriven: z.boolean(),
    planRevision: z.number().int(),
  }),
  chart: spcChartSchema,
  subgrouping: z.object({ mode: z.enum(['core-readings', 'lot-cores', 'individual', 'lot-fraction']), n: z.number().int().nullable(), explanation: z.string() }),
  /** Subgroups in the requested date range (all subgroups are judged; the range only filters). */
  points: z.array(chartPointSchema),
  totalPoints: z.number().int(),
  /** Runs of points judged against the same limits, over the whole history. */
  segments: z.array(segmentSchema),
  skipped: z.array(z.object({ lotId: z.string(), lotRef: z.number().int(), reason: z.string() })),
  /** The active frozen version, or null while the chart is on trial limits. */
  limits: controlLimitSchema.nullable(),
  versions: z.array(controlLimitSchema),
  trial: z.object({ center: z.number(), sigma: z.number(), count: z.number().int() }).nullable(),
  trialNote: z.string().nullable(),
  signals: z.array(driftSignalSchema),
  capability: capabilitySchema.nullable(),
  capabilityWarnings: z.array(z.string()),
  histogram: z.array(z.object({ from: z.number(), to: z.number(), count: z.number().int() })),
  forecast: forecastSchema.nullable(),
  forecastNote: z.string().nullable(),
});
export type ChartResponse = z.infer<typeof chartResponseSchema>;

// ───────── POST /api/spc/limits ─────────
export const baselineSchema = z.discriminatedUnion(
  'kind',
  [
    z.object({ kind: z.literal('first'), count: z.number({ message: 'Give how many subgroups' }).int('a whole number of subgroups').min(2, 'at least 2 subgroups').max(100_000) }).strict(),
    z.object({ kind: z.literal('dates'), from: isoDate('from'), to: isoDate('to') }).strict(),
  ],
  { message: 'baseline is { kind: "first", count } or { kind: "dates", from, to }' },
);
export type Baseline = z.infer<typeof baselineSchema>;

export const freezeLimitsSchema = z
  .object({
    supplierId: uuid('supplierId'),
    partId: uuid('partId'),
    characteristicCode: code,
    baseline: baselineSchema,
    reason: z.string({ message: 'Give the reason for freezing these limits' }).trim().min(1, 'Give the reason for freezing these limits').max(1000),
    /** Lots of warning wanted before the burr limit; defaults to 5 (or the previous version's). */
    serviceLots: z.number({ message: 'serviceLots must be a number' }).int('a whole number of lots').min(1, 'at least 1 lot').max(100, 'at most 100 lots').optional(),
  })
  .strict()
  .superRefine((v, ctx) => {
    if (v.baseline.kind === 'dates' && v.baseline.from > v.baseline.to) ctx.addIssue({ code: 'custom', path: ['baseline', 'to'], message: 'The end of the baseline is before its start' });
  });
export type FreezeLimitsInput = z.infer<typeof freezeLimitsSchema>;

// ───────── POST /api/spc/signals/:id/ack ─────────
export const ackSignalSchema = z
  .object({ note: z.string({ message: 'Say what was found or done' }).trim().min(1, 'Say what was found or done').max(2000) })
  .strict();
export type AckSignalInput = z.infer<typeof ackSignalSchema>;

// ───────── POST /api/spc/analyze ─────────
export const analyzeResultSchema = z.object({
  chart: spcChartSchema,
  phase: z.enum(['I', 'II']),
  center: z.number(),
  ucl: z.union([z.number(), z.array(z.number())]),
  lcl: z.union([z.number(), z.array(z.number())]),
  dispersion: z.enum(['range', 's', 'moving-range']).optional(),
  rangeCenter: z.number().optional(),
  rangeUcl: z.number().optional(),
  rangeLcl: z.number().optional(),
  dispersionPoints: z.array(z.number()).optional(),
  sigmaWithin: z.number(),
  sigma: z.union([z.number(), z.array(z.number())]),
  points: z.array(z.number()),
  signals: z.array(z.object({ rule: ruleIdSchema, index: z.number().int(), chart: z.enum(['location', 'dispersion']), message: z.string() })),
  capability: z.object({ cp: z.number().optional(), cpk: z.number(), pp: z.number().optional(), ppk: z.number(), mean: z.number(), sigmaWithin: z.number(), sigmaOverall: z.number(), n: z.number() }).optional(),
});
export type AnalyzeResult = z.infer<typeof analyzeResultSchema>;
