import { Body1, Button, Caption1, MessageBar, MessageBarActions, MessageBarBody, MessageBarTitle, Subtitle1, makeStaticStyles, makeStyles, mergeClasses, tokens } from '@fluentui/react-components';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { useCallback, useMemo, useRef, useState, type ReactNode } from 'react';
import { Link, useLocation, useParams } from 'react-router-dom';
import type { Lot } from '@shared/schemas/receiving';
import { Page } from '../../components/page';
import { EmptyState } from '../../components/empty-state';
import { Loading } from '../../components/data-table';
import { paths } from '../../config/paths';
import { ApiError } from '../../lib/api-client';
import { useMe } from '../../features/auth/api/get-me';
import { getPartQueryOptions } from '../../features/parts/api/parts';
import { getPlanQueryOptions } from '../../features/plans/api/plans';
import { certificateUrl, getLotQueryOptions, getProposalQueryOptions, useAttachCertificate, useLot } from '../../features/lots/api/lots';
import { useReadingQueue } from '../../features/lots/api/use-reading-queue';
import { usePhotoUploads } from '../../features/lots/api/use-photo-uploads';
import { BenchSheet } from '../../features/lots/components/bench-sheet';
import { ImportGaugeCsv } from '../../features/lots/components/import-dialog';
import { DecisionPanel } from '../../features/lots/components/decision-panel';
import { LotStatusPill, isOpenLot } from '../../features/lots/components/lot-status';
import { PhotoSection } from '../../features/lots/components/photos';
import { PACKAGING_LABELS } from '../../features/lots/components/receive-lot-dialog';
import { SamplingBox, samplingSummary } from '../../features/lots/components/sampling-box';
import { SwitchingBox } from '../../features/lots/components/switching-box';
import { formatWhen } from '../../lib/format';

// Printing the Lot file: the page alone, without the app's frame or its buttons.
const usePrintStyles = makeStaticStyles(`
@media print {
  header:has(a[aria-label="Yokeline home"]), nav[aria-label="Main"], .no-print { display: none !important; }
  div:has(> #main) { display: block !important; min-height: 0 !important; }
  #main { padding: 0 !important; }
  section { break-inside: avoid-page; }
}
`);

const useStyles = makeStyles({
  top: { display: 'grid', gridTemplateColumns: 'repeat(3, minmax(0, 1fr))', gap: '16px', marginBottom: '24px', '@media (max-width: 1100px)': { gridTemplateColumns: 'repeat(2, minmax(0, 1fr))' } },
  card: { border: `1px solid ${tokens.colorNeutralStroke2}`, borderRadius: tokens.borderRadiusLarge, padding: '14px 16px', backgroundColor: tokens.colorNeutralBackground1, minWidth: 0 },
  section: { marginBottom: '28px' },
  h2: { display: 'block', margin: '0 0 10px' },
  h3: { display: 'block', fontSize: tokens.fontSizeBase300, fontWeight: 700, textTransform: 'uppercase', letterSpacing: '0.05em', color: tokens.colorNeutralForeground3, margin: '0 0 10px' },
  dl: { display: 'grid', gridTemplateColumns: 'max-content minmax(0, 1fr)', gap: '6px 14px', margin: 0 },
  dt: { color: tokens.colorNeutralForeground3 },
  dd: { margin: 0, overflowWrap: 'anywhere' },
  heat: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 600, marginRight: '8px' },
  head: { display: 'flex', gap: '10px', alignItems: 'center', flexWrap: 'wrap' },
  bigStatus: { transform: 'scale(1.25)', transformOrigin: 'left center', marginRight: '12px' },
  touch: { minHeight: '44px' },
  hidden: { display: 'none' },
  link: { color: tokens.colorBrandForeground1, fontWeight: 600 },
  history: { listStyle: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: '8px', maxWidth: '760px' },
  event: { display: 'grid', gridTemplateColumns: '190px minmax(0, 1fr)', gap: '12px', borderLeft: `3px solid ${tokens.colorBrandStroke2}`, paddingLeft: '12px' },
  when: { color: tokens.colorNeutralForeground3, fontVariantNumeric: 'tabular-nums' },
  banner: { marginBottom: '16px' },
  muted: { color: tokens.colorNeutralForeground3 },
});

