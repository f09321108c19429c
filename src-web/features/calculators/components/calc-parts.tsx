import { Body1, Button, Caption1, Field, Radio, RadioGroup, Subtitle1, Textarea, makeStyles, tokens } from '@fluentui/react-components';
import { useMemo, useState, type ReactNode } from 'react';
import { get, useController, useFormContext } from 'react-hook-form';
import { pointsFromAngles, type Point } from '@shared/compute/geometry';
import { StatusPill } from '../../../components/status-pill';

export const useCalcStyles = makeStyles({
  card: {
    border: `1px solid ${tokens.colorNeutralStroke2}`,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground1,
    padding: '16px 18px 18px',
    display: 'flex',
    flexDirection: 'column',
    gap: '14px',
    minWidth: 0,
  },
  h2: { display: 'block', margin: 0 },
  formula: {
    borderLeft: `4px solid ${tokens.colorBrandStroke1}`,
    backgroundColor: tokens.colorNeutralBackground3,
    borderRadius: tokens.borderRadiusMedium,
    padding: '8px 12px',
    display: 'flex',
    flexDirection: 'column',
    gap: '2px',
  },
  formulaText: { fontFamily: tokens.fontFamilyNumeric, fontSize: tokens.fontSizeBase400, fontWeight: 600, overflowWrap: 'anywhere' },
  source: { color: tokens.colorNeutralForeground3 },
  form: { display: 'flex', flexDirection: 'column', gap: '12px' },
  fields: { display: 'grid', gridTemplateColumns: 'repeat(auto-fill, minmax(200px, 1fr))', gap: '12px 16px', alignItems: 'start' },
  twoCols: { display: 'grid', gridTemplateColumns: 'repeat(auto-fit, minmax(240px, 1fr))', gap: '12px 16px', alignItems: 'start' },
  touch: { minHeight: '44px' },
  mono: { fontFamily: tokens.fontFamilyMonospace },
  result: {
    borderRadius: tokens.borderRadiusLarge,
    border: `1px solid ${tokens.colorNeutralStroke2}`,
    padding: '10px 14px',
    display: 'flex',
    flexDirection: 'column',
    gap: '6px',
    minHeight: '52px',
  },
  resultHead: { fontSize: tokens.fontSizeBase200, fontWeight: 700, textTransform: 'uppercase', letterSpacing: '0.05em', color: tokens.colorNeutralForeground3 },
  dl: { display: 'grid', gridTemplateColumns: 'max-content minmax(0, 1fr)', gap: '4px 16px', margin: 0, alignItems: 'baseline' },
  dt: { color: tokens.colorNeutralForeground2 },
  dd: { margin: 0, fontVariantNumeric: 'tabular-nums', fontWeight: 600, overflowWrap: 'anywhere' },
  big: { fontSize: tokens.fontSizeBase500, fontWeight: 700 },
  muted: { color: tokens.colorNeutralForeground3 },
  error: { color: tokens.colorPaletteRedForeground1 },
  warn: { color: tokens.colorPaletteMarigoldForeground2 },
  actions: { display: 'flex', gap: '10px', alignItems: 'center', flexWrap: 'wrap' },
  problems: { margin: '2px 0 0', paddingLeft: '18px', color: tokens.colorPaletteRedForeground1, fontSize: tokens.fontSizeBase200 },
  server: { display: 'flex', flexDirection: 'column', gap: '4px' },
  serverRow: { display: 'flex', gap: '8px', alignItems: 'center', flexWrap: 'wrap', fontVariantNumeric: 'tabular-nums' },
  sub: { display: 'block', fontSize: tokens.fontSizeBase300, fontWeight: 700, margin: '4px 0 0' },
});

// ── Numbers as they are typed on a shop floor ─────────────────────────────────────────────

/** "−5", "-5", "12,5" (decimal comma), "1e-3" → a finite number; anything else → null. */
export function readNumber(token: string): number | null {
  const t = token.trim().replace(/^[−–]/, '-').replace(',', '.');
  if (!/^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(t)) return null;
  const v = Number(t);
  return Number.isFinite(v) ? v : null;
}

