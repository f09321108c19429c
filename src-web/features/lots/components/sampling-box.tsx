import { Caption1, makeStyles, tokens } from '@fluentui/react-components';
import type { StoredSampling } from '@shared/schemas/receiving';
import { StatusPill } from '../../../components/status-pill';

const useStyles = makeStyles({
  grid: { display: 'grid', gridTemplateColumns: 'repeat(auto-fill, minmax(92px, 1fr))', gap: '10px 14px', margin: 0 },
  item: { display: 'flex', flexDirection: 'column', gap: '2px', margin: 0 },
  term: { fontSize: tokens.fontSizeBase200, color: tokens.colorNeutralForeground3, fontWeight: 600, textTransform: 'uppercase', letterSpacing: '0.04em' },
  value: { margin: 0, fontSize: tokens.fontSizeBase500, fontWeight: 600, fontVariantNumeric: 'tabular-nums', lineHeight: tokens.lineHeightBase500 },
  foot: { display: 'flex', gap: '8px', alignItems: 'center', flexWrap: 'wrap', marginTop: '10px', color: tokens.colorNeutralForeground3 },
});

export const SEVERITY_LABELS: Record<StoredSampling['severity'], string> = { normal: 'Normal', tightened: 'Tightened', reduced: 'Reduced' };
const SEVERITY_TONE = { normal: 'info', tightened: 'pending', reduced: 'ok' } as const;

/** The stored sampling of a lot: what to pull from the pallet and what the sample may contain. */
export function SamplingBox({ sampling, quantity }: { sampling: StoredSampling; quantity: number }) {
  const s = useStyles();
  const items: [string, string][] = [
    ['Sample', sampling.inspectAll ? `${sampling.sampleSize} (100 %)` : `${sampling.sampleSize} of ${quantity}`],
    ['Ac', String(sampling.accept)],
    ['Re', String(sampling.reject)],
  ];
  if (sampling.kind === 'aql') {
    items.unshift(['Code letter', sampling.codeLetter ?? '—'], ['Plan letter', sampling.planLetter ?? '—']);
    items.push(['AQL', sampling.aql != null ? String(sampling.aql) : '—'], ['Level', sampling.level ?? '—']);
  }
  return (
    <div>
      <dl className={s.grid} aria-label="Sampling">
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
