import { Button, Caption1, Table, TableBody, TableCell, TableHeader, TableRow, ToggleButton, makeStyles, tokens } from '@fluentui/react-components';
import { useMemo, useState } from 'react';
import { LEDGER_KIND_LABELS, type LedgerEvent, type LedgerKind } from '@shared/schemas/ledger';
import type { StoredSampling } from '@shared/schemas/receiving';
import { HeadCell } from '../../../components/data-table';
import { StatusPill, type Tone } from '../../../components/status-pill';
import { verdigris, copper } from '../../../theme/theme';
import { formatClock, formatDay } from '../../../lib/format';

const useStyles = makeStyles({
  filters: { display: 'flex', gap: '6px', flexWrap: 'wrap', marginBottom: '12px' },
  touch: { minHeight: '44px' },
  list: { listStyle: 'none', margin: 0, padding: 0, position: 'relative' },
  item: {
    display: 'grid',
    gridTemplateColumns: '104px 20px minmax(0, 1fr)',
    columnGap: '12px',
    paddingBottom: '14px',
    '@media (max-width: 700px)': { gridTemplateColumns: '92px 20px minmax(0, 1fr)' },
  },
  when: { textAlign: 'right', fontVariantNumeric: 'tabular-nums', color: tokens.colorNeutralForeground2, fontSize: tokens.fontSizeBase200, paddingTop: '3px' },
  day: { display: 'block', fontWeight: 600, color: tokens.colorNeutralForeground1 },
  rail: { position: 'relative', display: 'flex', justifyContent: 'center' },
  line: { position: 'absolute', top: '0', bottom: '-14px', width: '2px', backgroundColor: tokens.colorNeutralStroke2 },
  dot: { position: 'relative', marginTop: '5px', width: '12px', height: '12px', borderRadius: '50%', border: `2px solid ${tokens.colorNeutralBackground1}`, boxSizing: 'content-box' },
  body: { minWidth: 0, display: 'flex', flexDirection: 'column', gap: '3px' },
  head: { display: 'flex', alignItems: 'center', gap: '8px', flexWrap: 'wrap' },
  title: { fontWeight: 600 },
  auditTitle: { fontWeight: 400, fontFamily: tokens.fontFamilyMonospace, fontSize: tokens.fontSizeBase200 },
  detail: { color: tokens.colorNeutralForeground2, overflowWrap: 'anywhere' },
  actor: { color: tokens.colorNeutralForeground3, fontSize: tokens.fontSizeBase200 },
  facts: { display: 'flex', gap: '6px 16px', flexWrap: 'wrap', fontSize: tokens.fontSizeBase200 },
  fact: { color: tokens.colorNeutralForeground2 },
  gauges: { display: 'flex', gap: '6px', flexWrap: 'wrap' },
  gauge: {
    fontFamily: tokens.fontFamilyMonospace,
    fontSize: tokens.fontSizeBase200,
    padding: '1px 8px',
    borderRadius: tokens.borderRadiusMedium,
    border: `1px solid ${tokens.colorNeutralStroke2}`,
    backgroundColor: tokens.colorNeutralBackground2,
  },
  pre: {
    margin: '4px 0 0',
    padding: '8px 10px',
    backgroundColor: tokens.colorNeutralBackground3,
    borderRadius: tokens.borderRadiusMedium,
    fontSize: '12px',
    maxHeight: '280px',
    overflow: 'auto',
    whiteSpace: 'pre-wrap',
    overflowWrap: 'anywhere',
  },
  more: { alignSelf: 'flex-start', minHeight: '32px', paddingLeft: 0 },
  thumb: { width: '160px', height: 'auto', borderRadius: tokens.borderRadiusMedium, border: `1px solid ${tokens.colorNeutralStroke2}` },
  tableBox: { maxHeight: '320px', overflow: 'auto', border: `1px solid ${tokens.colorNeutralStroke2}`, borderRadius: tokens.borderRadiusMedium, marginTop: '4px' },
  // Short values side by side; the box scrolls sideways on a narrow tablet rather than wrapping tags.
  readingsTable: { width: 'auto', minWidth: '100%', '& td': { whiteSpace: 'nowrap' }, '& th': { whiteSpace: 'nowrap' } },
  num: { fontVariantNumeric: 'tabular-nums', whiteSpace: 'nowrap' },
  bad: { color: tokens.colorPaletteRedForeground1, fontWeight: 600 },
  empty: { color: tokens.colorNeutralForeground3, padding: '12px 0' },
});

