import { Button, Menu, MenuDivider, MenuItem, MenuList, MenuPopover, MenuTrigger, makeStyles, mergeClasses, shorthands, tokens } from '@fluentui/react-components';
import { useEffect, useRef, type KeyboardEvent } from 'react';
import { CHART_KINDS, CHARACTERISTIC_KINDS, GAUGE_KIND_LABELS, GAUGE_KINDS, LAYOUT_LABELS, LAYOUTS, SEVERITY_CLASSES, UNITS } from '@shared/schemas/master-data';
import { CHART_LABELS, KIND_LABELS, LAYOUT_SHORT, SEVERITY_LABELS } from './plan-labels';
import { blankRow, newKey, readingsHint, type RowDraft } from './plan-draft';

const useStyles = makeStyles({
  wrap: { overflowX: 'auto', border: `1px solid ${tokens.colorNeutralStroke2}`, borderRadius: tokens.borderRadiusLarge, backgroundColor: tokens.colorNeutralBackground1 },
  table: { borderCollapse: 'separate', borderSpacing: 0, width: '100%', fontSize: tokens.fontSizeBase200, fontVariantNumeric: 'tabular-nums' },
  th: {
    textAlign: 'left', fontWeight: 600, padding: '8px 4px', whiteSpace: 'nowrap', backgroundColor: tokens.colorNeutralBackground2,
    borderBottom: `1px solid ${tokens.colorNeutralStroke2}`, color: tokens.colorNeutralForeground2,
  },
  thRead: { padding: '8px 10px' },
  td: { padding: '3px 3px', borderBottom: `1px solid ${tokens.colorNeutralStroke3}`, verticalAlign: 'middle' },
  tdRead: { padding: '8px 10px', whiteSpace: 'nowrap' },
  nameRead: { whiteSpace: 'normal', minWidth: '220px' },
  num: { textAlign: 'right' },
  // The first two columns stay in view when the table scrolls sideways; # is exactly 30 px wide so the code column can sit at left: 30px.
  stickyA: {
    position: 'sticky', left: 0, zIndex: 1, backgroundColor: tokens.colorNeutralBackground1, boxSizing: 'border-box', width: '30px', minWidth: '30px', maxWidth: '30px',
    textAlign: 'right', color: tokens.colorNeutralForeground3, paddingLeft: 0, paddingRight: '6px',
  },
  stickyB: { position: 'sticky', left: '30px', zIndex: 1, backgroundColor: tokens.colorNeutralBackground1, boxShadow: `1px 0 0 ${tokens.colorNeutralStroke2}` },
  stickyHeadA: { position: 'sticky', left: 0, zIndex: 2 },
  stickyHeadB: { position: 'sticky', left: '30px', zIndex: 2, boxShadow: `1px 0 0 ${tokens.colorNeutralStroke2}` },
  cell: {
    boxSizing: 'border-box', width: '100%', height: '34px', padding: '0 6px', font: 'inherit', color: tokens.colorNeutralForeground1,
    backgroundColor: tokens.colorNeutralBackground1, border: `1px solid ${tokens.colorNeutralStroke1}`, borderRadius: '4px',
    ':focus': { outline: `2px solid ${tokens.colorBrandStroke1}`, outlineOffset: '-1px', ...shorthands.borderColor(tokens.colorBrandStroke1) },
    ':disabled': { backgroundColor: tokens.colorNeutralBackgroundDisabled, color: tokens.colorNeutralForegroundDisabled, ...shorthands.borderColor(tokens.colorNeutralStrokeDisabled) },
  },
  numCell: { textAlign: 'right' },
  na: { display: 'block', textAlign: 'center', color: tokens.colorNeutralForeground4, userSelect: 'none' },
  naNum: { textAlign: 'right', paddingRight: '8px', color: tokens.colorNeutralForeground3 },
  codeCell: { fontFamily: tokens.fontFamilyMonospace, textTransform: 'uppercase', fontWeight: 600 },
  invalid: { ...shorthands.borderColor(tokens.colorPaletteRedBorder2), backgroundColor: tokens.colorPaletteRedBackground1, boxShadow: `inset 0 0 0 1px ${tokens.colorPaletteRedBorder2}` },
  check: { width: '20px', height: '20px', accentColor: tokens.colorBrandBackground, margin: '0 auto', display: 'block' },
  rowBtn: { minWidth: '40px', minHeight: '34px', padding: '0 8px' },
  marked: { fontWeight: 700 },
  dot: { color: tokens.colorPaletteRedForeground1, marginLeft: '2px' },
  actions: { display: 'flex', gap: '2px', justifyContent: 'flex-end' },
  add: { marginTop: '10px', minHeight: '44px' },
  code: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 600 },
  muted: { color: tokens.colorNeutralForeground3 },
});

