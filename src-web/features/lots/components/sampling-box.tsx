import { Caption1, makeStyles, tokens } from '@fluentui/react-components';
import type { StoredSampling } from '@shared/schemas/receiving';
import { StatusPill } from '../../../components/status-pill';

const useStyles = makeStyles({
  head: { display: 'flex', alignItems: 'baseline', gap: '8px', flexWrap: 'wrap', marginBottom: '10px' },
  big: { fontSize: tokens.fontSizeHero700, fontWeight: 700, lineHeight: tokens.lineHeightHero700, fontVariantNumeric: 'tabular-nums' },
  grid: { display: 'grid', gridTemplateColumns: 'repeat(3, minmax(0, 1fr))', gap: '8px 12px', margin: 0 },
  item: { display: 'flex', flexDirection: 'column', gap: '0', margin: 0, minWidth: 0 },
  term: { fontSize: tokens.fontSizeBase100, color: tokens.colorNeutralForeground3, fontWeight: 700, textTransform: 'uppercase', letterSpacing: '0.05em', whiteSpace: 'nowrap' },
  value: { margin: 0, fontSize: tokens.fontSizeBase400, fontWeight: 600, fontVariantNumeric: 'tabular-nums' },
  foot: { display: 'flex', gap: '8px', alignItems: 'center', flexWrap: 'wrap', marginTop: '12px', color: tokens.colorNeutralForeground3 },
});

export const SEVERITY_LABELS: Record<StoredSampling['severity'], string> = { normal: 'Normal', tightened: 'Tightened', reduced: 'Reduced' };
const SEVERITY_TONE = { normal: 'info', tightened: 'pending', reduced: 'ok' } as const;

/** The stored sampling of a lot: what to pull from the pallet and what the sample may contain. */
export function SamplingBox({ sampling, quantity }: { sampling: StoredSampling; quantity: number }) {
  const s = useStyles();
  const items: [string, string][] = [];
  if (sampling.kind === 'aql') items.push(['Code letter', sampling.codeLetter ?? '—'], ['Plan letter', sampling.planLetter ?? '—']);
  items.push(['Ac', String(sampling.accept)], ['Re', String(sampling.reject)]);
  if (sampling.kind === 'aql') items.push(['AQL', sampling.aql != null ? String(sampling.aql) : '—'], ['Level', sampling.level ?? '—']);
  return (
    <div aria-label="Sampling" role="group">
      <div className={s.head}>
        <span className={s.big}>{sampling.sampleSize} of {quantity}{sampling.inspectAll ? ' · 100 %' : ''}</span>
        <Caption1>cores to inspect</Caption1>
      </div>
      <dl className={s.grid}>
        {items.map(([k, v]) => (
          <div key={k} className={s.item}>
            <dt className={s.term}>{k}</dt>
            <dd className={s.value}>{v}</dd>
          </div>
        ))}
      </dl>
      <div className={s.foot}>
        {sampling.kind === 'aql' ? <StatusPill tone={SEVERITY_TONE[sampling.severity]}>{SEVERITY_LABELS[sampling.severity]} inspection</StatusPill> : <StatusPill tone="info">Zero acceptance (c = 0)</StatusPill>}
        {sampling.inspectAll ? <StatusPill tone="pending">Every core inspected</StatusPill> : null}
        <Caption1>{sampling.table}</Caption1>
      </div>
    </div>
  );
}

/** One line for messages: "3 cores · code A, plan B · Ac 0 / Re 1 · normal inspection". */
export function samplingSummary(sm: StoredSampling): string {
  const cores = `${sm.sampleSize} core${sm.sampleSize === 1 ? '' : 's'}${sm.inspectAll ? ' (100 %)' : ''}`;
  const letters = sm.kind === 'aql' && sm.codeLetter ? ` · code letter ${sm.codeLetter}, plan ${sm.planLetter}` : sm.kind === 'zero-acceptance' ? ' · zero acceptance' : '';
  return `${cores}${letters} · Ac ${sm.accept} / Re ${sm.reject} · ${SEVERITY_LABELS[sm.severity].toLowerCase()} inspection`;
}
