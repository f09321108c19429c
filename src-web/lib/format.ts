/**
 * Dates and times in one style on every page, in the words of the reader's own browser locale:
 * "26 Nov 2026" (or "Nov 26, 2026"), with the time where the moment matters.
 */
const DAY: Intl.DateTimeFormatOptions = { day: 'numeric', month: 'short', year: 'numeric' };
const CLOCK: Intl.DateTimeFormatOptions = { hour: '2-digit', minute: '2-digit' };

/** The day of a moment (an ISO timestamp), in the reader's time zone. */
export const formatDay = (iso: string) => new Date(iso).toLocaleDateString(undefined, DAY);

/** A moment: its day and time of day. `seconds` for records where the order within a minute matters. */
export const formatWhen = (iso: string, seconds = false) => new Date(iso).toLocaleString(undefined, { ...DAY, ...CLOCK, ...(seconds ? { second: '2-digit' } : {}) });

/** The time of day alone, for a moment shown under its day. */
export const formatClock = (iso: string, seconds = false) => new Date(iso).toLocaleTimeString(undefined, { ...CLOCK, ...(seconds ? { second: '2-digit' } : {}) });

/**
 * A calendar date (YYYY-MM-DD: a due date, a calibration date), the same day wherever the reader
 * is; `weekday` adds the day's name ("Thu 10 Dec 2026").
 */
export const formatCalendarDay = (ymd: string, weekday = false) =>
  new Date(`${ymd.slice(0, 10)}T12:00:00Z`).toLocaleDateString(undefined, { ...DAY, ...(weekday ? { weekday: 'short' } : {}), timeZone: 'UTC' });