function Section({ title, children, className }: { title: string; children: ReactNode; className?: string }) {
  const s = useStyles();
  return (
    <section className={mergeClasses(s.section, className)} aria-label={title}>
      <Subtitle1 as="h2" className={s.h2}>{title}</Subtitle1>
      {children}
    </section>
  );
}

function Paperwork({ lot, canWrite }: { lot: Lot; canWrite: boolean }) {
  const s = useStyles();
  const attach = useAttachCertificate();
  const input = useRef<HTMLInputElement>(null);
  const [error, setError] = useState<string | null>(null);
  return (
    <div className={s.card}>
      <h3 className={s.h3}>Paperwork</h3>
      <dl className={s.dl}>
        <dt className={s.dt}>Supplier lot</dt>
        <dd className={s.dd}><strong>{lot.supplierLotNumber}</strong></dd>
        <dt className={s.dt}>PO</dt>
        <dd className={s.dd}>{lot.poNumber || '—'}</dd>
        <dt className={s.dt}>Heat / coil</dt>
        <dd className={s.dd}>{lot.heatNumbers.length ? lot.heatNumbers.map((h) => <span key={h} className={s.heat}>{h}</span>) : '—'}</dd>
        <dt className={s.dt}>Packaging</dt>
        <dd className={s.dd}>
          {PACKAGING_LABELS[lot.packagingCondition]}
          {lot.packagingNote ? <Caption1 className={s.muted}> — {lot.packagingNote}</Caption1> : null}
        </dd>
        <dt className={s.dt}>Certificate</dt>
        <dd className={s.dd}>
          {lot.certificate ? (
            <a className={s.link} href={certificateUrl(lot.id)} target="_blank" rel="noreferrer">{lot.certificate.name}</a>
          ) : (
            <span style={{ color: tokens.colorPaletteRedForeground1, fontWeight: 600 }}>Not attached</span>
          )}
          {canWrite ? (
            <>
              {' '}
              <Button className={mergeClasses(s.touch, 'no-print')} size="small" appearance="subtle" disabled={attach.isPending} onClick={() => input.current?.click()}>
                {attach.isPending ? 'Attaching…' : lot.certificate ? 'Replace' : 'Attach'}
              </Button>
              <input
                ref={input}
                className={s.hidden}
                type="file"
                accept="application/pdf,image/jpeg,image/png,image/webp"
                aria-label="Certificate of conformance"
                onChange={(e) => {
                  const file = e.target.files?.[0];
                  e.target.value = '';
                  if (!file) return;
                  setError(null);
                  attach.mutate({ id: lot.id, file }, { onError: (err) => setError(err.message) });
                }}
              />
            </>
          ) : null}
          {error ? <Caption1 role="alert" style={{ color: tokens.colorPaletteRedForeground1, display: 'block' }}>{error}</Caption1> : null}
        </dd>
        <dt className={s.dt}>Received</dt>
        <dd className={s.dd}>{formatWhen(lot.receivedAt)}</dd>
        <dt className={s.dt}>Plan</dt>
        <dd className={s.dd}>revision {lot.planRevision}</dd>
      </dl>
    </div>
  );
}

