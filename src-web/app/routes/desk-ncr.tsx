import { Body1, Caption1, Subtitle1, makeStyles, tokens } from '@fluentui/react-components';
import { Link, useParams } from 'react-router-dom';
import { DISPOSITION_LABELS } from '@shared/schemas/ncr';
import { Page } from '../../components/page';
import { EmptyState } from '../../components/empty-state';
import { Loading } from '../../components/data-table';
import { paths } from '../../config/paths';
import { useSupplierNcr } from '../../features/ncrs/api/ncrs';
import { NcrStatusPill } from '../../features/ncrs/components/ncr-status';
import { NcrPhotos } from '../../features/ncrs/components/ncr-photos';
import { LinkedReadingsTable } from '../../features/ncrs/components/linked-readings';
import { formatDay } from '../../lib/format';

const useStyles = makeStyles({
  card: { border: `1px solid ${tokens.colorNeutralStroke2}`, borderRadius: tokens.borderRadiusLarge, padding: '14px 16px', marginBottom: '20px' },
  dl: { display: 'grid', gridTemplateColumns: 'max-content minmax(0, 1fr)', gap: '6px 14px', margin: 0 },
  dt: { color: tokens.colorNeutralForeground3 },
  dd: { margin: 0, whiteSpace: 'pre-wrap', overflowWrap: 'anywhere' },
  h2: { display: 'block', margin: '0 0 10px' },
  link: { color: tokens.colorBrandForeground1, fontWeight: 600 },
  muted: { color: tokens.colorNeutralForeground3 },
  back: { marginTop: '24px' },
});

/** A supplier's view of its own nonconformance: what was required, what was found, what became of the cores. */
export function DeskNcrPage() {
  const s = useStyles();
  const { id = '' } = useParams();
  const ncr = useSupplierNcr(id);
  if (ncr.isPending) return <Loading />;
  if (ncr.error) return <Page title="Nonconformance"><EmptyState title="There is no such nonconformance here" action={<Link className={s.link} to={paths.supplierDesk}>Back to the Supplier desk</Link>}>It may have been mistyped, or it concerns another company.</EmptyState></Page>;
  const n = ncr.data;
  return (
    <Page title={n.number} lead={n.title} actions={<NcrStatusPill status={n.status} />}>
      <div className={s.card}>
        <dl className={s.dl}>
          <dt className={s.dt}>Part</dt><dd className={s.dd}>{n.partNumber ? `${n.partNumber} rev ${n.partRevision}` : '—'}</dd>
          <dt className={s.dt}>Your lot</dt><dd className={s.dd}>{n.supplierLotNumber ?? '—'}{n.lotId ? <> (<Link className={s.link} to={paths.lot(n.lotId)}>lot #{n.lotRef}</Link>)</> : null}</dd>
          <dt className={s.dt}>Required</dt><dd className={s.dd}>{n.requirement}</dd>
          <dt className={s.dt}>Found</dt><dd className={s.dd}>{n.found}</dd>
          <dt className={s.dt}>Defect</dt><dd className={s.dd}>{n.defectCodes.join(', ')}</dd>
          <dt className={s.dt}>Suspect cores</dt><dd className={s.dd}>{n.suspectQuantity}</dd>
          <dt className={s.dt}>Raised</dt><dd className={s.dd}>{formatDay(n.raisedAt)}</dd>
          <dt className={s.dt}>Decided</dt>
          <dd className={s.dd}>{n.dispositions.length ? n.dispositions.map((d) => `${d.quantity} × ${DISPOSITION_LABELS[d.kind].toLowerCase()}`).join(', ') : 'Not yet decided'}</dd>
          {n.scarId ? (<><dt className={s.dt}>Corrective action</dt><dd className={s.dd}><Link className={s.link} to={paths.deskScar(n.scarId)}>{n.scarNumber}</Link></dd></>) : null}
        </dl>
      </div>
      {n.measured.length ? (
        <>
          <Subtitle1 as="h2" className={s.h2}>What we measured</Subtitle1>
          <div className={s.card}>
            <LinkedReadingsTable readings={n.measured} label="What we measured" />
          </div>
        </>
      ) : null}
      <Subtitle1 as="h2" className={s.h2}>Photos</Subtitle1>
      {n.photos.length ? <NcrPhotos ncrId={n.id} photos={n.photos} canAdd={false} /> : <Body1 as="p" block className={s.muted}>No photos.</Body1>}
      <Caption1 as="p" block className={s.back}><Link className={s.link} to={paths.supplierDesk}>Back to the Supplier desk</Link></Caption1>
    </Page>
  );
}