const KIND_TONE: Record<LedgerKind, Tone> = {
  plan: 'neutral',
  received: 'info',
  readings: 'info',
  photo: 'neutral',
  decision: 'ok',
  switching: 'pending',
  audit: 'neutral',
  ncr: 'bad',
  disposition: 'pending',
  signature: 'info',
  scar: 'pending',
  'scar-step': 'pending',
};
const DOT: Record<LedgerKind, string> = {
  plan: '#7d8a87',
  received: verdigris[80],
  readings: verdigris[100],
  photo: '#7d8a87',
  decision: '#1d7a3e',
  switching: '#9a5b00',
  audit: '#a9b5b2',
  ncr: '#b3261e',
  disposition: copper.light,
  signature: verdigris[60],
  scar: copper.light,
  'scar-step': copper.dark,
};

type Filter = 'all' | 'inspection' | 'audit' | 'nonconformance';
const FILTERS: { value: Filter; label: string; kinds?: LedgerKind[] }[] = [
  { value: 'all', label: 'Everything' },
  { value: 'inspection', label: 'Inspection', kinds: ['plan', 'received', 'readings', 'photo', 'decision', 'switching'] },
  { value: 'audit', label: 'Audit records', kinds: ['audit'] },
  { value: 'nonconformance', label: 'NCR & corrective action', kinds: ['ncr', 'disposition', 'signature', 'scar', 'scar-step'] },
];

const clock = (iso: string) => formatClock(iso, true);
const num = (v: number | null) => (v == null ? '—' : String(Number(v.toFixed(4))));

export function samplingText(s: StoredSampling): string {
  if (s.kind === 'zero-acceptance') return `Zero acceptance · n ${s.sampleSize} · accept on 0${s.inspectAll ? ' · every core' : ''}`;
  return `Level ${s.level ?? '—'} · AQL ${s.aql ?? '—'} · ${s.severity} · code ${s.codeLetter ?? '—'} · n ${s.sampleSize} · Ac ${s.accept} / Re ${s.reject}${s.inspectAll ? ' · every core' : ''}`;
}

function ReadingsTable({ e }: { e: LedgerEvent }) {
  const s = useStyles();
  const rows = e.readings ?? [];
  return (
    <div className={s.tableBox}>
      <Table size="extra-small" className={s.readingsTable} aria-label="Readings of this save">
        <TableHeader>
          <TableRow>
            <HeadCell>Core</HeadCell>
            <HeadCell>Characteristic</HeadCell>
            <HeadCell>Result</HeadCell>
            <HeadCell>Gauge</HeadCell>
            <HeadCell>Gauge due (then)</HeadCell>
          </TableRow>
        </TableHeader>
        <TableBody>
          {rows.map((r) => {
            const bad = r.conforming === false || r.pass === false;
            const result = r.kind === 'attribute' ? (r.pass ? 'pass' : r.pass === false ? 'FAIL' : '—') : `${num(r.value)}${r.unit ? ` ${r.unit}` : ''}`;
            return (
              <TableRow key={`${r.serial}|${r.characteristicCode}`}>
                <TableCell className={s.num}>{r.serial}</TableCell>
                <TableCell>{r.characteristicCode}</TableCell>
                <TableCell className={bad ? `${s.num} ${s.bad}` : s.num}>{bad ? `✕ ${result}` : result}{r.note ? ` · ${r.note}` : ''}</TableCell>
                <TableCell>{r.gaugeAssetTag ?? '—'}</TableCell>
                <TableCell className={s.num}>{r.gaugeDueOn ?? '—'}</TableCell>
              </TableRow>
            );
          })}
        </TableBody>
      </Table>
    </div>
  );
}

