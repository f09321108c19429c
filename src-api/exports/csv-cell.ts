/**
 * Characters that make a spreadsheet read a cell as a formula (or, for tab and carriage return,
 * let one slip past a naive check). Common practice for CSV injection: OWASP's CSV Injection
 * page lists exactly these (memory).
 */
const FORMULA_START = /^[=+\-@\t\r]/;

/**
 * Neutralises spreadsheet formula injection: text that starts with =, +, -, @, a tab or a carriage
 * return gets a leading single quote, so "=HYPERLINK(…)" arrives as the text "'=HYPERLINK(…)".
 * Only text goes through here: numbers are written as numbers (a negative reading stays -0.02).
 */
export function neutraliseFormula(text: string): string {
  return FORMULA_START.test(text) ? `'${text}` : text;
}

/** One value as CSV text: empty for nothing, ISO for instants, JSON for structures, neutralised text. */
export function csvText(v: unknown): string | number {
  if (v === null || v === undefined) return '';
  if (typeof v === 'number') return Number.isFinite(v) ? v : '';
  if (typeof v === 'boolean') return v ? 'true' : 'false';
  if (v instanceof Date) return v.toISOString();
  if (Array.isArray(v) && v.every((x) => typeof x === 'number' || typeof x === 'string')) return neutraliseFormula(v.join('; '));
  if (typeof v === 'object') return neutraliseFormula(JSON.stringify(v));
  return neutraliseFormula(String(v));
}
