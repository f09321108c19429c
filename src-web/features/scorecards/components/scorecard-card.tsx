import { Caption1, Subtitle2, makeStyles, tokens } from '@fluentui/react-components';
import { Suspense, lazy } from 'react';
import type { PeriodBucket } from '@shared/compute/scorecard';
import type { ScorecardSwitching, SupplierScorecard } from '@shared/schemas/scorecard';
import { StatusPill, type Tone } from '../../../components/status-pill';
import { Loading } from '../../../components/data-table';
import { formatCost, formatCount, formatPpm } from './format';

// recharts loads with the first card that draws a chart, not with the page.
const TrendChart = lazy(() => import('./trend-chart'));

const useStyles = makeStyles({
  card: {
    border: `1px solid ${tokens.colorNeutralStroke2}`,
    borderRadius: tokens.borderRadiusLarge,
    padding: '14px 16px',
    backgroundColor: tokens.colorNeutralBackground1,
    display: 'flex',
    flexDirection: 'column',
    gap: '10px',
    scrollMarginTop: '80px',
  },
  head: { display: 'flex', alignItems: 'baseline', justifyContent: 'space-between', gap: '8px', flexWrap: 'wrap' },
  code: { fontFamily: tokens.fontFamilyMonospace, color: tokens.colorNeutralForeground3, marginLeft: '6px' },
  figures: { display: 'grid', gridTemplateColumns: 'repeat(auto-fill, minmax(120px, 1fr))', gap: '8px 14px', margin: 0 },
  figure: { display: 'flex', flexDirection: 'column', margin: 0 },
  term: { color: tokens.colorNeutralForeground3, fontSize: tokens.fontSizeBase200 },
  value: { margin: 0, fontWeight: 700, fontSize: tokens.fontSizeBase400, fontVariantNumeric: 'tabular-nums' },
  ppm: { color: tokens.colorBrandForeground1 },
  switching: { display: 'flex', flexWrap: 'wrap', gap: '6px', alignItems: 'center' },
  muted: { color: tokens.colorNeutralForeground3 },
});

const SEVERITY_TONE: Record<ScorecardSwitching['severity'], Tone> = { normal: 'info', tightened: 'pending', reduced: 'ok' };
const SEVERITY_LABEL: Record<ScorecardSwitching['severity'], string> = { normal: 'Normal', tightened: 'Tightened', reduced: 'Reduced' };

function Figure({ term, value, strong }: { term: string; value: string; strong?: boolean }) {
  const s = useStyles();
  return (
    <div className={s.figure}>
      <dt className={s.term}>{term}</dt>
      <dd className={strong ? `${s.value} ${s.ppm}` : s.value}>{value}</dd>
    </div>
  );
}

/** One supplier's figures for the range, its switching state per part and its trend. */
export function ScorecardCard({ card, periods, rankedOf }: { card: SupplierScorecard; periods: PeriodBucket[]; rankedOf: number }) {
  const s = useStyles();
  const hasLots = card.trend.some((t) => t.lotsReceived > 0);
  return (
    <article className={s.card} id={`card-${card.supplierId}`} aria-label={`Scorecard of ${card.supplierName}`}>
      <div className={s.head}>
        <Subtitle2 as="h3">
          {card.supplierName}
          <span className={s.code}>{card.supplierCode}</span>
        </Subtitle2>
        {card.rank != null ? <StatusPill tone="info">Rank {card.rank} of {rankedOf}</StatusPill> : rankedOf > 0 ? <StatusPill tone="neutral">Not ranked: no lots</StatusPill> : null}
      </div>
      <dl className={s.figures}>
        <Figure term="PPM rejected" value={formatPpm(card.ppm)} strong />
        <Figure term="Lots received" value={formatCount(card.lots.received)} />
        <Figure term="Accepted" value={formatCount(card.lots.accepted)} />
        <Figure term="Rejected" value={formatCount(card.lots.rejected)} />
        {card.lots.undecided ? <Figure term="Not yet decided" value={formatCount(card.lots.undecided)} /> : null}
        <Figure term="Quantity received" value={formatCount(card.quantity.received)} />
        <Figure term="Quantity rejected" value={formatCount(card.quantity.rejected)} />
        <Figure term="SCARs issued" value={formatCount(card.scars.issued)} />
        <Figure term="Closed on time" value={`${card.scars.closedOnTime} of ${card.scars.issued - card.scars.open}`} />
        <Figure term="Overdue" value={formatCount(card.scars.overdue)} />
        <Figure term="Cost of poor quality" value={formatCost(card.costOfPoorQuality)} />
      </dl>
      <div className={s.switching}>
        <Caption1 className={s.muted}>Inspection now:</Caption1>
        {card.switching.length ? (
          card.switching.map((x) => (
            <StatusPill key={x.partId} tone={x.discontinued ? 'bad' : SEVERITY_TONE[x.severity]} title={`${x.consecutiveAccepted} lots accepted in a row on ${x.severity} inspection`}>
              {x.partNumber} rev {x.partRevision}: {x.discontinued ? 'Acceptance discontinued' : SEVERITY_LABEL[x.severity]}
            </StatusPill>
          ))
        ) : (
          <Caption1 className={s.muted}>no lots decided yet (normal inspection)</Caption1>
        )}
      </div>
      {hasLots ? (
        <Suspense fallback={<Loading label="Loading the trend" />}>
          <TrendChart trend={card.trend} periods={periods} supplierName={card.supplierName} />
        </Suspense>
      ) : (
        <Caption1 className={s.muted}>No lots received in this range.</Caption1>
      )}
    </article>
  );
}
