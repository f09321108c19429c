import { ComputeError } from './errors';

/**
 * Calendar arithmetic for response times. A working day is Monday to Friday (common practice);
 * public and plant holidays are not modelled, so a due date can land on one: the engineer moves
 * it by hand when that matters. Dates are ISO calendar dates (YYYY-MM-DD), handled in UTC so
 * the answer never depends on the server's time zone.
 */
const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

function parse(date: string, field = 'date'): Date {
  const m = ISO_DATE.exec(date);
  if (!m) throw new ComputeError(`${date} is not a date like 2026-01-31`, field);
  const d = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])));
  if (d.toISOString().slice(0, 10) !== date) throw new ComputeError(`${date} is not a real calendar date`, field);
  return d;
}

const iso = (d: Date) => d.toISOString().slice(0, 10);

/** 0 = Sunday … 6 = Saturday (ISO 8601 calendar, proleptic Gregorian). */
export function weekday(date: string): number {
  return parse(date).getUTCDay();
}

export function isWorkingDay(date: string): boolean {
  const w = weekday(date);
  return w !== 0 && w !== 6;
}

/**
 * The date `n` working days after `date` (n ≥ 0). Counting starts the next day, so a request
 * issued on Friday with one working day for containment is due on Monday. With n = 0 the
 * answer is the date itself moved forward to a working day.
 */
export function addWorkingDays(date: string, n: number): string {
  if (!Number.isInteger(n) || n < 0) throw new ComputeError('The number of working days must be a whole number, 0 or more', 'days');
  const d = parse(date);
  if (n === 0) {
    while (d.getUTCDay() === 0 || d.getUTCDay() === 6) d.setUTCDate(d.getUTCDate() + 1);
    return iso(d);
  }
  let left = n;
  while (left > 0) {
    d.setUTCDate(d.getUTCDate() + 1);
    if (d.getUTCDay() !== 0 && d.getUTCDay() !== 6) left -= 1;
  }
  return iso(d);
}

/** The working day before `date` (the day a reminder goes out for something due on `date`). */
export function previousWorkingDay(date: string): string {
  const d = parse(date);
  do d.setUTCDate(d.getUTCDate() - 1);
  while (d.getUTCDay() === 0 || d.getUTCDay() === 6);
  return iso(d);
}

export function addCalendarDays(date: string, n: number): string {
  if (!Number.isInteger(n)) throw new ComputeError('The number of days must be a whole number', 'days');
  const d = parse(date);
  d.setUTCDate(d.getUTCDate() + n);
  return iso(d);
}

/** Today's date in UTC as YYYY-MM-DD. */
export function isoDateOf(at: Date): string {
  return iso(at);
}