/** One line as an x, y pair: "10, -5", "10;-5", "10 -5", "(10,5 -5,2)", "10.5,-5.2". */
export function readPair(line: string): Point | null {
  const clean = line.replace(/[()[\]{}]/g, ' ').trim();
  let parts = clean.split(/\s*[;\t]\s*|\s*,\s+|\s+/).filter(Boolean);
  // "10,-5": one comma between two numbers written with decimal points (or none).
  if (parts.length === 1 && (parts[0].match(/,/g)?.length ?? 0) === 1) parts = parts[0].split(',');
  if (parts.length !== 2) return null;
  const x = readNumber(parts[0]);
  const y = readNumber(parts[1]);
  return x == null || y == null ? null : [x, y];
}

/** Numbers separated by spaces, new lines or semicolons; "0.1,0.2" is two numbers, "0,1" one. */
export function readNumberTokens(text: string): string[] {
  const out: string[] = [];
  for (const token of text.split(/[\s;]+/).filter(Boolean)) {
    const commas = token.match(/,/g)?.length ?? 0;
    if (commas > 1 || (commas === 1 && token.includes('.'))) out.push(...token.split(',').filter(Boolean));
    else out.push(token);
  }
  return out;
}

/**
 * Parsed input for a list field: what goes to the schema (invalid entries stay as their text,
 * so the schema refuses them too) and where each entry came from, for messages a person reads.
 */
export interface ParsedList<T> {
  items: (T | string)[];
  where: string[];
  problems: string[];
}

export type PointsMode = 'xy' | 'radii';

/** x, y pairs one a line, or radii at equal angles (first at 0°, counter-clockwise) → points. */
export function parsePoints(text: string, mode: PointsMode): ParsedList<Point> {
  if (mode === 'radii') {
    const tokens = readNumberTokens(text);
    const values = tokens.map(readNumber);
    const problems = tokens.flatMap((t, i) => (values[i] == null ? [`radius ${i + 1}: “${t.slice(0, 24)}” is not a number`] : []));
    const where = tokens.map((_, i) => `radius ${i + 1}`);
    const n = values.length;
    // The angle step comes from the count, so an unreadable entry still holds its place.
    const items = values.map((radius, i) => (radius == null ? tokens[i] : pointsFromAngles([{ angleDeg: (i * 360) / n, radius }])[0]));
    return { items, where, problems };
  }
  const items: (Point | string)[] = [];
  const where: string[] = [];
  const problems: string[] = [];
  text.split(/\r?\n/).forEach((line, i) => {
    if (!line.trim()) return;
    const p = readPair(line);
    items.push(p ?? line.trim());
    where.push(`line ${i + 1}`);
    if (!p) problems.push(`line ${i + 1}: “${line.trim().slice(0, 32)}” is not an x, y pair`);
  });
  return { items, where, problems };
}

export function parseNumbers(text: string): ParsedList<number> {
  const tokens = readNumberTokens(text);
  const items = tokens.map((t) => readNumber(t) ?? t);
  const where = tokens.map((_, i) => `reading ${i + 1}`);
  const problems = tokens.flatMap((t, i) => (typeof items[i] === 'string' ? [`reading ${i + 1}: “${t.slice(0, 24)}” is not a number`] : []));
  return { items, where, problems };
}

// ── Formatting ────────────────────────────────────────────────────────────────────────────

/** Fixed decimals with a true minus sign, and no "−0.0000". */
export function fmt(v: number, decimals: number): string {
  const r = Math.abs(v) < 0.5 * 10 ** -decimals ? 0 : v;
  return r.toFixed(decimals).replace('-', '−');
}

// ── Fields ────────────────────────────────────────────────────────────────────────────────

/** The list-level message (too few points) and per-entry ones, from the form's errors. */
function listMessages(errors: unknown, name: string, where: string[], problems: string[], showProblems: boolean): string[] {
  const e = get(errors, name) as ({ message?: string; root?: { message?: string } } & Record<string, { message?: string } | undefined>) | undefined;
  const out: string[] = showProblems ? [...problems] : [];
  if (e?.message) out.push(e.message);
  if (e?.root?.message) out.push(e.root.message);
  if (e && typeof e === 'object') {
    for (const [k, v] of Object.entries(e)) {
      if (!/^\d+$/.test(k) || !v) continue;
      const at = where[Number(k)] ?? `entry ${Number(k) + 1}`;
      const msg = (v as { message?: string }).message ?? Object.values(v as Record<string, { message?: string }>).find((x) => x?.message)?.message;
      // An entry that could not be read is already named by its own problem line.
      if (msg && !problems.some((p) => p.startsWith(`${at}:`))) out.push(`${at}: ${msg}`);
    }
  }
  return [...new Set(out)];
}

