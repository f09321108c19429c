import { Badge, Body1, Button, Caption1, Tab, TabList, Table, TableBody, TableCell, TableHeader, TableRow, makeStyles, mergeClasses, tokens } from '@fluentui/react-components';
import { useEffect, useState } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { NCR_STATUSES, NCR_STATUS_LABELS, type HeldLot, type NcrStatus } from '@shared/schemas/ncr';
import { StateFilter } from '../../features/ncrs/components/record-sections';
import { Page } from '../../components/page';
import { EmptyState } from '../../components/empty-state';
import { HeadCell, ListToolbar, Loading, Pager, SearchInput, SortHeader, TableFrame } from '../../components/data-table';
import { useListParams } from '../../lib/use-list-params';
import { paths } from '../../config/paths';
import { useMe } from '../../features/auth/api/get-me';
import { useHeldLots, useNcrs } from '../../features/ncrs/api/ncrs';
import { NcrStatusPill, formatValue } from '../../features/ncrs/components/ncr-status';
import { RaiseNcrPanel } from '../../features/ncrs/components/raise-ncr-panel';
import { DefectCodesSection } from '../../features/ncrs/components/defect-codes-section';
import { formatDay } from '../../lib/format';

const useStyles = makeStyles({
  touch: { minHeight: '44px' },
  tabs: { marginBottom: '16px' },
  number: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 700, color: tokens.colorBrandForeground1, textDecoration: 'none', whiteSpace: 'nowrap', ':hover': { textDecoration: 'underline' } },
  code: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 600, marginRight: '6px' },
  muted: { color: tokens.colorNeutralForeground3 },
  held: { display: 'grid', gridTemplateColumns: 'repeat(auto-fill, minmax(320px, 1fr))', gap: '14px' },
  lot: { border: `1px solid ${tokens.colorNeutralStroke2}`, borderLeft: `5px solid #b3261e`, borderRadius: tokens.borderRadiusLarge, padding: '12px 14px', display: 'flex', flexDirection: 'column', gap: '6px', backgroundColor: tokens.colorNeutralBackground1 },
  lotHead: { display: 'flex', justifyContent: 'space-between', alignItems: 'baseline', gap: '8px' },
  fails: { margin: 0, paddingLeft: '18px' },
  title: { maxWidth: '36ch', display: 'block', overflow: 'hidden', textOverflow: 'ellipsis', whiteSpace: 'nowrap' },
  nowrap: { whiteSpace: 'nowrap' },
});

const TABS = ['reports', 'waiting', 'codes'] as const;
type TabName = (typeof TABS)[number];

function HeldLots({ items, canRaise, onRaise }: { items: HeldLot[]; canRaise: boolean; onRaise: (l: HeldLot) => void }) {
  const s = useStyles();
  if (!items.length) return <EmptyState title="No held lot is waiting for an NCR">Rejected lots appear here until their nonconformance report is raised.</EmptyState>;
  return (
    <div className={s.held}>
      {items.map((l) => (
        <article key={l.id} className={s.lot} aria-label={`Held lot ${l.ref}`}>
          <div className={s.lotHead}>
            <Link className={s.number} to={paths.lot(l.id)}>Lot #{l.ref}</Link>
            <Caption1 className={s.muted}>{l.decidedAt ? `rejected ${formatDay(l.decidedAt)}` : 'on hold'}</Caption1>
          </div>
          <Body1>{l.supplierCode} · {l.partNumber} rev {l.partRevision} · {l.quantity} cores</Body1>
          <Caption1 className={s.muted}>Supplier lot {l.supplierLotNumber}{l.nonconformingCount != null ? ` · ${l.nonconformingCount} nonconforming in the sample` : ''}</Caption1>
          {l.failures.length ? (
            <ul className={s.fails}>
              {l.failures.slice(0, 4).map((f) => (
                <li key={f.readingId}><Caption1>Core {f.serial}: {f.name} {f.value != null ? formatValue(f.value) : f.pass === false ? 'failed' : ''} {f.unit ?? ''}</Caption1></li>
              ))}
              {l.failures.length > 4 ? <li><Caption1>and {l.failures.length - 4} more</Caption1></li> : null}
            </ul>
          ) : l.decisionComment ? <Caption1>“{l.decisionComment}”</Caption1> : null}
          {canRaise ? <Button className={s.touch} appearance="primary" onClick={() => onRaise(l)} aria-label={`Raise an NCR for lot ${l.ref}`}>Raise NCR</Button> : null}
        </article>
      ))}
    </div>
  );
}

