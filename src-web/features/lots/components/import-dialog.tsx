import {
  Body1,
  Button,
  Caption1,
  Dialog,
  DialogActions,
  DialogBody,
  DialogContent,
  DialogSurface,
  DialogTitle,
  MessageBar,
  MessageBarBody,
  MessageBarTitle,
  ProgressBar,
  makeStyles,
  mergeClasses,
  tokens,
} from '@fluentui/react-components';
import { useQueries, useQueryClient } from '@tanstack/react-query';
import Papa from 'papaparse';
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { expectedReadings } from '@shared/compute/evaluate';
import { GAUGE_KIND_LABELS, type Characteristic, type Gauge, type GaugeKind, type Plan } from '@shared/schemas/master-data';
import type { ImportMapping, Lot } from '@shared/schemas/receiving';
import { ApiError } from '../../../lib/api-client';
import { getGaugesQueryOptions } from '../../gauges/api/gauges';
import { MAX_CSV_MB, importGaugeCsv, otherProblems, problemLines, rowProblems, type ImportResult } from '../api/imports';
import { GaugePicker, usableGauge } from './gauge-picker';
import { cellLabels, needsGauge } from './sheet-model';

const PREVIEW_ROWS = 20;

const useStyles = makeStyles({
  surface: { maxWidth: 'min(1180px, 96vw)', width: '96vw' },
  content: { display: 'flex', flexDirection: 'column', gap: '18px' },
  touch: { minHeight: '44px' },
  hidden: { display: 'none' },
  file: { display: 'flex', gap: '10px', alignItems: 'center', flexWrap: 'wrap' },
  fileName: { fontWeight: 600, overflowWrap: 'anywhere' },
  muted: { color: tokens.colorNeutralForeground3 },
  h3: { display: 'block', fontSize: tokens.fontSizeBase300, fontWeight: 700, margin: '0 0 6px' },
  previewWrap: { overflow: 'auto', maxHeight: '300px', border: `1px solid ${tokens.colorNeutralStroke2}`, borderRadius: tokens.borderRadiusMedium },
  table: { borderCollapse: 'collapse', fontSize: tokens.fontSizeBase200, fontVariantNumeric: 'tabular-nums', minWidth: '100%' },
  th: {
    position: 'sticky',
    top: 0,
    backgroundColor: tokens.colorNeutralBackground3,
    textAlign: 'left',
    padding: '4px 8px',
    borderBottom: `2px solid ${tokens.colorNeutralStroke1}`,
    whiteSpace: 'nowrap',
    verticalAlign: 'bottom',
  },
  tag: { display: 'block', fontFamily: tokens.fontFamilyMonospace, fontSize: tokens.fontSizeBase100, fontWeight: 700, color: tokens.colorBrandForeground1 },
  td: { padding: '3px 8px', borderBottom: `1px solid ${tokens.colorNeutralStroke3}`, whiteSpace: 'nowrap' },
  lineNo: { color: tokens.colorNeutralForeground3, textAlign: 'right' },
  mapped: { backgroundColor: tokens.colorBrandBackground2 },
  badRow: { boxShadow: `inset 3px 0 0 ${tokens.colorPaletteRedBorder2}` },
  // Over the mapped-column tint too: the row the server named must stand out whole.
  badCell: { backgroundColor: tokens.colorPaletteRedBackground2, fontWeight: 600 },
  mapGrid: { display: 'flex', flexDirection: 'column', gap: '12px' },
  charBox: { border: `1px solid ${tokens.colorNeutralStroke2}`, borderRadius: tokens.borderRadiusLarge, padding: '10px 12px', margin: 0, minWidth: 0 },
  charBad: { border: `2px solid ${tokens.colorPaletteRedBorder2}` },
  legend: { padding: '0 4px', display: 'flex', gap: '8px', alignItems: 'baseline', flexWrap: 'wrap' },
  code: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 700 },
  charRow: { display: 'grid', gridTemplateColumns: 'minmax(0, 1fr) minmax(240px, 340px)', gap: '12px 16px', alignItems: 'start', '@media (max-width: 800px)': { gridTemplateColumns: 'minmax(0, 1fr)' } },
  cols: { display: 'grid', gridTemplateColumns: 'repeat(auto-fill, minmax(150px, 1fr))', gap: '6px 8px' },
  colField: { display: 'flex', flexDirection: 'column', gap: '2px', minWidth: 0 },
  colLabel: { fontSize: tokens.fontSizeBase200, color: tokens.colorNeutralForeground2, whiteSpace: 'nowrap' },
  select: {
    minHeight: '40px',
    width: '100%',
    fontSize: tokens.fontSizeBase300,
    fontFamily: 'inherit',
    padding: '0 8px',
    borderRadius: tokens.borderRadiusMedium,
    border: `1px solid ${tokens.colorNeutralStroke1}`,
    backgroundColor: tokens.colorNeutralBackground1,
    color: tokens.colorNeutralForeground1,
    ':focus-visible': { outline: `2px solid ${tokens.colorBrandStroke1}`, outlineOffset: '1px' },
  },
  serial: { maxWidth: '340px' },
  tools: { display: 'flex', gap: '6px', flexWrap: 'wrap', marginTop: '6px' },
  error: { color: tokens.colorPaletteRedForeground1, display: 'block', marginTop: '4px' },
  problems: { margin: '6px 0 0', paddingLeft: '20px', display: 'flex', flexDirection: 'column', gap: '2px' },
  lines: { margin: '8px 0 0', paddingLeft: '20px', display: 'flex', flexDirection: 'column', gap: '3px', fontVariantNumeric: 'tabular-nums', maxHeight: '220px', overflowY: 'auto' },
  progress: { display: 'flex', flexDirection: 'column', gap: '4px' },
  status: { flexDirection: 'column', alignItems: 'stretch', justifyContent: 'center', gap: '4px', width: '100%', maxWidth: '520px', alignSelf: 'center' },
  cellCut: { maxWidth: '28ch', overflow: 'hidden', textOverflow: 'ellipsis' },
  summary: { padding: '10px 14px', borderRadius: tokens.borderRadiusLarge, backgroundColor: tokens.colorNeutralBackground3, display: 'flex', flexDirection: 'column', gap: '4px' },
});