/** Probed points as text, bound to the surrounding Form as the [x, y][] the shared schema takes. */
export function PointsField({ name, label, unit, placeholder }: { name: string; label: string; unit: string; placeholder?: string }) {
  const s = useCalcStyles();
  const { control, formState } = useFormContext();
  const { field, fieldState } = useController({ name, control });
  const [text, setText] = useState('');
  const [mode, setMode] = useState<PointsMode>('xy');
  const parsed = useMemo(() => parsePoints(text, mode), [text, mode]);
  const update = (t: string, m: PointsMode) => {
    setText(t);
    setMode(m);
    field.onChange(parsePoints(t, m).items);
  };
  const messages = listMessages(formState.errors, name, parsed.where, parsed.problems, fieldState.isTouched || formState.isSubmitted);
  const n = parsed.items.length;
  const hint =
    mode === 'xy'
      ? `One point a line, x and y in ${unit} (e.g. “35, −5”). ${n ? `${n} point${n === 1 ? '' : 's'}.` : ''}`
      : `Radii in ${unit} about the instrument axis, the first at 0°, counter-clockwise. ${n ? `${n} radii → every ${fmt(360 / n, 2).replace(/\.?0+$/, '')}°.` : ''}`;
  return (
    <div className={s.form} style={{ gap: 6 }}>
      <RadioGroup layout="horizontal" value={mode} aria-label={`${label}: how they are given`} onChange={(_, d) => update(text, d.value as PointsMode)}>
        <Radio value="xy" label="x, y pairs" />
        <Radio value="radii" label="Radii at equal angles" />
      </RadioGroup>
      <Field label={`${label} (${unit})`} validationState={messages.length ? 'error' : 'none'} validationMessage={messages.length ? <ul className={s.problems}>{messages.map((m) => <li key={m}>{m}</li>)}</ul> : undefined} hint={hint}>
        <Textarea
          name={field.name}
          value={text}
          rows={8}
          resize="vertical"
          textarea={{ className: s.mono, spellCheck: false }}
          placeholder={placeholder ?? (mode === 'xy' ? '35, -5\n27.678, 12.678\n…' : '25.012\n24.998\n…')}
          onChange={(_, d) => update(d.value, mode)}
          onBlur={field.onBlur}
          ref={field.ref}
        />
      </Field>
    </div>
  );
}

/** Several readings as text, bound to the surrounding Form as the number[] the shared schema takes. */
export function NumberListField({ name, label, unit, hint }: { name: string; label: string; unit: string; hint?: string }) {
  const s = useCalcStyles();
  const { control, formState } = useFormContext();
  const { field, fieldState } = useController({ name, control });
  const [text, setText] = useState('');
  const parsed = useMemo(() => parseNumbers(text), [text]);
  const messages = listMessages(formState.errors, name, parsed.where, parsed.problems, fieldState.isTouched || formState.isSubmitted);
  const n = parsed.items.length;
  return (
    <Field
      label={`${label} (${unit})`}
      hint={`${hint ?? 'Separate readings with spaces, new lines or semicolons.'}${n ? ` ${n} reading${n === 1 ? '' : 's'}.` : ''}`}
      validationState={messages.length ? 'error' : 'none'}
      validationMessage={messages.length ? <ul className={s.problems}>{messages.map((m) => <li key={m}>{m}</li>)}</ul> : undefined}
    >
      <Textarea
        name={field.name}
        value={text}
        rows={3}
        resize="vertical"
        textarea={{ className: s.mono, spellCheck: false }}
        onChange={(_, d) => {
          setText(d.value);
          field.onChange(parseNumbers(d.value).items);
        }}
        onBlur={field.onBlur}
        ref={field.ref}
      />
    </Field>
  );
}

// ── Card, result, server check ────────────────────────────────────────────────────────────

