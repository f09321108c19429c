import { ComputeError } from './errors';

/**
 * Supplier scorecard arithmetic: the reporting range and its periods, PPM, and the ranking.
 * Dates are ISO calendar dates (YYYY-MM-DD) in UTC, like the rest of the product, so a lot
 * received late on the last day of a month counts in that month wherever the server runs.
 */

export const SCORECARD_PERIODS = ['month', 'quarter'] as const;
export type ScorecardPeriod = (typeof SCORECARD_PERIODS)[number];

/** The longest range one request may cover (the page reads it in one go). */
export const MAX_SCORECARD_YEARS = 3;
/** With no `from`: this many periods up to and including the current one. */
export const DEFAULT_PERIODS: Record<ScorecardPeriod, number> = { month: 6, quarter: 4 };

export interface PeriodBucket {
  /** `2026-01` for a month, `2026-Q1` for a quarter (what the API groups by). */
  key: string;
  label: string;
  /** The part of the period inside the range: first and last day (inclusive). */
  start: string;
  end: string;
}

export interface ScorecardRange {
  from: string;
  to: string;
  period: ScorecardPeriod;
  periods: PeriodBucket[];
}

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;
const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

function parse(date: string, field: string): Date {
  const m = ISO_DATE.exec(date);
  if (!m) throw new ComputeError(`${date} is not a date like 2026-01-31`, field);
  const d = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])));
  if (d.toISOString().slice(0, 10) !== date) throw new ComputeError(`${date} is not a real calendar date`, field);
  return d;
}

const iso = (d: Date) => d.toISOString().slice(0, 10);
const monthsPer = (p: ScorecardPeriod) => (p === 'month' ? 1 : 3);

/** First day of the month or quarter that holds `d`. */
function periodStart(d: Date, p: ScorecardPeriod): Date {
  const m = d.getUTCMonth();
  return new Date(Date.UTC(d.getUTCFullYear(), p === 'month' ? m : m - (m % 3), 1));
}

function addMonths(d: Date, n: number): Date {
  return new Date(Date.UTC(d.getUTCFullYear(), d.getUTCMonth() + n, 1));
}

/** The same calendar date `years` later; 29 February becomes 28 February in a common year. */
export function addYears(date: string, years: number): string {
  const d = parse(date, 'date');
  const y = d.getUTCFullYear() + years;
  const m = d.getUTCMonth();
  const last = new Date(Date.UTC(y, m + 1, 0)).getUTCDate();
  return iso(new Date(Date.UTC(y, m, Math.min(d.getUTCDate(), last))));
}

export function periodKeyOf(date: string, p: ScorecardPeriod): string {
  const d = parse(date, 'date');
  const y = d.getUTCFullYear();
  return p === 'month' ? `${y}-${String(d.getUTCMonth() + 1).padStart(2, '0')}` : `${y}-Q${Math.floor(d.getUTCMonth() / 3) + 1}`;
}

function labelOf(start: Date, p: ScorecardPeriod): string {
  const y = start.getUTCFullYear();
  return p === 'month' ? `${MONTHS[start.getUTCMonth()]} ${y}` : `Q${Math.floor(start.getUTCMonth() / 3) + 1} ${y}`;
}

/**
 * The range a scorecard covers and its periods. Without `to`: today. Without `from`: the start
 * of the period DEFAULT_PERIODS[p] − 1 periods before today's (6 months, or 4 quarters,
 * counting the current one). Refuses an inverted range and one longer than MAX_SCORECARD_YEARS.
 */
export function scorecardRange(q: { from?: string; to?: string; period?: ScorecardPeriod }, today: string): ScorecardRange {
  const period = q.period ?? 'month';
  const to = q.to ?? today;
  const toDate = parse(to, 'to');
  const from = q.from ?? iso(addMonths(periodStart(parse(today, 'today'), period), -(DEFAULT_PERIODS[period] - 1) * monthsPer(period)));
  const fromDate = parse(from, 'from');
  if (fromDate > toDate) throw new ComputeError(`The range is inverted: to (${to}) is before from (${from})`, 'to');
  const latest = addYears(from, MAX_SCORECARD_YEARS);
  if (to > latest) throw new ComputeError(`The range is at most ${MAX_SCORECARD_YEARS} years: from ${from}, to may be ${latest} at the latest`, 'to');
  const periods: PeriodBucket[] = [];
  for (let s = periodStart(fromDate, period); s <= toDate; s = addMonths(s, monthsPer(period))) {
    const next = addMonths(s, monthsPer(period));
    const last = new Date(next.getTime() - 86_400_000);
    periods.push({
      key: periodKeyOf(iso(s), period),
      label: labelOf(s, period),
      start: iso(s < fromDate ? fromDate : s),
      end: iso(last > toDate ? toDate : last),
    });
  }
  return { from, to, period, periods };
}

/**
 * Parts per million rejected: rejected quantity ÷ received quantity × 10⁶ (common practice).
 * Null when nothing was received: "no deliveries" is not "perfect deliveries".
 */
export function ppm(rejectedQuantity: number, receivedQuantity: number): number | null {
  if (!Number.isFinite(rejectedQuantity) || !Number.isFinite(receivedQuantity) || rejectedQuantity < 0 || receivedQuantity < 0) {
    throw new ComputeError('Quantities must be finite and not negative', 'quantity');
  }
  if (rejectedQuantity > receivedQuantity) throw new ComputeError('The rejected quantity cannot exceed the quantity received', 'quantity');
  return receivedQuantity === 0 ? null : (rejectedQuantity / receivedQuantity) * 1e6;
}

export interface RankInput {
  id: string;
  ppm: number | null;
  lotsRejected: number;
}

/**
 * Rank suppliers best first: lower PPM, then fewer lots rejected. Equal on both → the same rank
 * and the next rank skips ("1, 2, 2, 4", standard competition ranking). A supplier that
 * delivered nothing (PPM null) is not ranked.
 */
export function rankSuppliers(rows: readonly RankInput[]): Map<string, number | null> {
  const ranked = rows.filter((r) => r.ppm != null).sort((a, b) => a.ppm! - b.ppm! || a.lotsRejected - b.lotsRejected);
  const out = new Map<string, number | null>(rows.map((r) => [r.id, null]));
  ranked.forEach((r, i) => {
    const prev = ranked[i - 1];
    out.set(r.id, prev && prev.ppm === r.ppm && prev.lotsRejected === r.lotsRejected ? out.get(prev.id)! : i + 1);
  });
  return out;
}
