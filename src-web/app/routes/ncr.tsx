import { Body1, Button, Caption1, MessageBar, MessageBarBody, MessageBarTitle, Table, TableBody, TableCell, TableHeader, TableRow, Textarea, Field, makeStyles, tokens } from '@fluentui/react-components';
import { useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { DISPOSITION_LABELS, NCR_SOURCE_LABELS, type Ncr } from '@shared/schemas/ncr';
import { LOT_STATUS_LABELS, type LotStatus } from '@shared/schemas/receiving';
import { Page } from '../../components/page';
import { EmptyState } from '../../components/empty-state';
import { HeadCell, Loading, TableFrame } from '../../components/data-table';
import { ConfirmDialog } from '../../components/confirm-dialog';
import { paths } from '../../config/paths';
import { ApiError } from '../../lib/api-client';
import { useMe } from '../../features/auth/api/get-me';
import { useNcr, useNcrTransition } from '../../features/ncrs/api/ncrs';
import { NcrStatusPill, formatMoney } from '../../features/ncrs/components/ncr-status';
import { LinkedReadingsTable } from '../../features/ncrs/components/linked-readings';
import { HistoryList } from '../../features/ncrs/components/record-sections';
import { Section } from '../../components/section';
import { NcrPhotos } from '../../features/ncrs/components/ncr-photos';
import { ReviewBoard } from '../../features/ncrs/components/review-board';
import { IssueScarDialog } from '../../features/ncrs/components/issue-scar-dialog';
import { formatWhen } from '../../lib/format';

const useStyles = makeStyles({
  head: { display: 'flex', gap: '8px', alignItems: 'center', flexWrap: 'wrap' },
  touch: { minHeight: '44px' },
  top: { display: 'grid', gridTemplateColumns: 'minmax(260px, 1fr) minmax(0, 2fr)', gap: '16px', marginBottom: '24px', '@media (max-width: 1000px)': { gridTemplateColumns: '1fr' } },
  card: { border: `1px solid ${tokens.colorNeutralStroke2}`, borderRadius: tokens.borderRadiusLarge, padding: '14px 16px', backgroundColor: tokens.colorNeutralBackground1, minWidth: 0 },
  h3: { display: 'block', fontSize: tokens.fontSizeBase300, fontWeight: 700, textTransform: 'uppercase', letterSpacing: '0.05em', color: tokens.colorNeutralForeground3, margin: '0 0 10px' },
  dl: { display: 'grid', gridTemplateColumns: 'max-content minmax(0, 1fr)', gap: '6px 14px', margin: 0 },
  dt: { color: tokens.colorNeutralForeground3 },
  dd: { margin: 0, overflowWrap: 'anywhere' },
  vs: { display: 'grid', gridTemplateColumns: '1fr 1fr', gap: '16px', '@media (max-width: 700px)': { gridTemplateColumns: '1fr' } },
  label: { display: 'block', color: tokens.colorNeutralForeground3, marginBottom: '2px' },
  req: { display: 'block', whiteSpace: 'pre-wrap', margin: 0 },
  found: { display: 'block', whiteSpace: 'pre-wrap', margin: 0, color: tokens.colorPaletteRedForeground1, fontWeight: 600 },
  codes: { display: 'flex', gap: '6px', flexWrap: 'wrap', marginTop: '12px' },
  code: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 700, border: `1px solid ${tokens.colorNeutralStroke1}`, borderRadius: '4px', padding: '1px 6px' },
  link: { color: tokens.colorBrandForeground1, fontWeight: 600 },
  num: { textAlign: 'right', fontVariantNumeric: 'tabular-nums' },
  muted: { color: tokens.colorNeutralForeground3 },
  hash: { fontFamily: tokens.fontFamilyMonospace, fontSize: tokens.fontSizeBase200, overflowWrap: 'anywhere' },
  sig: { borderLeft: `3px solid ${tokens.colorBrandStroke1}`, paddingLeft: '12px', margin: '0 0 10px' },
  banner: { marginBottom: '16px' },
});