/** The formula as the trade writes it, and where it comes from. */
export function Formula({ label, formula, source }: { label: string; formula: ReactNode; source: ReactNode }) {
  const s = useCalcStyles();
  return (
    <div className={s.formula} role="note" aria-label={label}>
      <span className={s.formulaText}>{formula}</span>
      <Caption1 className={s.source}>Source: {source}</Caption1>
    </div>
  );
}

export function CalcCard({ title, formula, source, children, aside }: { title: string; formula: ReactNode; source: ReactNode; children: ReactNode; aside?: ReactNode }) {
  const s = useCalcStyles();
  return (
    <section className={s.card} aria-label={title}>
      <Subtitle1 as="h2" className={s.h2}>{title}</Subtitle1>
      <Formula label={`${title}: formula`} formula={formula} source={source} />
      {aside}
      {children}
    </section>
  );
}

export interface ResultRow {
  label: string;
  value: string;
  big?: boolean;
}

/** The live result, computed in the browser with the bench sheet's own functions. */
export function LiveResult({ label, rows, empty, error, note }: { label: string; rows: ResultRow[] | null; empty: string; error?: string | null; note?: ReactNode }) {
  const s = useCalcStyles();
  return (
    <div className={s.result} role="region" aria-label={label} aria-live="polite">
      <span className={s.resultHead}>Result (computed here as you type)</span>
      {error ? (
        <Body1 className={s.error}>{error}</Body1>
      ) : rows ? (
        <dl className={s.dl}>
          {rows.map((r) => (
            <div key={r.label} style={{ display: 'contents' }}>
              <dt className={s.dt}>{r.label}</dt>
              <dd className={r.big ? `${s.dd} ${s.big}` : s.dd}>{r.value}</dd>
            </div>
          ))}
        </dl>
      ) : (
        <Body1 className={s.muted}>{empty}</Body1>
      )}
      {note}
    </div>
  );
}

export interface Compared {
  label: string;
  local: number | null;
  server: number | null;
  text: (v: number | null) => string;
}

/** Same number, allowing for the last digits JSON and a different CPU may change. */
export const agrees = (a: number | null, b: number | null) => (a == null || b == null ? a == null && b == null : Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a), Math.abs(b)));

/** The two results to the last digit: the shown figures are rounded, so say how far apart they are. */
function difference(a: number | null, b: number | null): string {
  if (a == null || b == null) return a == null && b == null ? '(both none)' : '';
  const d = Math.abs(a - b);
  return d === 0 ? '(identical to the last digit)' : `(apart by ${d.toExponential(1)})`;
}

export interface ServerCheckState<R> {
  /** The inputs sent, as JSON: the check speaks for those inputs only. */
  key: string;
  result: R;
}

/** "Check on server" and what the API answered, beside the browser's own figure. */
export function ServerCheck({ label, checked, currentKey, compared, submitting, disabled }: {
  label: string;
  checked: boolean;
  currentKey: string | null;
  compared: Compared[] | null;
  submitting: boolean;
  disabled?: boolean;
}) {
  const s = useCalcStyles();
  const stale = checked && compared == null;
  const all = compared?.every((c) => agrees(c.local, c.server));
  return (
    <div className={s.server}>
      <div className={s.actions}>
        <Button className={s.touch} type="submit" disabled={submitting || disabled}>{submitting ? 'Checking…' : 'Check on server'}</Button>
        {!checked ? <Caption1 className={s.muted}>Sends the same inputs to the API, which runs the same shared functions.</Caption1> : null}
        {stale && currentKey ? <Caption1 className={s.muted}>The inputs changed since the last check.</Caption1> : null}
      </div>
      {compared ? (
        <div role="status" aria-label={`${label}: server check`} className={s.server}>
          <span className={s.serverRow}>
            {all ? <StatusPill tone="ok">Server agrees</StatusPill> : <StatusPill tone="bad">Server differs</StatusPill>}
          </span>
          {compared.map((c) => (
            <span key={c.label} className={s.serverRow}>
              <span className={s.muted}>{c.label}:</span>
              <span>browser {c.text(c.local)}</span>
              <span>· server {c.text(c.server)}</span>
              <span className={s.muted}>{difference(c.local, c.server)}</span>
              {agrees(c.local, c.server) ? null : <StatusPill tone="bad">differs</StatusPill>}
            </span>
          ))}
        </div>
      ) : null}
    </div>
  );
}