// ── Reading the file in the browser ───────────────────────────────────────────────────────

export interface ParsedCsv {
  header: string[];
  /** Data rows (header excluded), cells trimmed. Row i is "line i + 2", as the server counts. */
  rows: string[][];
  delimiter: ',' | ';';
  warnings: string[];
}

/**
 * The server's own reading of a gauge file (imports.service.ts): byte-order mark dropped, the
 * delimiter is ";" when the header has more semicolons than commas, empty lines skipped, cells
 * trimmed. Reading it the same way here keeps the preview's line numbers equal to the server's.
 */
export function parseGaugeCsv(raw: string): ParsedCsv {
  const text = raw.replace(/^\uFEFF/, '');
  const nl = text.indexOf('\n');
  const first = nl < 0 ? text : text.slice(0, nl);
  const delimiter = (first.match(/;/g)?.length ?? 0) > (first.match(/,/g)?.length ?? 0) ? ';' : ',';
  const res = Papa.parse<string[]>(text, { delimiter, skipEmptyLines: true });
  const records = res.data.map((r) => r.map((c) => String(c ?? '').trim()));
  const warnings = [...new Set(res.errors.slice(0, 5).map((e) => `${e.row != null ? `line ${e.row + 1}: ` : ''}${e.message}`))];
  return { header: records[0] ?? [], rows: records.slice(1), delimiter, warnings };
}

// ── Guessing the mapping from the header names ────────────────────────────────────────────

/** Lower case, letters and digits only ("BORE_D 1" → "bore d 1", "µm" → "m"). */
const norm = (s: string) => s.normalize('NFKD').toLowerCase().replace(/[^a-z0-9]+/g, ' ').trim();
/** What may follow a characteristic's code in a one-column header: a unit or a word for "value". */
const SUFFIX = /^(mm|um|m|g|kg|a|ma|n|t|c|cm2|ohm|ohm cm2|mohm|w kg|value|val|mean|avg|result|reading|pass|pass fail|pf|ok|ok nok|status)$/;
const SERIAL_NAMES = new Set(['core', 'serial', 'sample', 'core no', 'core nr', 'core number', 'core serial', 'core id', 'serial no', 'serial nr', 'serial number', 'sample no', 'sample number', 'sn', 's n', 'no', 'nr', 'piece', 'piece no', 'part serial', 'id', '']);

interface HeaderKey {
  index: number;
  name: string;
  whole: string;
  /** The name without its reading number: "bore r1" → ["bore r", "bore"]; [] when it has none. */
  bases: string[];
  idx: number | null;
}