type Field = keyof Omit<RowDraft, 'key'>;
interface Col {
  field: Field;
  label: string;
  head: string;
  width: number;
  type: 'text' | 'num' | 'select' | 'check';
  options?: readonly { value: string; label: string; title?: string }[];
  /** Whether the field means anything for this row (e.g. angles only for angle layouts). */
  applies?: (r: RowDraft) => boolean;
}

const opt = <T extends string>(values: readonly T[], labels: Record<T, string>) => values.map((v) => ({ value: v, label: labels[v] }));
const angleLayouts = new Set(['two-point', 'probed', 'heights']);

export const COLUMNS: Col[] = [
  { field: 'code', label: 'Code', head: 'Code', width: 136, type: 'text' },
  { field: 'name', label: 'Name', head: 'Name', width: 240, type: 'text' },
  { field: 'kind', label: 'Kind', head: 'Kind', width: 100, type: 'select', options: opt(CHARACTERISTIC_KINDS, KIND_LABELS) },
  { field: 'unit', label: 'Unit', head: 'Unit', width: 74, type: 'select', options: [{ value: '', label: '—' }, ...UNITS.map((u) => ({ value: u, label: u }))], applies: (r) => r.kind !== 'attribute' },
  { field: 'nominal', label: 'Nominal', head: 'Nominal', width: 84, type: 'num', applies: (r) => r.kind !== 'attribute' },
  { field: 'lsl', label: 'Lower limit', head: 'LSL', width: 84, type: 'num', applies: (r) => r.kind !== 'attribute' },
  { field: 'usl', label: 'Upper limit', head: 'USL', width: 84, type: 'num', applies: (r) => r.kind !== 'attribute' },
  { field: 'layout', label: 'Reading layout', head: 'Layout', width: 110, type: 'select', options: LAYOUTS.map((l) => ({ value: l, label: LAYOUT_SHORT[l], title: LAYOUT_LABELS[l] })) },
  { field: 'angles', label: 'Angles', head: 'Angles', width: 58, type: 'num', applies: (r) => angleLayouts.has(r.layout) },
  { field: 'levels', label: 'Levels', head: 'Levels', width: 58, type: 'num', applies: (r) => r.layout === 'probed' },
  { field: 'readingsPerSample', label: 'Readings per sample', head: 'Readings', width: 66, type: 'num', applies: (r) => r.layout === 'single' },
  { field: 'gaugeKind', label: 'Gauge kind', head: 'Gauge kind', width: 176, type: 'select', options: [{ value: '', label: '—' }, ...opt(GAUGE_KINDS, GAUGE_KIND_LABELS)] },
  { field: 'severity', label: 'Severity', head: 'Severity', width: 92, type: 'select', options: opt(SEVERITY_CLASSES, SEVERITY_LABELS) },
  { field: 'chartKind', label: 'Chart', head: 'Chart', width: 80, type: 'select', options: opt(CHART_KINDS, CHART_LABELS) },
  { field: 'wearDriven', label: 'Wear-driven', head: 'Wear', width: 52, type: 'check' },
];
/** Fields edited in the details dialog rather than a column. */
export const DETAIL_FIELDS: Field[] = ['method', 'derivedFormula', 'inputs', 'subgroupSize', 'ruleSet'];

const TITLES: Partial<Record<Field, string>> = {
  lsl: 'Lower specification limit',
  usl: 'Upper specification limit',
  readingsPerSample: 'Readings per sample (from the layout unless single)',
  wearDriven: 'Wear-driven: trend-forecast across lots (e.g. burr height as a die wears)',
  layout: 'How the bench sheet asks for the readings',
};

export const cellId = (i: number, field: string) => `ch-${i}-${field}`;
const rowName = (r: RowDraft, i: number) => (r.code.trim() ? r.code.trim().toUpperCase() : `row ${i + 1}`);

