import { z } from 'zod';
import { MAX_SCORECARD_YEARS, SCORECARD_PERIODS, type ScorecardPeriod } from '../compute/scorecard';
import { SEVERITIES } from '../compute/sampling';
import { uuidSchema } from './common';

export { MAX_SCORECARD_YEARS, SCORECARD_PERIODS };
export type { ScorecardPeriod };

export const SCORECARD_PERIOD_LABELS: Record<ScorecardPeriod, string> = { month: 'By month', quarter: 'By quarter' };

const isoDate = (name: string) => z.iso.date({ message: `${name} must be a date like 2026-01-31` });

/** GET /api/scorecards and /api/scorecards/:supplierId. Range checks need today, so the service applies them. */
export const scorecardQuerySchema = z
  .object({
    from: isoDate('from').optional(),
    to: isoDate('to').optional(),
    period: z.enum(SCORECARD_PERIODS, { message: 'period must be month or quarter' }).default('month'),
  })
  .strict();
export type ScorecardQuery = z.infer<typeof scorecardQuerySchema>;

export const scorecardParamSchema = z.object({ supplierId: uuidSchema });

/** What the figures mean, stated once: the OpenAPI description and the page's footnote say the same. */
export const SCORECARD_DEFINITIONS = [
  'Lots count the supplier’s lots received in the range (by received date, UTC); accepted and rejected are those lots’ decisions as they stand now; undecided lots are still on the Dock.',
  'Rejected quantity is the whole quantity of every lot rejected at receiving inspection, whatever its later disposition (sorted, reworked, used as is, returned or scrapped). Received quantity is the quantity of every lot received.',
  'PPM = rejected quantity ÷ received quantity × 10⁶; none when nothing was received.',
  'Corrective actions count those issued in the range: closed on time = closed on or before the last step’s due date; overdue = not closed and a step still owed is past its due date today.',
  'Cost of poor quality = the sum of the signed disposition costs of the NCRs raised on the supplier’s lots received in the range.',
  'Switching state is the current ISO 2859-1 inspection severity per part (not limited to the range).',
  `Ranking: lower PPM first, then fewer lots rejected; suppliers with no lots in the range are not ranked. Ranges are at most ${MAX_SCORECARD_YEARS} years.`,
] as const;

export const periodBucketSchema = z.object({ key: z.string(), label: z.string(), start: z.string(), end: z.string() });

export const scorecardTrendPointSchema = z.object({
  period: z.string(),
  lotsReceived: z.number().int(),
  lotsRejected: z.number().int(),
  quantityReceived: z.number(),
  quantityRejected: z.number(),
  ppm: z.number().nullable(),
});
export type ScorecardTrendPoint = z.infer<typeof scorecardTrendPointSchema>;

export const scorecardSwitchingSchema = z.object({
  partId: z.string(),
  partNumber: z.string(),
  partRevision: z.string(),
  severity: z.enum(SEVERITIES),
  discontinued: z.boolean(),
  reducedEligible: z.boolean(),
  consecutiveAccepted: z.number().int(),
  updatedAt: z.string(),
});
export type ScorecardSwitching = z.infer<typeof scorecardSwitchingSchema>;

export const supplierScorecardSchema = z.object({
  supplierId: z.string(),
  supplierCode: z.string(),
  supplierName: z.string(),
  approvalStatus: z.enum(['approved', 'conditional', 'disapproved']),
  /** 1 = best; null when the supplier delivered nothing in the range, and for supplier users (they see no one else). */
  rank: z.number().int().nullable(),
  lots: z.object({ received: z.number().int(), accepted: z.number().int(), rejected: z.number().int(), undecided: z.number().int() }),
  quantity: z.object({ received: z.number(), rejected: z.number() }),
  ppm: z.number().nullable(),
  scars: z.object({ issued: z.number().int(), closedOnTime: z.number().int(), closedLate: z.number().int(), open: z.number().int(), overdue: z.number().int() }),
  costOfPoorQuality: z.number(),
  switching: z.array(scorecardSwitchingSchema),
  trend: z.array(scorecardTrendPointSchema),
});
export type SupplierScorecard = z.infer<typeof supplierScorecardSchema>;

const rangeFields = {
  from: z.string(),
  to: z.string(),
  period: z.enum(SCORECARD_PERIODS),
  periods: z.array(periodBucketSchema),
  /** How many suppliers the ranking compares (0 for a supplier user). */
  rankedOf: z.number().int(),
};

export const scorecardListSchema = z.object({ ...rangeFields, items: z.array(supplierScorecardSchema) });
export type ScorecardList = z.infer<typeof scorecardListSchema>;

export const scorecardOneSchema = z.object({ ...rangeFields, item: supplierScorecardSchema });
export type ScorecardOne = z.infer<typeof scorecardOneSchema>;
