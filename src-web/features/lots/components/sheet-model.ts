/**
 * The bench sheet's arithmetic-free model: which cells a characteristic has, what was typed
 * into them, and whether a core's entry for it is complete. Judging stays in
 * shared/compute/evaluate.ts (the server's own code).
 */
// Relative, not @shared: the unit tests (root tsconfig, no path alias) import this file too.
import type { Characteristic } from '../../../../shared/schemas/master-data';
import type { Evaluation } from '../../../../shared/compute/evaluate';

/** What the inspector typed for one core × characteristic. */
export interface CellDraft {
  texts: string[];
  pass: boolean | null;
  note: string;
}

export type SheetChar = Pick<Characteristic, 'code' | 'name' | 'kind' | 'unit' | 'lsl' | 'usl' | 'nominal' | 'layout' | 'angles' | 'levels' | 'readingsPerSample' | 'gaugeKind' | 'derivedFormula' | 'severity' | 'method'>;

export const emptyDraft = (): CellDraft => ({ texts: [], pass: null, note: '' });

/** Text → number; a comma decimal is accepted (many gauges' displays and keyboards use one). */
export function parseReading(text: string): number | null | 'invalid' {
  const t = text.trim().replace(',', '.');
  if (t === '') return null;
  if (!/^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(t)) return 'invalid';
  const n = Number(t);
  return Number.isFinite(n) ? n : 'invalid';
}

/** How many number cells a core has for this characteristic (0 for pass/fail and derived). */
export function cellCount(c: SheetChar): number {
  if (c.kind !== 'variable') return 0;
  if (c.layout === 'two-point' || c.layout === 'heights') return c.angles ?? 1;
  if (c.layout === 'probed') return (c.angles ?? 1) * (c.levels ?? 1);
  return c.readingsPerSample;
}

/** The column heads under a characteristic, in reading order (what the gauge is set to). */
export function cellLabels(c: SheetChar): string[] {
  const n = cellCount(c);
  const at = (i: number, count: number) => `${Math.round(((i % count) * 360) / count)}°`;
  switch (c.layout) {
    case 'two-point':
      // Diameters through the centre: N angles spread over half a turn.
      return Array.from({ length: n }, (_, i) => `⌀ ${Math.round((i * 180) / n)}°`);
    case 'heights':
      return Array.from({ length: n }, (_, i) => `h ${at(i, n)}`);
    case 'probed': {
      const angles = c.angles ?? n;
      const levels = c.levels ?? 1;
      return Array.from({ length: n }, (_, i) => (levels > 1 ? `L${Math.floor(i / angles) + 1} ${at(i, angles)}` : `r ${at(i, angles)}`));
    }
    default:
      return n === 1 ? ['Value'] : Array.from({ length: n }, (_, i) => `#${i + 1}`);
  }
}

/** A value's verdict for each number cell, where a single reading can be judged on its own. */
export const judgedPerReading = (c: SheetChar) => c.kind === 'variable' && (c.layout === 'single' || c.layout === 'two-point');

/** Characteristics with several readings show what they reduce to (mean, fit, plane) after them. */
export const hasResultCell = (c: SheetChar) => c.kind === 'variable' && cellCount(c) > 1;

export function resultLabel(c: SheetChar): string {
  switch (c.layout) {
    case 'two-point':
      return c.derivedFormula === 'ovality' ? 'Ovality' : 'Mean ⌀';
    case 'probed':
      return c.derivedFormula === 'circle-fit-roundness' ? 'Roundness' : 'Fit ⌀';
    case 'heights':
      return c.derivedFormula === 'parallelism' ? 'Parallelism' : c.derivedFormula === 'squareness' ? 'Squareness' : 'Stack';
    default:
      return 'Mean';
  }
}

/** Needs a gauge picked before its readings can be sent (the server's rule for measured values). */
export const needsGauge = (c: SheetChar) => c.kind === 'variable' && !!c.gaugeKind;

export interface DraftState {
  /** Numbers parsed so far, by cell (null = empty, 'invalid' = not a number). */
  parsed: (number | null | 'invalid')[];
  /** Every cell holds a number (variable), or pass/fail chosen with a note on fail (attribute). */
  complete: boolean;
  /** Cells that hold text that is not a number. */
  invalid: number[];
  /** Some entry, complete or not. */
  touched: boolean;
  /** An attribute marked fail without the note it needs. */
  needsNote: boolean;
}

export function draftState(c: SheetChar, d: CellDraft | undefined): DraftState {
  const n = cellCount(c);
  if (c.kind === 'attribute') {
    const needsNote = d?.pass === false && !d.note.trim();
    return { parsed: [], complete: d?.pass != null && !needsNote, invalid: [], touched: d?.pass != null, needsNote };
  }
  if (c.kind === 'derived') return { parsed: [], complete: false, invalid: [], touched: false, needsNote: false };
  const parsed = Array.from({ length: n }, (_, i) => parseReading(d?.texts[i] ?? ''));
  const invalid = parsed.flatMap((p, i) => (p === 'invalid' ? [i] : []));
  return { parsed, complete: n > 0 && parsed.every((p) => typeof p === 'number'), invalid, touched: parsed.some((p) => p !== null), needsNote: false };
}

/** The numbers of a complete draft, for sending. */
export const draftValues = (s: DraftState): number[] => (s.complete ? (s.parsed as number[]) : []);

