import { Caption1, Field, MessageBar, MessageBarBody, Select, Table, TableBody, TableCell, TableHeader, TableRow, makeStyles, tokens } from '@fluentui/react-components';
import type { PlanChange, PlanSummary } from '@shared/schemas/master-data';
import { HeadCell, Loading, TableFrame } from '../../../components/data-table';
import { StatusPill, type Tone } from '../../../components/status-pill';
import { usePlanChanges } from '../api/plans';
import { FIELD_LABELS, PLAN_STATUS_LABELS } from './plan-labels';

const useStyles = makeStyles({
  bar: { display: 'flex', alignItems: 'flex-end', gap: '16px', marginBottom: '12px', flexWrap: 'wrap' },
  code: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 600 },
  before: { color: tokens.colorNeutralForeground3, textDecoration: 'line-through', textDecorationColor: tokens.colorNeutralStroke1 },
  after: { fontWeight: 600 },
  arrow: { color: tokens.colorNeutralForeground3, padding: '0 6px' },
  value: { fontVariantNumeric: 'tabular-nums', overflowWrap: 'anywhere' },
  select: { minWidth: '240px' },
  name: { color: tokens.colorNeutralForeground3 },
});

const KIND: Record<PlanChange['kind'], { label: string; tone: Tone }> = {
  added: { label: 'Added', tone: 'ok' },
  removed: { label: 'Removed', tone: 'bad' },
  changed: { label: 'Changed', tone: 'pending' },
};

const nameOf = (v: unknown) => (v && typeof v === 'object' && 'name' in v ? String((v as { name: unknown }).name) : undefined);

/** A before/after value in words: numbers as they are, nothing as "—", a whole characteristic by its code and limits. */
export function formatValue(v: unknown): string {
  if (v === null || v === undefined || v === '') return '—';
  if (typeof v === 'boolean') return v ? 'yes' : 'no';
  if (typeof v === 'number' || typeof v === 'string') return String(v);
  if (Array.isArray(v)) return v.length ? v.map(formatValue).join(', ') : '—';
  if (typeof v === 'object') {
    const o = v as Record<string, unknown>;
    if ('code' in o && 'name' in o) {
      const limits = o.lsl != null || o.usl != null ? ` · ${o.lsl ?? '…'} to ${o.usl ?? '…'}${o.unit ? ` ${String(o.unit)}` : ''}` : '';
      return `${String(o.code)} ${String(o.name)}${limits}`;
    }
    return JSON.stringify(v);
  }
  return String(v);
}

/** What changed between this revision and the one it came from (or another revision of the part). */
export function PlanChanges({ planId, against, others, names, onAgainst }: {
  planId: string;
  against?: string;
  others: PlanSummary[];
  /** Characteristic code → name, to say which one a line is about. */
  names: Record<string, string>;
  onAgainst: (id: string | undefined) => void;
}) {
  const s = useStyles();
  const q = usePlanChanges(planId, against);
  if (q.isPending) return <Loading label="Comparing revisions" />;
  if (q.error) return <MessageBar intent="error" role="alert"><MessageBarBody>{q.error.message}</MessageBarBody></MessageBar>;
  const { from, to, changes } = q.data;
  return (
    <section aria-label="Changes">
      <div className={s.bar}>
        <Field label="Compare with">
          <Select className={s.select} value={against ?? ''} onChange={(_, d) => onAgainst(d.value || undefined)}>
            <option value="">The revision this one came from</option>
            {others.filter((o) => o.id !== planId).map((o) => (
              <option key={o.id} value={o.id}>Rev {o.revision} ({PLAN_STATUS_LABELS[o.status].toLowerCase()})</option>
            ))}
          </Select>
        </Field>
        <Caption1 role="status">
          {from ? `Rev ${from.revision} → rev ${to.revision}: ` : `Rev ${to.revision} is the first revision: `}
          {changes.length === 0 ? 'no changes.' : `${changes.length} change${changes.length === 1 ? '' : 's'}.`}
        </Caption1>
      </div>
      {changes.length ? (
        <TableFrame>
          <Table aria-label="Changes between revisions" size="small">
            <TableHeader>
              <TableRow>
                <HeadCell>Change</HeadCell>
                <HeadCell>Where</HeadCell>
                <HeadCell>Field</HeadCell>
                <HeadCell>Before → after</HeadCell>
              </TableRow>
            </TableHeader>
            <TableBody>
              {changes.map((c, i) => (
                <TableRow key={i}>
                  <TableCell><StatusPill tone={KIND[c.kind].tone}>{KIND[c.kind].label}</StatusPill></TableCell>
                  <TableCell>
                    {c.scope === 'sampling' ? 'Sampling rule' : (
                      <>
                        <span className={s.code}>{c.code ?? '—'}</span>
                        {c.code && (names[c.code] ?? nameOf(c.before)) ? <span className={s.name}> {names[c.code] ?? nameOf(c.before)}</span> : null}
                      </>
                    )}
                  </TableCell>
                  <TableCell>{c.field ? (FIELD_LABELS[c.field] ?? c.field) : c.scope === 'characteristic' ? 'Characteristic' : '—'}</TableCell>
                  <TableCell className={s.value}>
                    {c.kind === 'added' ? (
                      <span className={s.after}>{formatValue(c.after)}</span>
                    ) : c.kind === 'removed' ? (
                      <span className={s.before}>{formatValue(c.before)}</span>
                    ) : (
                      <>
                        <span className={s.before}>{formatValue(c.before)}</span>
                        <span className={s.arrow} aria-label="changed to">→</span>
                        <span className={s.after}>{formatValue(c.after)}</span>
                      </>
                    )}
                  </TableCell>
                </TableRow>
              ))}
            </TableBody>
          </Table>
        </TableFrame>
      ) : null}
    </section>
  );
}