function Facts({ n }: { n: Ncr }) {
  const s = useStyles();
  return (
    <div className={s.card}>
      <h3 className={s.h3}>Facts</h3>
      <dl className={s.dl}>
        <dt className={s.dt}>Raised from</dt><dd className={s.dd}>{NCR_SOURCE_LABELS[n.source]}</dd>
        <dt className={s.dt}>Supplier</dt><dd className={s.dd}>{n.supplierCode ? `${n.supplierCode} · ${n.supplierName}` : '—'}</dd>
        <dt className={s.dt}>Part</dt><dd className={s.dd}>{n.partNumber ? `${n.partNumber} rev ${n.partRevision}` : '—'}</dd>
        <dt className={s.dt}>Lot</dt>
        <dd className={s.dd}>
          {n.lot ? <><Link className={s.link} to={paths.lot(n.lot.id)}>#{n.lot.ref}</Link> · {n.lot.supplierLotNumber} · {n.lot.quantity} cores · <strong>{LOT_STATUS_LABELS[n.lot.status as LotStatus] ?? n.lot.status}</strong></> : '—'}
        </dd>
        <dt className={s.dt}>Suspect</dt><dd className={s.dd}><strong>{n.suspectQuantity} cores</strong></dd>
        {n.characteristicCode ? (<><dt className={s.dt}>Characteristic</dt><dd className={s.dd}>{n.characteristicCode}</dd></>) : null}
        {n.signalId ? (<><dt className={s.dt}>Drift signal</dt><dd className={s.dd}><Link className={s.link} to={n.supplierId && n.partId && n.characteristicCode ? paths.driftChart(n.supplierId, n.partId, n.characteristicCode) : paths.drift}>{n.characteristicCode ? `${n.characteristicCode} control chart` : 'on Drift watch'}</Link></dd></>) : null}
        <dt className={s.dt}>Raised</dt><dd className={s.dd}>{formatWhen(n.raisedAt)}{n.raisedByName ? ` by ${n.raisedByName}` : ''}</dd>
        {n.scarId ? (<><dt className={s.dt}>Corrective action</dt><dd className={s.dd}><Link className={s.link} to={paths.scar(n.scarId)}>{n.scarNumber}</Link></dd></>) : null}
      </dl>
    </div>
  );
}

function Dispositions({ n }: { n: Ncr }) {
  const s = useStyles();
  return (
    <>
      <TableFrame>
        <Table aria-label="Dispositions" size="small">
          <TableHeader>
            <TableRow>
              <HeadCell>Disposition</HeadCell>
              <HeadCell>Cores</HeadCell>
              <HeadCell>Rationale</HeadCell>
              <HeadCell>Concession</HeadCell>
              <HeadCell>Cost</HeadCell>
            </TableRow>
          </TableHeader>
          <TableBody>
            {n.dispositions.map((d) => (
              <TableRow key={d.id}>
                <TableCell><strong>{DISPOSITION_LABELS[d.kind]}</strong></TableCell>
                <TableCell className={s.num}>{d.quantity}</TableCell>
                <TableCell>{d.rationale}</TableCell>
                <TableCell>{d.concessionRef ?? '—'}</TableCell>
                <TableCell className={s.num} title={[d.hours != null && d.rate != null ? `${d.hours} h × ${d.rate}` : null, d.scrapValue ? `scrap ${d.scrapValue}` : null, d.freight ? `freight ${d.freight}` : null].filter(Boolean).join(' + ')}>{formatMoney(d.cost)}</TableCell>
              </TableRow>
            ))}
            <TableRow>
              <TableCell><strong>Total</strong></TableCell>
              <TableCell className={s.num}><strong>{n.dispositions.reduce((t, d) => t + d.quantity, 0)}</strong></TableCell>
              <TableCell />
              <TableCell />
              <TableCell className={s.num}><strong>{formatMoney(n.totalCost)}</strong></TableCell>
            </TableRow>
          </TableBody>
        </Table>
      </TableFrame>
      <div style={{ marginTop: 14 }} aria-label="Signatures">
        {n.signatures.map((g) => (
          <div key={g.id} className={s.sig}>
            <Body1 block><strong>{g.signerName}</strong> ({g.signerEmail}) — “{g.meaning}”</Body1>
            <Caption1 block className={s.muted}>{g.purpose === 'concession' ? 'Second signature (concession)' : 'E-signed'} {formatWhen(g.signedAt)} · SHA-256 <span className={s.hash}>{g.contentHash}</span></Caption1>
          </div>
        ))}
      </div>
    </>
  );
}

export function NcrPage() {
  const s = useStyles();
  const { id = '' } = useParams();
  const navigate = useNavigate();
  const { data: me } = useMe();
  const ncr = useNcr(id);
  const move = useNcrTransition();
  const [closing, setClosing] = useState(false);
  const [note, setNote] = useState('');
  const [issuing, setIssuing] = useState(false);
  const [justSigned, setJustSigned] = useState(false);

  if (ncr.isPending) return <Loading label="Opening the report" />;
  if (ncr.error) {
    const missing = ncr.error instanceof ApiError && (ncr.error.status === 404 || ncr.error.status === 400);
    return (
      <Page title="Nonconformance">
        <EmptyState title={missing ? 'There is no such report' : 'The report cannot be opened'} action={<Link className={s.link} to={paths.ncrs}>All reports</Link>}>{missing ? 'It may have been mistyped.' : ncr.error.message}</EmptyState>
      </Page>
    );
  }
  const n = ncr.data;
  const engineer = me?.role === 'engineer';
  const canAddPhotos = (me?.role === 'engineer' || me?.role === 'inspector') && n.status !== 'closed';
  const internalReader = me?.role !== 'supplier';
  // The exports' own roles (auditor, engineer, admin); others would get a 403 file.
  const exporter = me?.role === 'auditor' || me?.role === 'engineer' || me?.role === 'admin';

  return (
    <Page
      title={n.number}
      lead={n.title}
      actions={
        <div className={s.head}>
          <NcrStatusPill status={n.status} />
          {internalReader ? <Button className={s.touch} onClick={() => navigate(paths.ncrHoldTag(n.id))}>Print hold tag</Button> : null}
          {exporter ? <Button as="a" className={s.touch} href={`/api/exports/ncrs/${n.id}/report.pdf`} download>NCR report (PDF)</Button> : null}
          {engineer && n.status === 'open' ? (
            <Button className={s.touch} appearance="primary" disabled={move.isPending} onClick={() => move.mutate({ id: n.id, to: 'in-review', version: n.version })}>Start review</Button>
          ) : null}
          {engineer && n.supplierId && !n.scarId ? <Button className={s.touch} onClick={() => setIssuing(true)}>Issue corrective action</Button> : null}
          {engineer && n.status === 'dispositioned' ? <Button className={s.touch} onClick={() => setClosing(true)}>Close NCR</Button> : null}
        </div>
      }
    >
      {move.error ? <MessageBar className={s.banner} intent="error" role="alert"><MessageBarBody>{move.error.message}</MessageBarBody></MessageBar> : null}
      {justSigned && n.status === 'dispositioned' ? (
        <MessageBar className={s.banner} intent="success" role="status">
          <MessageBarBody><MessageBarTitle>Disposition signed</MessageBarTitle>The lot is now {n.lot ? LOT_STATUS_LABELS[n.lot.status as LotStatus]?.toLowerCase() : 'updated'}. {n.supplierId && !n.scarId ? 'Issue a corrective action if the supplier must find the cause.' : ''}</MessageBarBody>
        </MessageBar>
      ) : null}
      <div className={s.top}>
        <Facts n={n} />
        <div className={s.card}>
          <h3 className={s.h3}>Requirement and what was found</h3>
          <div className={s.vs}>
            <div><Caption1 className={s.label}>Required</Caption1><Body1 as="p" className={s.req}>{n.requirement}</Body1></div>
            <div><Caption1 className={s.label}>Found</Caption1><Body1 as="p" className={s.found}>{n.found}</Body1></div>
          </div>
          <div className={s.codes} aria-label="Defect codes">{n.defectCodes.map((c) => <span key={c} className={s.code}>{c}</span>)}</div>
        </div>
      </div>

      {n.readings.length || n.cores.length ? (
        <Section title="Linked cores and readings">
          {n.readings.length ? (
            <LinkedReadingsTable readings={n.readings} />
          ) : (
            <Body1>Cores {n.cores.map((c) => c.serial).join(', ')}</Body1>
          )}
        </Section>
      ) : null}

      <Section title="Photos">
        <NcrPhotos ncrId={n.id} photos={n.photos} canAdd={canAddPhotos} />
      </Section>

      <Section title="Review board">
        {n.dispositions.length ? (
          <Dispositions n={n} />
        ) : n.status === 'open' ? (
          <Body1 className={s.muted}>{engineer ? 'Start the review to record the dispositions.' : 'The quality engineer reviews this report and records its dispositions.'}</Body1>
        ) : engineer && n.status === 'in-review' && me ? (
          <ReviewBoard ncr={n} me={me} onSigned={() => setJustSigned(true)} />
        ) : (
          <Body1 className={s.muted}>In review: a quality engineer records the dispositions.</Body1>
        )}
      </Section>

      <Section title="History">
        <HistoryList entries={n.history} />
      </Section>

      <ConfirmDialog
        open={closing}
        title={`Close ${n.number}`}
        confirmLabel="Close the NCR"
        onClose={() => setClosing(false)}
        onConfirm={() => move.mutateAsync({ id: n.id, to: 'closed', version: n.version, note: note.trim() || null })}
      >
        <Body1>Close it once the dispositions have been carried out. The record stays as it is.</Body1>
        <Field label="Note for the record">
          <Textarea value={note} onChange={(_, d) => setNote(d.value)} rows={2} />
        </Field>
      </ConfirmDialog>
      {issuing ? <IssueScarDialog ncr={n} open onClose={() => setIssuing(false)} onIssued={(scar) => navigate(paths.scar(scar.id))} /> : null}
    </Page>
  );
}