function headerKeys(header: string[]): HeaderKey[] {
  return header.map((name, index) => {
    const whole = norm(name);
    const m = /^(.*?)\s*(\d+)$/.exec(whole);
    if (!m || !m[1]) return { index, name, whole, bases: [], idx: null };
    const base = m[1].trim();
    const bases = [base];
    // "bore r1", "burr p 2", "od pt3": the letters before the number say reading, point, position.
    const lettered = /^(.*\S)\s+(?:r|p|pt|pos|point|reading|read|no|nr|n|a|h|d|x|y)$/.exec(base);
    if (lettered) bases.push(lettered[1]);
    return { index, name, whole, bases, idx: Number(m[2]) };
  });
}

/** Number of columns a characteristic takes in a file: its readings, or one pass/fail column. */
export const columnsFor = (c: Characteristic) => (c.kind === 'attribute' ? 1 : expectedReadings(c));

export interface ColumnMapping {
  serial: string | null;
  /** code → the column for each reading, in reading order; null where none is chosen. */
  columns: Record<string, (string | null)[]>;
}

/**
 * A first guess the inspector checks: the serial column by its name (or the first column of
 * whole numbers within the sample), then each characteristic by headers that carry its code or
 * name, numbered (BORE_D_1…16, "bore r1") or alone for one reading ("BORE", "bore mm").
 * Longer codes go first, so BORE_D's columns are not taken by BORE.
 */
export function guessMapping(header: string[], rows: string[][], chars: Characteristic[], sampleCount: number): ColumnMapping {
  const keys = headerKeys(header);
  const used = new Set<number>();
  const usable = (h: HeaderKey) => h.name !== '' && !used.has(h.index) && header.indexOf(h.name) === h.index;

  let serial = keys.find((h) => usable(h) && h.name !== '' && SERIAL_NAMES.has(h.whole)) ?? keys.find((h) => usable(h) && /^(core|serial|sample)\b/.test(h.whole));
  if (!serial) {
    // No telling name: the first column holding only whole numbers within the sample.
    serial = keys.find((h) => usable(h) && rows.length > 0 && rows.slice(0, PREVIEW_ROWS).every((r) => /^\d+$/.test(r[h.index] ?? '') && Number(r[h.index]) >= 1 && Number(r[h.index]) <= sampleCount));
  }
  if (serial) used.add(serial.index);

  const columns: Record<string, (string | null)[]> = {};
  const order = [...chars].sort((a, b) => b.code.length - a.code.length || a.seq - b.seq);
  for (const c of order) {
    const k = columnsFor(c);
    const slots: (string | null)[] = Array.from({ length: k }, () => null);
    const names = new Set([norm(c.code), norm(c.name)].filter(Boolean));
    const byIdx = new Map<number, HeaderKey>();
    for (const h of keys) if (usable(h) && h.idx != null && h.bases.some((b) => names.has(b)) && !byIdx.has(h.idx)) byIdx.set(h.idx, h);
    const idxs = [...byIdx.keys()].sort((a, b) => a - b);
    if (idxs.length >= k) {
      idxs.slice(0, k).forEach((i, slot) => (slots[slot] = byIdx.get(i)!.name));
    } else if (idxs.length && idxs.every((i) => i >= 1 && i <= k)) {
      // Some readings are in the file: place those, and let the inspector see what is missing.
      for (const i of idxs) slots[i - 1] = byIdx.get(i)!.name;
    } else if (k === 1) {
      const one = keys.find((h) => usable(h) && [...names].some((n) => h.whole === n || (h.whole.startsWith(`${n} `) && SUFFIX.test(h.whole.slice(n.length + 1)))));
      if (one) slots[0] = one.name;
    }
    for (const name of slots) if (name != null) used.add(header.indexOf(name));
    columns[c.code] = slots;
  }
  return { serial: serial?.name ?? null, columns };
}

// ── Checking the mapping before sending ───────────────────────────────────────────────────

interface MappingCheck {
  mapping: ImportMapping | null;
  /** code → what is wrong with its columns or gauge. */
  byCode: Record<string, string[]>;
  serial: string | null;
  general: string[];
  mappedCodes: string[];
}

