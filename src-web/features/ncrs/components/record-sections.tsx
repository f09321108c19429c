import { Caption1, Field, Select, makeStyles, tokens } from '@fluentui/react-components';
import type { z } from 'zod';
import type { historyEntrySchema } from '@shared/schemas/ncr';
import { actionLabel } from './ncr-status';
import { formatWhen } from '../../../lib/format';

// Parts shared by the NCR and corrective-action pages: their history list and the state filter
// of their lists.

const useStyles = makeStyles({
  muted: { color: tokens.colorNeutralForeground3 },
  history: { listStyle: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: '6px', maxWidth: '760px' },
  event: { display: 'grid', gridTemplateColumns: '190px minmax(0, 1fr)', gap: '12px', borderLeft: `3px solid ${tokens.colorBrandStroke2}`, paddingLeft: '12px' },
  filter: { minWidth: '200px' },
});

type HistoryEntry = z.infer<typeof historyEntrySchema>;

/** Who did what and when, oldest first, as the audit history of the record tells it. */
export function HistoryList({ entries }: { entries: readonly HistoryEntry[] }) {
  const s = useStyles();
  return (
    <ol className={s.history}>
      {entries.map((h, i) => (
        <li key={i} className={s.event}>
          <Caption1 className={s.muted}>{formatWhen(h.at)}</Caption1>
          <span>{actionLabel(h.action)}{h.detail ? ` ${h.detail}` : ''}{h.actorEmail ? ` · ${h.actorEmail}` : ''}{h.reason ? ` — ${h.reason}` : ''}</span>
        </li>
      ))}
    </ol>
  );
}

/** The "State" filter of a list: all, not closed, or one state. */
export function StateFilter<S extends string>({ value, states, labels, onChange }: { value: S | 'active' | undefined; states: readonly S[]; labels: Record<S, string>; onChange: (v: S | 'active' | undefined) => void }) {
  const s = useStyles();
  return (
    <Field label="State">
      <Select className={s.filter} value={value ?? ''} onChange={(_, d) => onChange((d.value || undefined) as S | 'active' | undefined)}>
        <option value="">All</option>
        <option value="active">Not closed</option>
        {states.map((x) => <option key={x} value={x}>{labels[x]}</option>)}
      </Select>
    </Field>
  );
}