/** What the lot has been through so far, from its own record (the History ledger has every change). */
function History({ lot, ledger }: { lot: Lot; ledger: boolean }) {
  const s = useStyles();
  const entered = lot.readings.filter((r) => r.source === 'bench' || r.source === 'import').filter((r) => r.values.length || r.pass != null);
  const times = entered.map((r) => r.enteredAt).sort();
  const imported = entered.filter((r) => r.source === 'import').length;
  const events: { at: string; text: string }[] = [{ at: lot.receivedAt, text: `Received: ${lot.quantity} cores, sample of ${lot.sampling.sampleSize} (${samplingSummary(lot.sampling)}).` }];
  if (times.length) {
    events.push({ at: times[0], text: 'First reading entered.' });
    if (times.length > 1) events.push({ at: times[times.length - 1], text: `Latest reading: ${entered.length} readings on file${imported ? `, ${imported} imported from a gauge file` : ''}.` });
  }
  for (const p of lot.photos) events.push({ at: p.createdAt, text: `Photo added${p.caption ? `: ${p.caption}` : ''}.` });
  if (lot.decidedAt) events.push({ at: lot.decidedAt, text: `${lot.decision === 'accept' ? 'Accepted and released' : 'Rejected and put on hold'}${lot.decisionComment ? `: “${lot.decisionComment}”` : '.'}` });
  events.sort((a, b) => a.at.localeCompare(b.at));
  return (
    <>
      <ol className={s.history}>
        {events.map((e, i) => (
          <li key={i} className={s.event}>
            <span className={s.when}>{formatWhen(e.at)}</span>
            <span>{e.text}</span>
          </li>
        ))}
      </ol>
      <Caption1 className={s.muted}>
        Who changed what, and when, is kept in the History ledger
        {ledger ? <> (<Link className={s.link} to={paths.ledgerLot(lot.id)}>this lot&apos;s whole story</Link>)</> : null}.
      </Caption1>
    </>
  );
}

/**
 * Keyed by the lot, so going from one lot to another starts afresh: the outbox, uploads and
 * the sheet's entries belong to one lot and must never follow the inspector to the next.
 */
export function LotPage() {
  const { id = '' } = useParams();
  return <LotFile key={id} id={id} />;
}