function checkMapping(m: ColumnMapping, gauges: Record<string, string | null>, chars: Characteristic[]): MappingCheck {
  const byCode: Record<string, string[]> = {};
  const general: string[] = [];
  const add = (code: string, text: string) => (byCode[code] = [...(byCode[code] ?? []), text]);
  const serial = m.serial ? null : 'Choose the column with the core serial (1, 2, 3 … as on the bench sheet).';
  const usedBy = new Map<string, string>();
  if (m.serial) usedBy.set(m.serial, 'the core serial');
  const mappedCodes: string[] = [];
  for (const c of chars) {
    const slots = m.columns[c.code] ?? [];
    const chosen = slots.filter((x): x is string => !!x);
    if (!chosen.length) continue;
    const k = columnsFor(c);
    if (chosen.length < k) {
      add(c.code, `Map all ${k} columns for ${c.code}, or none to leave it out of this import (${k - chosen.length} still to choose).`);
      continue;
    }
    for (const col of chosen) {
      const other = usedBy.get(col);
      if (other) add(c.code, `Column “${col}” is also mapped to ${other}.`);
      else usedBy.set(col, c.code);
    }
    if (needsGauge(c) && !gauges[c.code]) add(c.code, `Choose the ${GAUGE_KIND_LABELS[c.gaugeKind as GaugeKind].toLowerCase()} the file was measured with.`);
    mappedCodes.push(c.code);
  }
  if (!mappedCodes.length && !Object.keys(byCode).length) general.push('Map the columns of at least one characteristic.');
  const ok = !serial && !general.length && !Object.keys(byCode).length;
  const mapping: ImportMapping | null = ok
    ? {
        serialColumn: m.serial!,
        columns: Object.fromEntries(mappedCodes.map((code) => [code, m.columns[code] as string[]])),
        gaugeIds: Object.fromEntries(mappedCodes.filter((code) => gauges[code]).map((code) => [code, gauges[code] as string])),
      }
    : null;
  return { mapping, byCode, serial, general, mappedCodes };
}

// ── The dialog ────────────────────────────────────────────────────────────────────────────

type Phase =
  | { kind: 'idle' }
  | { kind: 'sending'; progress: number }
  | { kind: 'saving' }
  | { kind: 'done'; result: ImportResult; fileName: string }
  | { kind: 'refused'; message: string; rows: string[]; other: string[] }
  | { kind: 'duplicate'; message: string }
  | { kind: 'failed'; message: string };

function ColumnSelect({ label, header, value, onChange }: { label: string; header: string[]; value: string | null; onChange: (v: string | null) => void }) {
  const s = useStyles();
  return (
    <select className={s.select} aria-label={label} value={value ?? ''} onChange={(e) => onChange(e.target.value || null)}>
      <option value="">—</option>
      {header.map((h, i) =>
        h === '' || header.indexOf(h) !== i ? (
          // The server finds a column by its name: an unnamed or repeated one cannot be mapped.
          <option key={i} value="" disabled>{h === '' ? `(column ${i + 1} has no name)` : `${h} (repeated; the first is used)`}</option>
        ) : (
          <option key={i} value={h}>{h}</option>
        ),
      )}
    </select>
  );
}

