import { Table, TableBody, TableCell, TableHeader, TableRow, makeStyles, tokens } from '@fluentui/react-components';
import { Link } from 'react-router-dom';
import { SCAR_STATUSES, SCAR_STATUS_LABELS, STEP_INFO, type ScarStatus } from '@shared/schemas/corrective-action';
import { StateFilter } from '../../features/ncrs/components/record-sections';
import { Page } from '../../components/page';
import { EmptyState } from '../../components/empty-state';
import { HeadCell, ListToolbar, Loading, Pager, SearchInput, SortHeader, TableFrame } from '../../components/data-table';
import { useListParams } from '../../lib/use-list-params';
import { paths } from '../../config/paths';
import { useScars } from '../../features/corrective-actions/api/scars';
import { DueDate, ScarStatusPill } from '../../features/corrective-actions/components/scar-status';
import { formatDay } from '../../lib/format';

const useStyles = makeStyles({
  number: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 700, color: tokens.colorBrandForeground1, textDecoration: 'none', whiteSpace: 'nowrap', ':hover': { textDecoration: 'underline' } },
  muted: { color: tokens.colorNeutralForeground3, whiteSpace: 'nowrap' },
  nowrap: { whiteSpace: 'nowrap' },
  title: { maxWidth: '36ch', display: 'block', overflow: 'hidden', textOverflow: 'ellipsis', whiteSpace: 'nowrap' },
});

/** Supplier corrective action requests, each with the step it waits on and when that is due. */
export function ScarsPage() {
  const s = useStyles();
  const [lp, setLp] = useListParams(['status'], { pageSize: 25 });
  const status = lp.filters.status as ScarStatus | 'active' | undefined;
  const list = useScars({ page: lp.page, pageSize: lp.pageSize, sort: lp.sort, q: lp.q || undefined, status });
  const items = list.data?.items ?? [];
  return (
    <Page title="Corrective actions" lead="Supplier corrective action requests, answered step by step in the 8D discipline and verified by the next lots (ISO 9001 §10.2).">
      <ListToolbar>
        <SearchInput label="Search number, title or NCR" value={lp.q} onChange={(q) => setLp({ q })} />
        <StateFilter value={status} states={SCAR_STATUSES} labels={SCAR_STATUS_LABELS} onChange={(v) => setLp({ filters: { status: v } })} />
      </ListToolbar>
      {list.isPending ? (
        <Loading />
      ) : items.length === 0 && !lp.q && !status ? (
        <EmptyState title="No corrective action requests yet">They are issued from a nonconformance report.</EmptyState>
      ) : (
        <TableFrame footer={<Pager page={lp.page} pageSize={lp.pageSize} total={list.data?.total ?? 0} fetching={list.isFetching} onPage={(page) => setLp({ page })} />}>
          <Table aria-label="Corrective actions" size="small">
            <TableHeader>
              <TableRow>
                <SortHeader field="number" sort={lp.sort} onSort={(sort) => setLp({ sort })}>Number</SortHeader>
                <SortHeader field="status" sort={lp.sort} onSort={(sort) => setLp({ sort })}>State</SortHeader>
                <HeadCell>Title</HeadCell>
                <HeadCell>Supplier</HeadCell>
                <HeadCell>NCR</HeadCell>
                <HeadCell>Waiting on</HeadCell>
                <SortHeader field="issuedAt" sort={lp.sort} onSort={(sort) => setLp({ sort })}>Issued</SortHeader>
              </TableRow>
            </TableHeader>
            <TableBody>
              {items.length === 0 ? <TableRow><TableCell colSpan={7}>No request matches.</TableCell></TableRow> : null}
              {items.map((x) => (
                <TableRow key={x.id}>
                  <TableCell><Link className={s.number} to={paths.scar(x.id)}>{x.number}</Link></TableCell>
                  <TableCell><ScarStatusPill status={x.status} /></TableCell>
                  <TableCell><span className={s.title} title={x.title}>{x.title}</span></TableCell>
                  <TableCell>{x.supplierCode}</TableCell>
                  <TableCell><Link className={s.number} to={paths.ncr(x.ncrId)}>{x.ncrNumber}</Link></TableCell>
                  <TableCell className={s.nowrap}>{x.nextDueStep ? <>{x.nextDueStep} {STEP_INFO[x.nextDueStep].title} · <DueDate dueOn={x.nextDueOn} overdue={x.overdue} /></> : '—'}</TableCell>
                  <TableCell className={s.muted}>{formatDay(x.issuedAt)}</TableCell>
                </TableRow>
              ))}
            </TableBody>
          </Table>
        </TableFrame>
      )}
    </Page>
  );
}