function LotFile({ id }: { id: string }) {
  usePrintStyles();
  const s = useStyles();
  const location = useLocation();
  const arrival = (location.state ?? {}) as { received?: boolean; certError?: string | null };
  const qc = useQueryClient();
  const [dismissed, setDismissed] = useState(false);
  // Bumped after a gauge CSV import: the sheet starts afresh from the readings now stored.
  const [sheetRev, setSheetRev] = useState(0);
  const { data: me } = useMe();
  const internal = !!me && me.role !== 'supplier';
  const canWrite = me?.role === 'inspector' || me?.role === 'engineer';
  const lot = useLot(id);
  const plan = useQuery({ ...getPlanQueryOptions(lot.data?.planId ?? ''), enabled: !!lot.data && internal, staleTime: 10 * 60_000 });
  const part = useQuery({ ...getPartQueryOptions(lot.data?.partId ?? ''), enabled: !!lot.data && internal });
  const editable = canWrite && !!lot.data && isOpenLot(lot.data.status);

  const onSaved = useCallback(() => {
    void qc.invalidateQueries({ queryKey: getProposalQueryOptions(id).queryKey });
    void qc.invalidateQueries({ queryKey: getLotQueryOptions(id).queryKey });
  }, [qc, id]);
  const queue = useReadingQueue(id, { enabled: editable, onSaved });
  const photos = usePhotoUploads(id);
  const addPhotos = photos.add;
  const addCorePhotos = useCallback((files: File[], sampleId: string) => addPhotos(files, { sampleId }), [addPhotos]);
  const photoCounts = useMemo(() => {
    const m: Record<string, number> = {};
    for (const p of lot.data?.photos ?? []) if (p.sampleId) m[p.sampleId] = (m[p.sampleId] ?? 0) + 1;
    return m;
  }, [lot.data?.photos]);
  const benchPhotos = useMemo(() => (canWrite ? { counts: photoCounts, progress: photos.progressBySample, onAdd: addCorePhotos } : undefined), [canWrite, photoCounts, photos.progressBySample, addCorePhotos]);

  if (lot.isPending) return <Loading label="Opening the lot" />;
  if (lot.error) {
    const missing = lot.error instanceof ApiError && (lot.error.status === 404 || lot.error.status === 400);
    return (
      <Page title="Lot file">
        <EmptyState title={missing ? 'There is no such lot' : 'The lot cannot be opened'} action={<Link className={s.link} to={paths.lots}>All lots</Link>}>
          {missing ? 'It may have been mistyped, or it belongs to another supplier.' : lot.error.message}
        </EmptyState>
      </Page>
    );
  }
  const l = lot.data;
  const serialOf = new Map(l.samples.map((x) => [x.id, x.serial]));
  const coreOf = (sid: string | null) => (sid && serialOf.has(sid) ? `Core ${serialOf.get(sid)}` : null);

  return (
    <Page
      title={`Lot ${l.ref}`}
      lead={`${l.supplierCode} — ${l.supplierName} · ${l.partNumber} rev ${l.partRevision} · ${l.quantity} cores`}
      actions={
        <div className={s.head}>
          <span className={s.bigStatus}><LotStatusPill status={l.status} /></span>
          <Button className={mergeClasses(s.touch, 'no-print')} onClick={() => window.print()}>Print</Button>
        </div>
      }
    >
      {arrival.received && isOpenLot(l.status) && !dismissed ? (
        <MessageBar intent="success" className={s.banner} layout="multiline">
          <MessageBarBody>
            <MessageBarTitle>Lot {l.ref} received</MessageBarTitle>
            Pull {l.sampling.inspectAll ? `every core (${l.sampling.sampleSize})` : `${l.sampling.sampleSize} cores at random`} for inspection: {samplingSummary(l.sampling)}. Number them 1 to {l.sampling.sampleSize} as on the bench sheet.
          </MessageBarBody>
          <MessageBarActions containerAction={<Button className="no-print" appearance="transparent" aria-label="Dismiss" onClick={() => setDismissed(true)}>✕</Button>} />
        </MessageBar>
      ) : null}
      {arrival.certError ? (
        <MessageBar intent="warning" className={s.banner}>
          <MessageBarBody>The certificate was not attached: {arrival.certError} Attach it again under Paperwork.</MessageBarBody>
        </MessageBar>
      ) : null}
      {l.status === 'on-hold' ? (
        <MessageBar intent="error" className={s.banner}>
          <MessageBarBody><MessageBarTitle>On hold</MessageBarTitle>Rejected at receiving. The lot stays tagged in the hold area; its nonconformance report follows in review.</MessageBarBody>
        </MessageBar>
      ) : null}

      <div className={s.top}>
        <Paperwork lot={l} canWrite={canWrite && isOpenLot(l.status)} />
        <div className={s.card}>
          <h3 className={s.h3}>Sampling</h3>
          <SamplingBox sampling={l.sampling} quantity={l.quantity} />
        </div>
        <div className={s.card}>
          <h3 className={s.h3}>Switching (supplier × part)</h3>
          <SwitchingBox supplierId={l.supplierId} partId={l.partId} currentLotId={l.id} />
        </div>
      </div>

      <Section title="Bench sheet">
        {!internal ? (
          <Body1 className={s.muted}>{l.readings.length ? 'Readings were taken; their detail is shared with you through a nonconformance report when there is one.' : 'Not inspected yet.'}</Body1>
        ) : plan.isPending || part.isPending ? (
          <Loading label="Loading the plan" />
        ) : plan.error || part.error ? (
          <EmptyState title="The bench sheet cannot be shown">{(plan.error ?? part.error)?.message}</EmptyState>
        ) : (
          <BenchSheet
            key={`${l.id}:${sheetRev}`}
            lot={l}
            plan={plan.data}
            part={part.data}
            editable={editable}
            queue={queue}
            photos={editable ? benchPhotos : undefined}
            importAction={
              editable ? <ImportGaugeCsv className={s.touch} lot={l} plan={plan.data} unsentOnSheet={queue.unsent} onImported={() => setSheetRev((n) => n + 1)} /> : undefined
            }
          />
        )}
      </Section>

      <Section title="Decision">
        <DecisionPanel lot={l} canDecide={canWrite} unsent={queue.unsent - queue.refused.length} />
      </Section>

      <Section title="Photos">
        <PhotoSection
          photos={l.photos}
          uploads={photos.uploads}
          editable={canWrite}
          onAdd={(files, caption) => photos.add(files, { caption })}
          onRetry={photos.retry}
          onDismiss={photos.dismiss}
          coreOf={coreOf}
        />
      </Section>

      <Section title="History">
        <History lot={l} ledger={me?.role === 'auditor' || me?.role === 'engineer' || me?.role === 'admin'} />
      </Section>
    </Page>
  );
}