function Entry({ e, last, newDay }: { e: LedgerEvent; last: boolean; newDay: boolean }) {
  const s = useStyles();
  const [open, setOpen] = useState(false);
  const tone = e.kind === 'decision' && /^Rejected/.test(e.title) ? 'bad' : KIND_TONE[e.kind];
  return (
    <li className={s.item} aria-label={`${LEDGER_KIND_LABELS[e.kind]}: ${e.title}`} data-kind={e.kind}>
      <div className={s.when}>
        {newDay ? <span className={s.day}>{formatDay(e.at)}</span> : null}
        {clock(e.at)}
      </div>
      <div className={s.rail} aria-hidden>
        {last ? null : <span className={s.line} />}
        <span className={s.dot} style={{ backgroundColor: tone === 'bad' ? '#b3261e' : DOT[e.kind] }} />
      </div>
      <div className={s.body}>
        <div className={s.head}>
          <StatusPill tone={tone}>{LEDGER_KIND_LABELS[e.kind]}</StatusPill>
          <span className={e.kind === 'audit' ? s.auditTitle : s.title}>{e.title}</span>
        </div>
        {e.detail ? <span className={s.detail}>{e.detail}</span> : null}
        {e.sampling ? <span className={s.facts}><span className={s.fact}>Sampling: {samplingText(e.sampling)}</span></span> : null}
        {e.switching ? (
          <span className={s.facts}>
            <span className={s.fact}>
              Switching then: {e.switching.severity} inspection · {e.switching.consecutiveAccepted} accepted in a row · score {e.switching.switchingScore}
              {e.switching.discontinued ? ' · acceptance stopped' : ''}
            </span>
          </span>
        ) : null}
        {e.gauges?.length ? (
          <span className={s.gauges} aria-label="Gauges used">
            {e.gauges.map((g) => (
              <span key={`${g.id}|${g.dueOn}`} className={s.gauge} title="Asset tag · calibration due date when the readings were taken">
                {g.assetTag} · due {g.dueOn ?? '—'}{g.overdueAtTime ? ' (overdue then!)' : ''}
              </span>
            ))}
          </span>
        ) : null}
        {e.photoId ? <img className={s.thumb} src={`/api/photos/${e.photoId}/thumbnail`} alt={e.title} loading="lazy" /> : null}
        {e.actor ? <span className={s.actor}>by {e.actor}</span> : null}
        {e.readings?.length || e.audit ? (
          <Button className={s.more} appearance="transparent" size="small" onClick={() => setOpen(!open)} aria-expanded={open}>
            {open ? 'Hide' : e.readings ? `Show the ${e.readings.length} readings` : 'Show the recorded change'}
          </Button>
        ) : null}
        {open && e.readings ? <ReadingsTable e={e} /> : null}
        {open && e.audit ? (
          <pre className={s.pre}>
            {`${e.audit.entity} ${e.audit.entityId}\n`}
            {e.audit.before != null ? `before: ${JSON.stringify(e.audit.before, null, 2)}\n` : ''}
            {e.audit.after != null ? `after: ${JSON.stringify(e.audit.after, null, 2)}\n` : ''}
            {`hash: ${e.audit.hash}`}
          </pre>
        ) : null}
      </div>
    </li>
  );
}

/** The lot's story, oldest first, one rail; filter to what an auditor is following. */
export function Timeline({ events }: { events: LedgerEvent[] }) {
  const s = useStyles();
  const [filter, setFilter] = useState<Filter>('all');
  const shown = useMemo(() => {
    const f = FILTERS.find((x) => x.value === filter);
    return f?.kinds ? events.filter((e) => f.kinds!.includes(e.kind)) : events;
  }, [events, filter]);
  return (
    <section aria-label="Timeline">
      <div className={s.filters} role="group" aria-label="Show">
        {FILTERS.map((f) => {
          const n = f.kinds ? events.filter((e) => f.kinds!.includes(e.kind)).length : events.length;
          return (
            <ToggleButton key={f.value} className={s.touch} checked={filter === f.value} appearance={filter === f.value ? 'primary' : 'secondary'} onClick={() => setFilter(f.value)}>
              {f.label} ({n})
            </ToggleButton>
          );
        })}
      </div>
      {shown.length ? (
        <ol className={s.list}>
          {shown.map((e, i) => <Entry key={e.key} e={e} last={i === shown.length - 1} newDay={i === 0 || formatDay(shown[i - 1].at) !== formatDay(e.at)} />)}
        </ol>
      ) : (
        <Caption1 className={s.empty}>Nothing of this kind for this lot.</Caption1>
      )}
    </section>
  );
}