/** Nonconformances: the reports, the held lots still waiting for one, and the defect code list. */
export function NcrsPage() {
  const s = useStyles();
  const navigate = useNavigate();
  const { data: me } = useMe();
  const canRaise = me?.role === 'inspector' || me?.role === 'engineer';
  const [sp, setSp] = useSearchParams();
  const tab = (TABS as readonly string[]).includes(sp.get('tab') ?? '') ? (sp.get('tab') as TabName) : 'reports';
  const [lp, setLp] = useListParams(['status'], { pageSize: 25 });
  const status = (lp.filters.status as NcrStatus | 'active' | undefined) ?? undefined;
  const list = useNcrs({ page: lp.page, pageSize: lp.pageSize, sort: lp.sort, q: lp.q || undefined, status });
  const held = useHeldLots();
  const [raising, setRaising] = useState<{ lot: HeldLot | null } | null>(null);
  const items = list.data?.items ?? [];
  const waiting = held.data?.items.length ?? 0;
  // `?raise=<lot id>` (from the Lot file) opens the panel for that held lot.
  const raiseId = sp.get('raise');
  useEffect(() => {
    const l = raiseId ? held.data?.items.find((x) => x.id === raiseId) : undefined;
    if (!l) return;
    setRaising({ lot: l });
    setSp((p) => { const n = new URLSearchParams(p); n.delete('raise'); n.set('tab', 'waiting'); return n; }, { replace: true });
  }, [raiseId, held.data, setSp]);

  return (
    <Page
      title="Nonconformances"
      lead="Held lots, their nonconformance reports, and the review board that decides what happens to them (ISO 9001 §8.7)."
      actions={canRaise ? <Button className={s.touch} onClick={() => setRaising({ lot: null })}>Raise an NCR by hand</Button> : undefined}
    >
      <TabList className={s.tabs} selectedValue={tab} onTabSelect={(_, d) => setSp((p) => { const n = new URLSearchParams(p); n.set('tab', String(d.value)); return n; }, { replace: true })}>
        <Tab value="reports">Reports</Tab>
        <Tab value="waiting">Waiting for an NCR {waiting ? <Badge appearance="filled" color="danger" size="small" style={{ marginLeft: 6 }}>{waiting}</Badge> : null}</Tab>
        <Tab value="codes">Defect codes</Tab>
      </TabList>

      {tab === 'waiting' ? (
        held.isPending ? <Loading /> : <HeldLots items={held.data?.items ?? []} canRaise={canRaise} onRaise={(l) => setRaising({ lot: l })} />
      ) : tab === 'codes' ? (
        <DefectCodesSection canEdit={me?.role === 'engineer'} />
      ) : (
        <>
          <ListToolbar>
            <SearchInput label="Search number, title, lot or defect" value={lp.q} onChange={(q) => setLp({ q })} />
            <StateFilter value={status} states={NCR_STATUSES} labels={NCR_STATUS_LABELS} onChange={(v) => setLp({ filters: { status: v } })} />
          </ListToolbar>
          {list.isPending ? (
            <Loading />
          ) : items.length === 0 && !lp.q && !status ? (
            <EmptyState title="No nonconformance reports yet">{waiting ? `${waiting} held lot${waiting === 1 ? ' is' : 's are'} waiting for one: see “Waiting for an NCR”.` : 'A rejected lot waits here for its report.'}</EmptyState>
          ) : (
            <TableFrame footer={<Pager page={lp.page} pageSize={lp.pageSize} total={list.data?.total ?? 0} fetching={list.isFetching} onPage={(page) => setLp({ page })} />}>
              <Table aria-label="Nonconformance reports" size="small">
                <TableHeader>
                  <TableRow>
                    <SortHeader field="number" sort={lp.sort} onSort={(sort) => setLp({ sort })}>Number</SortHeader>
                    <SortHeader field="status" sort={lp.sort} onSort={(sort) => setLp({ sort })}>State</SortHeader>
                    <HeadCell>Title</HeadCell>
                    <HeadCell>Supplier</HeadCell>
                    <HeadCell>Part</HeadCell>
                    <HeadCell>Lot</HeadCell>
                    <HeadCell>Defects</HeadCell>
                    <HeadCell>Cores</HeadCell>
                    <SortHeader field="raisedAt" sort={lp.sort} onSort={(sort) => setLp({ sort })}>Raised</SortHeader>
                    <HeadCell>SCAR</HeadCell>
                  </TableRow>
                </TableHeader>
                <TableBody>
                  {items.length === 0 ? <TableRow><TableCell colSpan={10}>No report matches.</TableCell></TableRow> : null}
                  {items.map((n) => (
                    <TableRow key={n.id}>
                      <TableCell><Link className={s.number} to={paths.ncr(n.id)}>{n.number}</Link></TableCell>
                      <TableCell><NcrStatusPill status={n.status} /></TableCell>
                      <TableCell><span className={s.title} title={n.title}>{n.title}</span></TableCell>
                      <TableCell>{n.supplierCode ?? '—'}</TableCell>
                      <TableCell className={s.nowrap}>{n.partNumber ? `${n.partNumber} ${n.partRevision}` : '—'}</TableCell>
                      <TableCell>{n.lotRef != null && n.lotId ? <Link to={paths.lot(n.lotId)}>#{n.lotRef}</Link> : '—'}</TableCell>
                      <TableCell>{n.defectCodes.map((c) => <span key={c} className={s.code}>{c}</span>)}</TableCell>
                      <TableCell>{n.suspectQuantity}</TableCell>
                      <TableCell className={mergeClasses(s.muted, s.nowrap)}>{formatDay(n.raisedAt)}</TableCell>
                      <TableCell>{n.scarId ? <Link className={s.number} to={paths.scar(n.scarId)}>{n.scarNumber}</Link> : '—'}</TableCell>
                    </TableRow>
                  ))}
                </TableBody>
              </Table>
            </TableFrame>
          )}
        </>
      )}
      <RaiseNcrPanel open={!!raising} lot={raising?.lot ?? null} onClose={() => setRaising(null)} onCreated={(n) => navigate(paths.ncr(n.id))} />
    </Page>
  );
}