/** Keeps the row consistent when its kind or layout changes (attribute ↔ pass/fail). */
function patchRow(r: RowDraft, field: Field, value: string | boolean): RowDraft {
  const next = { ...r, [field]: value } as RowDraft;
  if (field === 'kind') {
    if (value === 'attribute') Object.assign(next, { layout: 'pass-fail', unit: '', chartKind: next.chartKind === 'none' ? 'none' : 'p' });
    else if (r.layout === 'pass-fail') Object.assign(next, { layout: 'single', unit: next.unit || 'mm' });
  }
  return next;
}

export interface CharacteristicsTableProps {
  rows: RowDraft[];
  readOnly: boolean;
  errors: Record<string, string>;
  onRows?: (rows: RowDraft[], touched?: string) => void;
  onDetails: (index: number) => void;
}

export function CharacteristicsTable({ rows, readOnly, errors, onRows, onDetails }: CharacteristicsTableProps) {
  const s = useStyles();
  const focusNext = useRef<string | null>(null);
  useEffect(() => {
    if (focusNext.current) {
      document.getElementById(focusNext.current)?.focus();
      focusNext.current = null;
    }
  });

  const set = (i: number, field: Field, value: string | boolean) => onRows?.(rows.map((r, j) => (j === i ? patchRow(r, field, value) : r)), `characteristics.${i}.${field}`);
  const move = (i: number, by: number) => {
    const j = i + by;
    if (j < 0 || j >= rows.length) return;
    const next = rows.slice();
    [next[i], next[j]] = [next[j], next[i]];
    onRows?.(next);
  };
  const remove = (i: number) => onRows?.(rows.filter((_, j) => j !== i));
  const insert = (at: number, row: RowDraft) => {
    const next = rows.slice();
    next.splice(at, 0, row);
    focusNext.current = cellId(at, 'code');
    onRows?.(next);
  };
  // Enter and the arrow keys walk a column, as on a paper sheet.
  const onKey = (i: number, field: Field) => (e: KeyboardEvent<HTMLInputElement>) => {
    const to = e.key === 'Enter' || e.key === 'ArrowDown' ? i + 1 : e.key === 'ArrowUp' ? i - 1 : null;
    if (to === null || to < 0 || to >= rows.length) return;
    e.preventDefault();
    document.getElementById(cellId(to, field))?.focus();
  };

  const renderCell = (r: RowDraft, i: number, c: Col) => {
    const key = `characteristics.${i}.${c.field}`;
    const err = errors[key];
    const applies = c.applies ? c.applies(r) : true;
    const label = `${c.label}, ${rowName(r, i)}`;
    const cls = mergeClasses(s.cell, c.type === 'num' && s.numCell, c.field === 'code' && s.codeCell, err && s.invalid);
    // A field that means nothing for this row (angles of a single value, the unit of a pass/fail check) shows as a dash,
    // and readings show the count the layout implies; they come back as inputs when the layout changes.
    if (!applies && !err) {
      const hint = c.field === 'readingsPerSample' ? readingsHint(r) : '';
      return <span className={mergeClasses(s.na, hint && hint !== '—' && s.naNum)} title={`${c.label}: does not apply to this row`} aria-label={`${label}: ${hint && hint !== '—' ? hint : 'not applicable'}`}>{hint || '—'}</span>;
    }
    const common = { id: cellId(i, c.field), 'aria-label': label, 'aria-invalid': err ? true : undefined, title: err ?? undefined };
    if (c.type === 'check') {
      return <input {...common} type="checkbox" className={s.check} checked={r.wearDriven} onChange={(e) => set(i, c.field, e.target.checked)} />;
    }
    if (c.type === 'select') {
      return (
        <select {...common} className={cls} value={String(r[c.field])} onChange={(e) => set(i, c.field, e.target.value)}>
          {c.options?.map((o) => <option key={o.value} value={o.value} title={o.title}>{o.label}</option>)}
        </select>
      );
    }
    return (
      <input
        {...common}
        className={cls}
        type="text"
        inputMode={c.type === 'num' ? 'decimal' : undefined}
        autoComplete="off"
        spellCheck={c.field === 'name'}
        value={String(r[c.field])}
        title={err ?? (c.field === 'name' ? r.name : undefined)}
        onChange={(e) => set(i, c.field, e.target.value)}
        onKeyDown={onKey(i, c.field)}
      />
    );
  };

  const readCell = (r: RowDraft, c: Col) => {
    const applies = c.applies ? c.applies(r) : true;
    if (!applies) return c.field === 'readingsPerSample' ? <span className={s.muted}>{readingsHint(r)}</span> : <span className={s.muted}>—</span>;
    if (c.type === 'check') return r.wearDriven ? 'Yes' : '—';
    if (c.type === 'select') return c.options?.find((o) => o.value === r[c.field])?.label ?? String(r[c.field]);
    const v = String(r[c.field]);
    return v === '' ? <span className={s.muted}>—</span> : c.field === 'code' ? <span className={s.code}>{v}</span> : v;
  };

  return (
    <>
      <div className={s.wrap}>
        <table className={s.table} aria-label="Characteristics">
          {/* Fixed widths while editing, so columns do not jump as you type; reading sizes to content. */}
          {readOnly ? null : (
            <colgroup>
              <col style={{ width: 30 }} />
              {COLUMNS.map((c) => <col key={c.field} style={{ width: c.width, minWidth: c.width }} />)}
              <col style={{ width: 130 }} />
            </colgroup>
          )}
          <thead>
            <tr>
              <th className={mergeClasses(s.th, s.stickyA, s.stickyHeadA)} scope="col"><abbr title="Position">#</abbr></th>
              {COLUMNS.map((c) => (
                <th
                  key={c.field}
                  scope="col"
                  className={mergeClasses(s.th, readOnly && s.thRead, c.type === 'num' && s.num, c.field === 'code' && s.stickyB, c.field === 'code' && s.stickyHeadB)}
                  title={TITLES[c.field] ?? c.label}
                >
                  {c.head}
                </th>
              ))}
              <th className={s.th} scope="col">{readOnly ? 'Method' : 'Method · row'}</th>
            </tr>
          </thead>
          <tbody>
            {rows.length === 0 ? (
              <tr><td className={s.td} colSpan={COLUMNS.length + 2}>No characteristics yet.</td></tr>
            ) : null}
            {rows.map((r, i) => {
              const detailErr = DETAIL_FIELDS.some((f) => errors[`characteristics.${i}.${f}`]) || !!errors[`characteristics.${i}`];
              return (
                <tr key={r.key}>
                  <td className={mergeClasses(s.td, s.stickyA)}>{i + 1}</td>
                  {COLUMNS.map((c) => (
                    <td key={c.field} className={mergeClasses(s.td, readOnly && s.tdRead, readOnly && c.type === 'num' && s.num, readOnly && c.field === 'name' && s.nameRead, c.field === 'code' && s.stickyB)}>
                      {readOnly ? readCell(r, c) : renderCell(r, i, c)}
                    </td>
                  ))}
                  <td className={s.td}>
                    <div className={s.actions}>
                      <Button
                        size="small"
                        appearance="subtle"
                        className={mergeClasses(s.rowBtn, detailErr && s.marked, !r.method && s.muted)}
                        aria-label={`Method and details, ${rowName(r, i)}`}
                        title={r.method || 'No method text yet'}
                        onClick={() => onDetails(i)}
                      >
                        {r.method ? 'Method' : readOnly ? '—' : '+ Method'}
                        {detailErr ? <span className={s.dot} aria-label="has errors">●</span> : null}
                      </Button>
                      {!readOnly ? (
                        <Menu positioning="below-end">
                          <MenuTrigger disableButtonEnhancement>
                            <Button size="small" appearance="subtle" className={s.rowBtn} aria-label={`Row actions, ${rowName(r, i)}`}>⋯</Button>
                          </MenuTrigger>
                          <MenuPopover>
                            <MenuList>
                              <MenuItem disabled={i === 0} onClick={() => move(i, -1)}>Move up</MenuItem>
                              <MenuItem disabled={i === rows.length - 1} onClick={() => move(i, 1)}>Move down</MenuItem>
                              <MenuItem onClick={() => insert(i + 1, blankRow())}>Insert a row below</MenuItem>
                              <MenuItem onClick={() => insert(i + 1, { ...r, key: newKey(), code: `${r.code}-2`.slice(0, 24) })}>Duplicate</MenuItem>
                              <MenuDivider />
                              <MenuItem onClick={() => remove(i)}>Remove</MenuItem>
                            </MenuList>
                          </MenuPopover>
                        </Menu>
                      ) : null}
                    </div>
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      {!readOnly ? (
        <Button className={s.add} onClick={() => insert(rows.length, blankRow())}>Add characteristic</Button>
      ) : null}
    </>
  );
}
