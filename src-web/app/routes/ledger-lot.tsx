import { Caption1, MessageBar, MessageBarBody, Subtitle1, makeStyles, tokens } from '@fluentui/react-components';
import { Link, useParams } from 'react-router-dom';
import { Page } from '../../components/page';
import { EmptyState } from '../../components/empty-state';
import { Loading } from '../../components/data-table';
import { StatusPill } from '../../components/status-pill';
import { LotStatusPill } from '../../features/lots/components/lot-status';
import { paths } from '../../config/paths';
import { exportUrls, useLedgerLot } from '../../features/ledger/api/ledger';
import { ChainBadge } from '../../features/ledger/components/chain-badge';
import { ExportButton } from '../../features/ledger/components/export-button';
import { PlanRevisions } from '../../features/ledger/components/plan-revisions';
import { Timeline, samplingText } from '../../features/ledger/components/timeline';
import { useCanReadLedger } from './ledger';
import { formatWhen } from '../../lib/format';

const useStyles = makeStyles({
  back: { display: 'inline-block', marginBottom: '8px', color: tokens.colorBrandForeground1 },
  actions: { display: 'flex', gap: '12px', alignItems: 'flex-start', flexWrap: 'wrap' },
  grid: { display: 'grid', gridTemplateColumns: 'minmax(0, 1.6fr) minmax(300px, 1fr)', gap: '28px', '@media (max-width: 1100px)': { gridTemplateColumns: '1fr' } },
  facts: {
    display: 'grid',
    gridTemplateColumns: 'max-content minmax(0, 1fr)',
    gap: '6px 14px',
    margin: '0 0 20px',
    padding: '14px 16px',
    border: `1px solid ${tokens.colorNeutralStroke2}`,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground2,
  },
  dt: { color: tokens.colorNeutralForeground3, fontWeight: 600 },
  dd: { margin: 0, overflowWrap: 'anywhere' },
  section: { marginBottom: '12px', display: 'block' },
  linked: { display: 'flex', gap: '8px', flexWrap: 'wrap' },
  notes: { marginBottom: '16px' },
  // On a tablet the columns stack: the facts come first, the long timeline after them.
  side: { '@media (max-width: 1100px)': { order: -1 } },
  link: { color: tokens.colorBrandForeground1 },
});

const when = (iso: string | null) => (iso ? formatWhen(iso) : '—');

/** One lot's whole story for an auditor: facts, the timeline, the plan's revisions, and the report. */
export function LedgerLotPage() {
  const s = useStyles();
  const { id = '' } = useParams();
  const canRead = useCanReadLedger();
  const q = useLedgerLot(id);
  if (!canRead) return <Page title="History ledger"><EmptyState title="The History ledger is for auditors, engineers and administrators" /></Page>;
  if (q.isPending) return <Page title="Lot story"><Loading label="Gathering the lot’s history" /></Page>;
  if (q.error) {
    return (
      <Page title="Lot story">
        <EmptyState title={q.error.message} action={<Link to={paths.ledger}>Back to the History ledger</Link>} />
      </Page>
    );
  }
  const { lot, events, plans, linked, notes } = q.data;
  return (
    <Page
      title={`Lot ${lot.ref} · ${lot.supplierLotNumber}`}
      lead={`${lot.supplierName} (${lot.supplierCode}) · ${lot.partNumber} rev ${lot.partRevision} · inspection plan rev ${lot.planRevision}`}
      actions={
        <div className={s.actions}>
          <ExportButton url={exportUrls.lotReport(lot.id)} label="Download PDF report" appearance="primary" />
          <ExportButton url={exportUrls.readings({ lotId: lot.id })} label="Export readings (CSV)" />
        </div>
      }
    >
      <Link className={s.back} to={paths.ledger}>← History ledger</Link>
      <ChainBadge />
      {notes.length ? (
        <MessageBar className={s.notes} intent="info"><MessageBarBody>{notes.join(' ')}</MessageBarBody></MessageBar>
      ) : null}
      <div className={s.grid}>
        <div>
          <Subtitle1 as="h2" className={s.section}>Timeline</Subtitle1>
          <Timeline events={events} />
        </div>
        <div className={s.side}>
          <Subtitle1 as="h2" className={s.section}>The lot</Subtitle1>
          <dl className={s.facts} aria-label="Lot facts">
            <dt className={s.dt}>Status</dt>
            <dd className={s.dd}><LotStatusPill status={lot.status} /></dd>
            <dt className={s.dt}>Quantity</dt>
            <dd className={s.dd}>{lot.quantity.toLocaleString()} cores · {lot.coreCount} sampled</dd>
            <dt className={s.dt}>Received</dt>
            <dd className={s.dd}>{when(lot.receivedAt)}{lot.receivedBy ? ` by ${lot.receivedBy}` : ''}</dd>
            <dt className={s.dt}>PO</dt>
            <dd className={s.dd}>{lot.poNumber ?? '—'}</dd>
            <dt className={s.dt}>Heat numbers</dt>
            <dd className={s.dd}>{lot.heatNumbers.join(', ') || '—'}</dd>
            <dt className={s.dt}>Sampling</dt>
            <dd className={s.dd}>{samplingText(lot.sampling)}</dd>
            <dt className={s.dt}>Decision</dt>
            <dd className={s.dd}>
              {lot.decision ? (
                <>
                  <StatusPill tone={lot.decision === 'accept' ? 'ok' : 'bad'}>{lot.decision === 'accept' ? 'Accepted' : 'Rejected'}</StatusPill> {when(lot.decidedAt)}{lot.decidedBy ? ` by ${lot.decidedBy}` : ''}
                </>
              ) : 'Not decided yet'}
            </dd>
            {linked.length ? (
              <>
                <dt className={s.dt}>Linked</dt>
                <dd className={s.dd}>
                  <span className={s.linked}>
                    {linked.map((x) => (
                      <Link key={x.id} className={s.link} to={x.entity === 'ncr' ? `${paths.ncrs}/${x.id}` : `${paths.scars}/${x.id}`}>{x.label} ({x.status})</Link>
                    ))}
                  </span>
                </dd>
              </>
            ) : null}
            <dt className={s.dt}>Lot file</dt>
            <dd className={s.dd}><Link className={s.link} to={paths.lot(lot.id)}>Open the lot file</Link></dd>
          </dl>
          <Subtitle1 as="h2" className={s.section}>Plan revisions of {lot.partNumber} rev {lot.partRevision}</Subtitle1>
          <Caption1 as="p" style={{ margin: '0 0 10px' }}>The highlighted revision is the one this lot was judged against.</Caption1>
          <PlanRevisions plans={plans} />
        </div>
      </div>
    </Page>
  );
}
