import { Button, Caption1, Field, Input, Select, Spinner, TableHeaderCell, makeStyles, mergeClasses, tokens } from '@fluentui/react-components';
import { useEffect, useState, type ReactNode } from 'react';

const useStyles = makeStyles({
  frame: {
    border: `1px solid ${tokens.colorNeutralStroke2}`,
    borderRadius: tokens.borderRadiusLarge,
    overflowX: 'auto',
    backgroundColor: tokens.colorNeutralBackground1,
    // Columns sized by their content (Fluent's tables split the width evenly by default).
    '& table': { tableLayout: 'auto' },
  },
  toolbar: { display: 'flex', flexWrap: 'wrap', alignItems: 'flex-end', gap: '12px', marginBottom: '12px' },
  sortBtn: {
    border: 'none',
    background: 'none',
    padding: 0,
    font: 'inherit',
    color: 'inherit',
    cursor: 'pointer',
    display: 'inline-flex',
    alignItems: 'center',
    gap: '6px',
    minHeight: '36px',
    fontWeight: 600,
    ':focus-visible': { outline: `2px solid ${tokens.colorBrandStroke1}`, outlineOffset: '2px', borderRadius: '2px' },
  },
  arrow: { color: tokens.colorBrandForeground1, fontSize: '11px', width: '10px' },
  pager: { display: 'flex', alignItems: 'center', justifyContent: 'space-between', gap: '12px', padding: '10px 12px', borderTop: `1px solid ${tokens.colorNeutralStroke2}`, flexWrap: 'wrap' },
  pagerBtns: { display: 'flex', gap: '8px', alignItems: 'center' },
  touch: { minHeight: '44px', minWidth: '44px' },
  loading: { padding: '24px', display: 'flex', justifyContent: 'center' },
  search: { minWidth: '260px' },
  select: { minWidth: '200px' },
  selectEl: { height: '44px' },
  headCell: { backgroundColor: tokens.colorNeutralBackground2, whiteSpace: 'nowrap' },
  toggleGroup: { display: 'flex', flexDirection: 'column', gap: '2px' },
  toggleLabel: { fontSize: tokens.fontSizeBase300, lineHeight: tokens.lineHeightBase300, color: tokens.colorNeutralForeground1, paddingBottom: '2px' },
  toggles: { display: 'flex', gap: '6px', flexWrap: 'wrap' },
});

/** The bordered, horizontally scrolling box every list table sits in (tablets are narrow). */
export function TableFrame({ children, footer, className }: { children: ReactNode; footer?: ReactNode; className?: string }) {
  const s = useStyles();
  return (
    <div className={mergeClasses(s.frame, className)}>
      {children}
      {footer}
    </div>
  );
}

export function ListToolbar({ children }: { children: ReactNode }) {
  return <div className={useStyles().toolbar}>{children}</div>;
}

/** A header cell that sorts the server-side list by `field` (`field` ascending, `-field` descending). */
export function SortHeader({ field, sort, onSort, children }: { field: string; sort: string | undefined; onSort: (s: string | undefined) => void; children: ReactNode }) {
  const s = useStyles();
  const dir = sort === field ? 'ascending' : sort === `-${field}` ? 'descending' : undefined;
  const next = dir === 'ascending' ? `-${field}` : field;
  return (
    <TableHeaderCell className={s.headCell} aria-sort={dir ?? 'none'}>
      <button type="button" className={s.sortBtn} onClick={() => onSort(next)} title={`Sort by ${typeof children === 'string' ? children.toLowerCase() : field}`}>
        {children}
        <span className={s.arrow} aria-hidden>{dir === 'ascending' ? '▲' : dir === 'descending' ? '▼' : '↕'}</span>
      </button>
    </TableHeaderCell>
  );
}

export function HeadCell({ children }: { children?: ReactNode }) {
  return <TableHeaderCell className={useStyles().headCell}>{children}</TableHeaderCell>;
}

/** Page n of m, with the row range; previous/next are large enough for a finger. */
export function Pager({ page, pageSize, total, onPage, fetching }: { page: number; pageSize: number; total: number; onPage: (p: number) => void; fetching?: boolean }) {
  const s = useStyles();
  const pages = Math.max(1, Math.ceil(total / pageSize));
  const first = total === 0 ? 0 : (page - 1) * pageSize + 1;
  const last = Math.min(total, page * pageSize);
  return (
    <nav className={s.pager} aria-label="Pages">
      <Caption1 aria-live="polite">
        {total === 0 ? 'Nothing to show' : `${first}–${last} of ${total}`}
        {fetching ? ' · loading…' : ''}
      </Caption1>
      <div className={s.pagerBtns}>
        <Button className={s.touch} disabled={page <= 1} onClick={() => onPage(page - 1)}>Previous</Button>
        <Caption1>Page {Math.min(page, pages)} of {pages}</Caption1>
        <Button className={s.touch} disabled={page >= pages} onClick={() => onPage(page + 1)}>Next</Button>
      </div>
    </nav>
  );
}

/** Search text that waits for a pause in typing before it asks the server. */
export function SearchInput({ value, onChange, label, placeholder }: { value: string; onChange: (v: string) => void; label: string; placeholder?: string }) {
  const s = useStyles();
  const [text, setText] = useState(value);
  useEffect(() => setText(value), [value]);
  useEffect(() => {
    if (text.trim() === value) return;
    const t = setTimeout(() => onChange(text.trim()), 300);
    return () => clearTimeout(t);
  }, [text, value, onChange]);
  return (
    <Field label="Search">
      <Input className={mergeClasses(s.search, s.touch)} type="search" aria-label={label} placeholder={placeholder ?? label} value={text} onChange={(_, d) => setText(d.value)} />
    </Field>
  );
}

/** A labelled list filter; the empty choice means "all". */
export function FilterSelect({ label, value, allLabel, options, onChange }: { label: string; value: string | undefined; allLabel: string; options: readonly { value: string; label: string }[]; onChange: (v: string | undefined) => void }) {
  const s = useStyles();
  return (
    <Field label={label}>
      <Select className={s.select} select={{ className: s.selectEl }} value={value ?? ''} onChange={(_, d) => onChange(d.value || undefined)}>
        <option value="">{allLabel}</option>
        {options.map((o) => <option key={o.value} value={o.value}>{o.label}</option>)}
      </Select>
    </Field>
  );
}

/** A labelled row of toggle-like buttons for a filter with few values. */
export function FilterToggles({ label, children }: { label: string; children: ReactNode }) {
  const s = useStyles();
  return (
    <div className={s.toggleGroup}>
      <span className={s.toggleLabel} aria-hidden>{label}</span>
      <div className={s.toggles} role="group" aria-label={label}>{children}</div>
    </div>
  );
}

export function Loading({ label = 'Loading' }: { label?: string }) {
  return (
    <div className={useStyles().loading}>
      <Spinner size="small" label={label} />
    </div>
  );
}
