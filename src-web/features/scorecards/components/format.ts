/** Number formats of the scorecards (the plant's currency is implied, as on its cost reports). */
export const formatPpm = (v: number | null): string => (v == null ? '—' : Math.round(v).toLocaleString('en-GB'));
export const formatCount = (v: number): string => v.toLocaleString('en-GB');
export const formatCost = (v: number): string => v.toLocaleString('en-GB', { minimumFractionDigits: 2, maximumFractionDigits: 2 });