function CharacteristicMapping({ c, header, slots, onSlots, gauge, gauges, gaugesLoading, onGauge, problems }: {
  c: Characteristic;
  header: string[];
  slots: (string | null)[];
  onSlots: (slots: (string | null)[]) => void;
  gauge: string | null;
  gauges: Gauge[];
  gaugesLoading: boolean;
  onGauge: (id: string | null) => void;
  problems: string[];
}) {
  const s = useStyles();
  const k = columnsFor(c);
  const labels = c.kind === 'attribute' ? ['Pass / fail'] : cellLabels(c);
  const unit = c.kind === 'variable' && c.unit ? ` (${c.unit})` : '';
  const named = header.filter((h, i) => h !== '' && header.indexOf(h) === i);
  const first = slots.findIndex((x) => !!x);
  // "Fill the rest": from the first chosen column, the following columns of the file in order.
  const fill = () => {
    if (first < 0) return;
    const start = named.indexOf(slots[first]!);
    onSlots(Array.from({ length: k }, (_, i) => (i < first ? slots[i] : (named[start + i - first] ?? null))));
  };
  return (
    <fieldset className={mergeClasses(s.charBox, problems.length ? s.charBad : undefined)} aria-label={`Columns for ${c.code}`}>
      <legend className={s.legend}>
        <span className={s.code}>{c.code}</span>
        <span>{c.name}</span>
        <Caption1 className={s.muted}>
          {c.kind === 'attribute' ? 'pass / fail, one column (pass, ok, yes, 1 · fail, nok, no, 0)' : `${k} reading${k === 1 ? '' : 's'} per core${unit}`}
        </Caption1>
      </legend>
      <div className={s.charRow}>
        <div>
          <div className={s.cols}>
            {slots.map((v, i) => (
              <label key={i} className={s.colField}>
                <span className={s.colLabel}>{labels[i] ?? `#${i + 1}`}{unit}</span>
                <ColumnSelect label={`${c.code} ${labels[i] ?? `#${i + 1}`} column`} header={header} value={v} onChange={(x) => onSlots(slots.map((y, j) => (j === i ? x : y)))} />
              </label>
            ))}
          </div>
          <div className={s.tools}>
            {k > 1 ? (
              <Button size="small" className={s.touch} appearance="subtle" disabled={first < 0} onClick={fill} title="Takes the columns that follow the first chosen one, in the file's order">
                Fill the rest in file order
              </Button>
            ) : null}
            <Button size="small" className={s.touch} appearance="subtle" disabled={first < 0} onClick={() => onSlots(slots.map(() => null))}>
              {first < 0 ? 'Not in this file' : 'Leave out'}
            </Button>
          </div>
        </div>
        {c.gaugeKind ? (
          <div className={s.colField}>
            <span className={s.colLabel}>Gauge{needsGauge(c) ? '' : ' (optional)'}</span>
            <GaugePicker code={c.code} kind={c.gaugeKind} gauges={gauges} value={gauge} onChange={onGauge} loading={gaugesLoading} optional={!needsGauge(c)} />
          </div>
        ) : null}
      </div>
      {problems.map((p) => (
        <Caption1 key={p} className={s.error} role="alert">{p}</Caption1>
      ))}
    </fieldset>
  );
}

function ImportBody({ lot, plan, unsentOnSheet, onClose, onSucceeded, onSaving }: {
  lot: Lot;
  plan: Plan;
  unsentOnSheet: number;
  onClose: () => void;
  onSucceeded: () => void;
  /** While the server is saving, closing would hide the outcome of an import that may well go in. */
  onSaving: (saving: boolean) => void;
}) {
  const s = useStyles();
  const qc = useQueryClient();
  const input = useRef<HTMLInputElement>(null);
  const abort = useRef<AbortController | null>(null);
  const chars = useMemo(() => [...plan.characteristics].filter((c) => c.kind !== 'derived').sort((a, b) => a.seq - b.seq), [plan.characteristics]);
  const [file, setFile] = useState<File | null>(null);
  const [csv, setCsv] = useState<ParsedCsv | null>(null);
  const [readError, setReadError] = useState<string | null>(null);
  const [mapping, setMapping] = useState<ColumnMapping>({ serial: null, columns: {} });
  const [gaugeBy, setGaugeBy] = useState<Record<string, string | null>>({});
  const [phase, setPhase] = useState<Phase>({ kind: 'idle' });
  const outcome = useRef<HTMLDivElement>(null);
  useEffect(() => {
    // The outcome sits above the preview and mapping: bring it into view when it arrives.
    if (phase.kind !== 'idle' && phase.kind !== 'sending' && phase.kind !== 'saving') outcome.current?.scrollIntoView({ block: 'nearest' });
  }, [phase.kind]);
  useEffect(() => () => abort.current?.abort(), []);

  // ── Gauges of the kinds the plan names (the bench sheet's queries: usually cached already) ──
  const kinds = useMemo(() => [...new Set(chars.filter((c) => c.gaugeKind).map((c) => c.gaugeKind as GaugeKind))], [chars]);
  const gaugeQs = useQueries({ queries: kinds.map((kind) => getGaugesQueryOptions({ page: 1, pageSize: 200, kind, sort: 'assetTag' })) });
  const gaugesOf = (kind: GaugeKind) => {
    const i = kinds.indexOf(kind);
    return { list: gaugeQs[i]?.data?.items ?? [], loading: !!gaugeQs[i]?.isPending };
  };
  const gaugeData = gaugeQs.map((q) => q.data);
  const lastGauge = useMemo(() => {
    const m = new Map<string, string>();
    for (const r of [...lot.readings].sort((a, b) => a.enteredAt.localeCompare(b.enteredAt))) if (r.gaugeId) m.set(r.characteristicCode, r.gaugeId);
    return m;
  }, [lot.readings]);
  useEffect(() => {
    // The gauge this lot's readings were last taken with, while it is still in calibration; else
    // the only one of the kind in calibration; with several, the inspector picks.
    const auto: Record<string, string> = {};
    for (const c of chars) {
      if (!c.gaugeKind || gaugeBy[c.code]) continue;
      const i = kinds.indexOf(c.gaugeKind);
      const usable = (gaugeData[i]?.items ?? []).filter(usableGauge);
      const used = lastGauge.get(c.code);
      if (used && usable.some((g) => g.id === used)) auto[c.code] = used;
      else if (usable.length === 1) auto[c.code] = usable[0].id;
    }
    if (Object.keys(auto).length) setGaugeBy((g) => ({ ...g, ...auto }));
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [chars, kinds, gaugeBy, lastGauge, ...gaugeData]);

  const choose = async (f: File | null) => {
    if (!f) return;
    setPhase({ kind: 'idle' });
    setReadError(null);
    if (f.size > MAX_CSV_MB * 1024 * 1024) {
      setReadError(`${f.name} is ${(f.size / 1048576).toFixed(1)} MB; a gauge CSV may be at most ${MAX_CSV_MB} MB.`);
      return;
    }
    let parsed: ParsedCsv;
    try {
      parsed = parseGaugeCsv(await f.text());
    } catch (err) {
      setReadError(`${f.name} cannot be read as text: ${(err as Error).message}`);
      return;
    }
    if (!parsed.header.length || !parsed.rows.length) {
      setReadError(`${f.name} needs a header row and at least one data row.`);
      return;
    }
    const sameHeader = !!csv && JSON.stringify(csv.header) === JSON.stringify(parsed.header);
    setFile(f);
    setCsv(parsed);
    // A corrected file with the same columns keeps the mapping the inspector already checked.
    if (!sameHeader) setMapping(guessMapping(parsed.header, parsed.rows, chars, lot.samples.length));
  };

  const check = useMemo(() => checkMapping(mapping, gaugeBy, chars), [mapping, gaugeBy, chars]);
  const busy = phase.kind === 'sending' || phase.kind === 'saving';
  useEffect(() => {
    onSaving(phase.kind === 'saving');
  }, [phase.kind, onSaving]);
  const colTags = useMemo(() => {
    const tags = new Map<string, string>();
    if (mapping.serial) tags.set(mapping.serial, 'core serial');
    for (const c of chars) {
      const slots = mapping.columns[c.code] ?? [];
      const labels = c.kind === 'attribute' ? ['pass/fail'] : cellLabels(c);
      slots.forEach((col, i) => col && !tags.has(col) && tags.set(col, slots.length > 1 ? `${c.code} ${labels[i]}` : c.code));
    }
    return tags;
  }, [mapping, chars]);
  const badLines = phase.kind === 'refused' ? problemLines(phase.rows) : new Set<number>();
  const replaced = lot.readings.filter((r) => check.mappedCodes.includes(r.characteristicCode) && (r.values.length > 0 || r.pass != null)).length;

  const run = async () => {
    if (!file || !check.mapping) return;
    const ctl = new AbortController();
    abort.current = ctl;
    setPhase({ kind: 'sending', progress: 0 });
    try {
      const result = await importGaugeCsv(lot.id, file, check.mapping, (f) => setPhase(f >= 1 ? { kind: 'saving' } : { kind: 'sending', progress: f }), ctl.signal);
      // The sheet, the proposal and the lot lists all read the readings just stored.
      await qc.invalidateQueries({ queryKey: ['lots'] });
      setPhase({ kind: 'done', result, fileName: file.name });
      onSucceeded();
    } catch (err) {
      if ((err as Error).name === 'AbortError') return;
      if (err instanceof ApiError && err.status === 409) setPhase({ kind: 'duplicate', message: err.message });
      else if (err instanceof ApiError && err.status === 400) setPhase({ kind: 'refused', message: err.message, rows: rowProblems(err), other: otherProblems(err) });
      else setPhase({ kind: 'failed', message: err instanceof Error ? err.message : 'The import failed.' });
    }
  };

  return (
    <DialogBody>
      <DialogTitle>Import gauge CSV</DialogTitle>
      <DialogContent className={s.content}>
        <Body1>
          Readings exported by a gauge or CMM, one row per core. Check the preview and the columns, then import: every row goes in, or none does.
        </Body1>

        <div className={s.file}>
          <Button className={s.touch} appearance={file ? 'secondary' : 'primary'} disabled={busy} onClick={() => input.current?.click()}>
            {file ? 'Choose another file…' : 'Choose CSV file…'}
          </Button>
          {file && csv ? (
            <span>
              <span className={s.fileName}>{file.name}</span>{' '}
              <Caption1 className={s.muted}>
                {(file.size / 1024).toFixed(1)} KB · {csv.rows.length} data row{csv.rows.length === 1 ? '' : 's'} · {csv.header.length} columns · separated by {csv.delimiter === ';' ? 'semicolons (;)' : 'commas (,)'}
              </Caption1>
            </span>
          ) : (
            <Caption1 className={s.muted}>Comma- or semicolon-separated, with a header row; decimal points or commas. Up to {MAX_CSV_MB} MB.</Caption1>
          )}
          <input
            ref={input}
            className={s.hidden}
            type="file"
            accept=".csv,.txt,text/csv,text/plain"
            aria-label="Gauge CSV file"
            onChange={(e) => {
              const f = e.target.files?.[0] ?? null;
              e.target.value = '';
              void choose(f);
            }}
          />
        </div>
        {readError ? <MessageBar intent="error"><MessageBarBody>{readError}</MessageBarBody></MessageBar> : null}
        <div aria-live="polite" ref={outcome} className={s.progress}>
          {phase.kind === 'done' ? (
            <MessageBar intent="success" layout="multiline">
              <MessageBarBody>
                <MessageBarTitle>Imported</MessageBarTitle>
                {phase.result.rows} row{phase.result.rows === 1 ? '' : 's'}, {phase.result.readings} reading{phase.result.readings === 1 ? '' : 's'} from {phase.fileName}. Close this window to see them on the bench sheet.
              </MessageBarBody>
            </MessageBar>
          ) : phase.kind === 'refused' ? (
            <MessageBar intent="error" layout="multiline">
              <MessageBarBody>
                <MessageBarTitle>Nothing was imported</MessageBarTitle>
                {phase.message.replace(/\.$/, '')}. Fix the file and choose it again: the columns you mapped are kept.
                {phase.rows.length ? (
                  <ol className={s.lines} aria-label="Row problems">
                    {phase.rows.map((r) => <li key={r}>{r}</li>)}
                  </ol>
                ) : null}
                {phase.other.length ? (
                  <ul className={s.problems} aria-label="Other problems">
                    {phase.other.map((r) => <li key={r}>{r}</li>)}
                  </ul>
                ) : null}
              </MessageBarBody>
            </MessageBar>
          ) : phase.kind === 'duplicate' ? (
            <MessageBar intent="warning" layout="multiline">
              <MessageBarBody>
                <MessageBarTitle>Already imported</MessageBarTitle>
                {phase.message}
              </MessageBarBody>
            </MessageBar>
          ) : phase.kind === 'failed' ? (
            <MessageBar intent="error" layout="multiline">
              <MessageBarBody>
                <MessageBarTitle>The import did not go through</MessageBarTitle>
                {phase.message}
              </MessageBarBody>
            </MessageBar>
          ) : null}
        </div>
        {csv?.warnings.length ? (
          <MessageBar intent="warning">
            <MessageBarBody>The file has irregular quoting; check the preview. {csv.warnings.join('; ')}</MessageBarBody>
          </MessageBar>
        ) : null}

        {csv ? (
          <section aria-label="Preview">
            <h3 className={s.h3}>
              Preview <Caption1 className={s.muted}>{csv.rows.length > PREVIEW_ROWS ? `first ${PREVIEW_ROWS} of ${csv.rows.length} rows` : `all ${csv.rows.length} rows`}; line numbers as the server counts them</Caption1>
            </h3>
            <div className={s.previewWrap}>
              <table className={s.table} aria-label="CSV preview">
                <thead>
                  <tr>
                    <th scope="col" className={mergeClasses(s.th, s.lineNo)}>Line</th>
                    {csv.header.map((h, i) => (
                      <th key={i} scope="col" className={mergeClasses(s.th, colTags.has(h) ? s.mapped : undefined)}>
                        {colTags.has(h) ? <span className={s.tag}>→ {colTags.get(h)}</span> : null}
                        {h || <span className={s.muted}>(no name)</span>}
                      </th>
                    ))}
                  </tr>
                </thead>
                <tbody>
                  {csv.rows.slice(0, PREVIEW_ROWS).map((r, i) => (
                    <tr key={i} className={badLines.has(i + 2) ? s.badRow : undefined}>
                      <td className={mergeClasses(s.td, s.lineNo, badLines.has(i + 2) ? s.badCell : undefined)}>{i + 2}</td>
                      {csv.header.map((h, j) => (
                        <td key={j} className={mergeClasses(s.td, s.cellCut, colTags.has(h) && csv.header.indexOf(h) === j ? s.mapped : undefined, badLines.has(i + 2) ? s.badCell : undefined)} title={(r[j] ?? '').length > 28 ? r[j] : undefined}>{(r[j] ?? '').slice(0, 200)}</td>
                      ))}
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          </section>
        ) : null}

        {csv ? (
          <section aria-label="Column mapping" className={s.mapGrid}>
            <h3 className={s.h3}>Columns <Caption1 className={s.muted}>guessed from the header names: check them</Caption1></h3>
            <label className={mergeClasses(s.colField, s.serial)}>
              <span className={s.colLabel}>Core serial (1 … {lot.samples.length})</span>
              <ColumnSelect label="Core serial column" header={csv.header} value={mapping.serial} onChange={(v) => setMapping((m) => ({ ...m, serial: v }))} />
              {check.serial ? <Caption1 className={s.error}>{check.serial}</Caption1> : null}
            </label>
            {chars.map((c) => (
              <CharacteristicMapping
                key={c.code}
                c={c}
                header={csv.header}
                slots={mapping.columns[c.code] ?? Array.from({ length: columnsFor(c) }, () => null)}
                onSlots={(slots) => setMapping((m) => ({ ...m, columns: { ...m.columns, [c.code]: slots } }))}
                gauge={gaugeBy[c.code] ?? null}
                gauges={c.gaugeKind ? gaugesOf(c.gaugeKind).list : []}
                gaugesLoading={c.gaugeKind ? gaugesOf(c.gaugeKind).loading : false}
                onGauge={(id) => setGaugeBy((g) => ({ ...g, [c.code]: id }))}
                problems={check.byCode[c.code] ?? []}
              />
            ))}
          </section>
        ) : null}

        {csv && phase.kind === 'idle' ? (
          <div className={s.summary} aria-label="Import summary">
            {check.mapping ? (
              <Body1>
                Ready: {csv.rows.length} row{csv.rows.length === 1 ? '' : 's'} × {check.mappedCodes.join(', ')}
                {chars.length > check.mappedCodes.length ? ` (left out: ${chars.filter((c) => !check.mappedCodes.includes(c.code)).map((c) => c.code).join(', ')})` : ''}.
              </Body1>
            ) : (
              <Body1>Before importing, fix what is marked above{check.general.length ? `: ${check.general.join(' ')}` : '.'}</Body1>
            )}
            {replaced ? <Caption1>{replaced} reading{replaced === 1 ? '' : 's'} already on the sheet for these characteristics will be replaced by the file&apos;s values for the same cores (the History ledger keeps the old ones).</Caption1> : null}
            {unsentOnSheet ? <Caption1>{unsentOnSheet} reading{unsentOnSheet === 1 ? ' typed on the sheet is' : 's typed on the sheet are'} not sent yet; they are sent after the import and replace its values for those cores.</Caption1> : null}
          </div>
        ) : null}

      </DialogContent>
      {/* Beside the buttons, so the progress is in view however far the mapping scrolls. */}
      <DialogActions position="start" className={s.status}>
        {phase.kind === 'sending' ? (
          <>
            <Caption1>Uploading {file?.name}: {Math.round(phase.progress * 100)} %</Caption1>
            <ProgressBar value={phase.progress} max={1} thickness="large" aria-label="Import upload progress" />
          </>
        ) : phase.kind === 'saving' ? (
          <>
            <Caption1>Uploaded 100 %. The server is checking every row and saving…</Caption1>
            <ProgressBar thickness="large" aria-label="Import upload progress" />
          </>
        ) : null}
      </DialogActions>
      <DialogActions>
        <Button className={s.touch} disabled={phase.kind === 'saving'} onClick={onClose}>{phase.kind === 'sending' ? 'Cancel upload' : 'Close'}</Button>
        {phase.kind !== 'done' ? (
          <Button className={s.touch} appearance="primary" disabled={!check.mapping || busy || !csv} onClick={() => void run()}>
            {busy ? 'Importing…' : 'Import'}
          </Button>
        ) : null}
      </DialogActions>
    </DialogBody>
  );
}

/**
 * "Import gauge CSV" on the bench sheet: the button and its dialog. `onImported` runs when the
 * dialog closes after an import went in, so the sheet can start afresh from the stored readings.
 */
export function ImportGaugeCsv({ lot, plan, unsentOnSheet = 0, onImported, className }: { lot: Lot; plan: Plan; unsentOnSheet?: number; onImported: () => void; className?: string }) {
  const s = useStyles();
  const [open, setOpen] = useState(false);
  const imported = useRef(false);
  const saving = useRef(false);
  const onSaving = useCallback((v: boolean) => {
    saving.current = v;
  }, []);
  const close = () => {
    if (saving.current) return;
    setOpen(false);
    if (imported.current) {
      imported.current = false;
      onImported();
    }
  };
  return (
    <>
      <Button className={className} onClick={() => setOpen(true)}>Import gauge CSV</Button>
      <Dialog open={open} modalType="modal" onOpenChange={(_, d) => !d.open && close()}>
        <DialogSurface className={s.surface} aria-label="Import gauge CSV">
          {open ? <ImportBody lot={lot} plan={plan} unsentOnSheet={unsentOnSheet} onClose={close} onSaving={onSaving} onSucceeded={() => {
            imported.current = true;
          }} /> : null}
        </DialogSurface>
      </Dialog>
    </>
  );
}
