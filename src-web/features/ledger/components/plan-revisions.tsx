import { Caption1, Table, TableBody, TableCell, TableHeader, TableRow, makeStyles, tokens } from '@fluentui/react-components';
import { Link as RouterLink } from 'react-router-dom';
import type { LedgerPlan } from '@shared/schemas/ledger';
import type { PlanChange } from '@shared/schemas/master-data';
import { HeadCell, TableFrame } from '../../../components/data-table';
import { StatusPill, type Tone } from '../../../components/status-pill';
import { paths } from '../../../config/paths';
import { formatDay } from '../../../lib/format';

const useStyles = makeStyles({
  list: { display: 'flex', flexDirection: 'column', gap: '14px' },
  rev: { border: `1px solid ${tokens.colorNeutralStroke2}`, borderRadius: tokens.borderRadiusLarge, padding: '12px 14px' },
  lotPlan: { border: `2px solid ${tokens.colorBrandStroke1}` },
  head: { display: 'flex', gap: '10px', alignItems: 'center', flexWrap: 'wrap', marginBottom: '6px' },
  name: { fontWeight: 600, color: tokens.colorBrandForeground1, textDecoration: 'none', ':hover': { textDecoration: 'underline' } },
  muted: { color: tokens.colorNeutralForeground3 },
  code: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 600 },
  before: { color: tokens.colorNeutralForeground3, textDecoration: 'line-through' },
  after: { fontWeight: 600 },
  value: { overflowWrap: 'anywhere', fontVariantNumeric: 'tabular-nums' },
});

const STATUS_TONE: Record<string, Tone> = { draft: 'pending', active: 'ok', superseded: 'neutral' };
const CHANGE_TONE: Record<PlanChange['kind'], Tone> = { added: 'ok', removed: 'bad', changed: 'pending' };
const date = (iso: string | null) => (iso ? formatDay(iso) : '—');

function show(v: unknown): string {
  if (v === null || v === undefined || v === '') return '—';
  if (typeof v === 'object' && !Array.isArray(v)) {
    const o = v as Record<string, unknown>;
    if ('code' in o && 'name' in o) return `${String(o.code)} ${String(o.name)}${o.lsl != null || o.usl != null ? ` · ${String(o.lsl ?? '…')} to ${String(o.usl ?? '…')}${o.unit ? ` ${String(o.unit)}` : ''}` : ''}`;
    return JSON.stringify(v);
  }
  return Array.isArray(v) ? v.map(show).join(', ') : String(v);
}

/** Each revision of the part's inspection plan, newest first, with what changed from the one before. */
export function PlanRevisions({ plans }: { plans: LedgerPlan[] }) {
  const s = useStyles();
  if (!plans.length) return <Caption1 className={s.muted}>No plan revisions.</Caption1>;
  return (
    <div className={s.list}>
      {plans.map((p) => (
        <section key={p.id} className={p.isLotPlan ? `${s.rev} ${s.lotPlan}` : s.rev} aria-label={`Plan revision ${p.revision}`}>
          <div className={s.head}>
            <RouterLink to={paths.planChanges(p.id)} className={s.name}>Rev {p.revision}</RouterLink>
            <StatusPill tone={STATUS_TONE[p.status] ?? 'neutral'}>{p.status}</StatusPill>
            {p.isLotPlan ? <StatusPill tone="info">this lot’s plan</StatusPill> : null}
            <Caption1 className={s.muted}>
              created {date(p.createdAt)} · active {p.activatedAt ? `from ${date(p.activatedAt)}` : 'never'}{p.supersededAt ? ` to ${date(p.supersededAt)}` : ''}
            </Caption1>
          </div>
          <Caption1 className={s.muted}>
            {p.fromRevision == null
              ? 'The first revision of this part’s plan.'
              : p.changes.length === 0
                ? `No changes from rev ${p.fromRevision}.`
                : `${p.changes.length} change${p.changes.length === 1 ? '' : 's'} from rev ${p.fromRevision}:`}
          </Caption1>
          {p.changes.length && p.fromRevision != null ? (
            <TableFrame>
              <Table size="extra-small" aria-label={`Changes in rev ${p.revision}`}>
                <TableHeader>
                  <TableRow>
                    <HeadCell>Change</HeadCell>
                    <HeadCell>Where</HeadCell>
                    <HeadCell>Field</HeadCell>
                    <HeadCell>Before</HeadCell>
                    <HeadCell>After</HeadCell>
                  </TableRow>
                </TableHeader>
                <TableBody>
                  {p.changes.map((c, i) => (
                    <TableRow key={i}>
                      <TableCell><StatusPill tone={CHANGE_TONE[c.kind]}>{c.kind}</StatusPill></TableCell>
                      <TableCell>{c.scope === 'sampling' ? 'Sampling rule' : <span className={s.code}>{c.code ?? '—'}</span>}</TableCell>
                      <TableCell>{c.field ?? '—'}</TableCell>
                      <TableCell className={`${s.value} ${s.before}`}>{show(c.before)}</TableCell>
                      <TableCell className={`${s.value} ${s.after}`}>{show(c.after)}</TableCell>
                    </TableRow>
                  ))}
                </TableBody>
              </Table>
            </TableFrame>
          ) : null}
        </section>
      ))}
    </div>
  );
}