/**
 * The numbers typed so far up to the first empty cell. evaluateSample judges a partly entered
 * characteristic from such a run (flagging a reading that is out already) and a complete one fully.
 */
export function leadingValues(s: DraftState): number[] {
  const out: number[] = [];
  for (const p of s.parsed) {
    if (typeof p !== 'number') break;
    out.push(p);
  }
  return out;
}

/**
 * A stable fingerprint of what would be sent, to skip resending what the server already has.
 * The gauge is left out on purpose: choosing another gauge later must not re-send readings
 * already taken with the first one.
 */
export const signature = (values: number[], pass: boolean | null, note: string | null) => JSON.stringify([values, pass, note ?? null]);

/** Decimals to show a computed figure with: one more than the limits carry (at most 6). */
export function decimalsFor(c: Pick<SheetChar, 'lsl' | 'usl' | 'nominal'>): number {
  const places = (v: number | null) => (v == null ? 0 : (String(v).split('.')[1] ?? '').length);
  return Math.min(6, Math.max(places(c.lsl), places(c.usl), places(c.nominal)) + 1);
}

/**
 * A stored number as it would have been typed: with at least the decimals the limits carry,
 * so 150.200 comes back as 150.20 rather than 150.2 (the number itself is what was stored).
 */
export function asEntered(v: number, c: Pick<SheetChar, 'lsl' | 'usl' | 'nominal'>): string {
  const text = String(v);
  const have = (text.split('.')[1] ?? '').length;
  const want = decimalsFor(c) - 1;
  return have >= want || /e/i.test(text) ? text : v.toFixed(want);
}

export const formatValue = (v: number | null | undefined, c: Pick<SheetChar, 'lsl' | 'usl' | 'nominal'>) => (v == null || !Number.isFinite(v) ? '' : v.toFixed(decimalsFor(c)));

/** "149.95 – 150.05 mm", "≤ 25 µm", "≥ 0.95" */
export function limitsText(c: { lsl: number | null; usl: number | null; unit: string | null }): string {
  const u = c.unit && c.unit !== 'count' ? ` ${c.unit}` : '';
  if (c.lsl != null && c.usl != null) return `${c.lsl} – ${c.usl}${u}`;
  if (c.usl != null) return `≤ ${c.usl}${u}`;
  if (c.lsl != null) return `≥ ${c.lsl}${u}`;
  return '';
}

export type Verdict = 'in' | 'out' | null;
export const verdictOf = (conforming: boolean | null | undefined): Verdict => (conforming == null ? null : conforming ? 'in' : 'out');

/** A core's standing over the characteristics shown: how many are left, and whether any is out. */
export function coreStanding(chars: SheetChar[], ev: Record<string, Evaluation>): { left: number; out: number } {
  let left = 0;
  let out = 0;
  for (const c of chars) {
    const e = ev[c.code];
    if (!e || e.conforming === null) left++;
    if (e?.conforming === false) out++;
  }
  return { left, out };
}

type ReadingLike = { sampleId: string; characteristicCode: string; values: number[]; pass: boolean | null; note: string | null };

/**
 * What the sheet opens with: the server's readings, then the unsent ones from this browser
 * (newer), then entries typed but not complete yet (newest). Derived values are never drafts.
 */
export function initialDrafts(
  chars: Pick<SheetChar, 'code' | 'kind' | 'lsl' | 'usl' | 'nominal'>[],
  saved: ReadingLike[],
  unsent: ReadingLike[],
  typed: Record<string, CellDraft>,
): Record<string, Record<string, CellDraft>> {
  const entered = new Map(chars.filter((c) => c.kind !== 'derived').map((c) => [c.code, c]));
  const out: Record<string, Record<string, CellDraft>> = {};
  const put = (sampleId: string, code: string, d: CellDraft) => {
    if (!entered.has(code)) return;
    out[sampleId] = { ...(out[sampleId] ?? {}), [code]: d };
  };
  const fromReading = (r: ReadingLike): CellDraft => {
    const c = entered.get(r.characteristicCode);
    return { texts: r.values.map((v) => (c ? asEntered(v, c) : String(v))), pass: r.pass, note: r.note ?? '' };
  };
  for (const r of saved) put(r.sampleId, r.characteristicCode, fromReading(r));
  for (const r of unsent) put(r.sampleId, r.characteristicCode, fromReading(r));
  for (const [key, d] of Object.entries(typed)) {
    const [sampleId, code] = key.split('|');
    if (sampleId && code && d && Array.isArray(d.texts)) put(sampleId, code, { texts: d.texts.map(String), pass: d.pass ?? null, note: d.note ?? '' });
  }
  return out;
}

/** The fingerprint of what a core's characteristic holds, for reading rows as they are stored. */
export const readingSignature = (r: ReadingLike) => signature(r.values, r.pass, r.pass === false ? r.note : null);

/** The fingerprint of a draft, comparable with readingSignature when complete. */
export function draftSignature(c: SheetChar, d: CellDraft): string {
  const st = draftState(c, d);
  if (!st.complete) return `incomplete:${JSON.stringify([d.texts, d.pass, d.note])}`;
  const pass = c.kind === 'attribute' ? d.pass : null;
  return signature(draftValues(st), pass, pass === false ? d.note.trim() : null);
}
