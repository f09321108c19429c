import { Caption1, Field, Input, Select, Table, TableBody, TableCell, TableHeader, TableRow, makeStyles, tokens } from '@fluentui/react-components';
import { Link } from 'react-router-dom';
import { LOT_STATUSES, LOT_STATUS_LABELS, type LotStatus } from '@shared/schemas/receiving';
import { Page } from '../../components/page';
import { EmptyState } from '../../components/empty-state';
import { HeadCell, ListToolbar, Loading, Pager, SearchInput, SortHeader, TableFrame } from '../../components/data-table';
import { paths } from '../../config/paths';
import { useListParams } from '../../lib/use-list-params';
import { useMe } from '../../features/auth/api/get-me';
import { useLots } from '../../features/lots/api/lots';
import { LotStatusPill } from '../../features/lots/components/lot-status';
import { useParts } from '../../features/parts/api/parts';
import { useSuppliers } from '../../features/suppliers/api/suppliers';
import { formatWhen } from '../../lib/format';

const useStyles = makeStyles({
  touch: { minHeight: '44px' },
  filter: { minWidth: '180px' },
  sel: { height: '44px' },
  date: { minWidth: '160px', minHeight: '44px' },
  ref: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 700, color: tokens.colorBrandForeground1, textDecoration: 'none', display: 'inline-flex', minHeight: '36px', alignItems: 'center', ':hover': { textDecoration: 'underline' } },
  num: { fontVariantNumeric: 'tabular-nums', whiteSpace: 'nowrap' },
  muted: { color: tokens.colorNeutralForeground3 },
});

const FILTERS = ['status', 'supplierId', 'partId', 'receivedFrom', 'receivedTo'] as const;

export function LotsPage() {
  const s = useStyles();
  const [lp, setLp] = useListParams(FILTERS, { pageSize: 25 });
  const f = lp.filters;
  const lots = useLots({
    page: lp.page,
    pageSize: lp.pageSize,
    sort: lp.sort,
    q: lp.q || undefined,
    status: f.status as LotStatus | 'waiting' | undefined,
    supplierId: f.supplierId,
    partId: f.partId,
    receivedFrom: f.receivedFrom,
    receivedTo: f.receivedTo,
  });
  // A supplier user sees only its own lots; a supplier filter would only list the others.
  const isSupplier = useMe().data?.role === 'supplier';
  const suppliers = useSuppliers({ page: 1, pageSize: 200, sort: 'code' });
  const parts = useParts({ page: 1, pageSize: 200, sort: 'partNumber' });
  const items = lots.data?.items ?? [];
  const filtered = !!(lp.q || Object.values(f).some(Boolean));
  const setFilter = (k: (typeof FILTERS)[number], v: string) => setLp({ filters: { [k]: v || undefined } });

  return (
    <Page title="Lot file" lead="Every lot received, with its paperwork, sampling, readings, photos and decision.">
      <ListToolbar>
        <SearchInput label="Search lot, PO or heat number" value={lp.q} onChange={(q) => setLp({ q })} />
        <Field label="Status">
          <Select className={s.filter} select={{ className: s.sel }} value={f.status ?? ''} onChange={(_, d) => setFilter('status', d.value)}>
            <option value="">All statuses</option>
            <option value="waiting">Waiting or inspecting</option>
            {LOT_STATUSES.map((st) => <option key={st} value={st}>{LOT_STATUS_LABELS[st]}</option>)}
          </Select>
        </Field>
        {isSupplier ? null : (
          <Field label="Supplier">
            <Select className={s.filter} select={{ className: s.sel }} value={f.supplierId ?? ''} onChange={(_, d) => setFilter('supplierId', d.value)}>
              <option value="">All suppliers</option>
              {(suppliers.data?.items ?? []).map((x) => <option key={x.id} value={x.id}>{x.code} — {x.name}</option>)}
            </Select>
          </Field>
        )}
        <Field label="Part">
          <Select className={s.filter} select={{ className: s.sel }} value={f.partId ?? ''} onChange={(_, d) => setFilter('partId', d.value)}>
            <option value="">All parts</option>
            {(parts.data?.items ?? []).map((p) => <option key={p.id} value={p.id}>{p.partNumber} rev {p.revision}</option>)}
          </Select>
        </Field>
        <Field label="Received from">
          <Input className={s.date} type="date" value={f.receivedFrom ?? ''} max={f.receivedTo} onChange={(_, d) => setFilter('receivedFrom', d.value)} />
        </Field>
        <Field label="to">
          <Input className={s.date} type="date" value={f.receivedTo ?? ''} min={f.receivedFrom} onChange={(_, d) => setFilter('receivedTo', d.value)} />
        </Field>
      </ListToolbar>
      {lots.isPending ? (
        <Loading />
      ) : lots.error ? (
        <EmptyState title="Lots cannot be shown">{lots.error.message}</EmptyState>
      ) : items.length === 0 && !filtered ? (
        <EmptyState title="No lots yet">Lots appear here once they are received at the Dock.</EmptyState>
      ) : (
        <TableFrame footer={<Pager page={lp.page} pageSize={lp.pageSize} total={lots.data.total} fetching={lots.isFetching} onPage={(page) => setLp({ page })} />}>
          <Table aria-label="Lots" size="small">
            <TableHeader>
              <TableRow>
                <SortHeader field="ref" sort={lp.sort} onSort={(sort) => setLp({ sort })}>Lot</SortHeader>
                <HeadCell>Supplier lot</HeadCell>
                <HeadCell>Supplier</HeadCell>
                <HeadCell>Part</HeadCell>
                <HeadCell>Quantity</HeadCell>
                <HeadCell>Sample</HeadCell>
                <SortHeader field="receivedAt" sort={lp.sort} onSort={(sort) => setLp({ sort })}>Received</SortHeader>
                <SortHeader field="status" sort={lp.sort} onSort={(sort) => setLp({ sort })}>Status</SortHeader>
              </TableRow>
            </TableHeader>
            <TableBody>
              {items.length === 0 ? <TableRow><TableCell colSpan={8}>No lot matches these filters.</TableCell></TableRow> : null}
              {items.map((l) => (
                <TableRow key={l.id}>
                  <TableCell><Link className={s.ref} to={paths.lot(l.id)} aria-label={`Open lot ${l.ref}`}>{l.ref}</Link></TableCell>
                  <TableCell>{l.supplierLotNumber}{l.poNumber ? <Caption1 className={s.muted} title="PO number"> · {/^PO/i.test(l.poNumber) ? '' : 'PO '}{l.poNumber}</Caption1> : null}</TableCell>
                  <TableCell title={l.supplierName}>{l.supplierCode}</TableCell>
                  <TableCell>{l.partNumber} <Caption1 className={s.muted}>rev {l.partRevision}</Caption1></TableCell>
                  <TableCell className={s.num}>{l.quantity}</TableCell>
                  <TableCell className={s.num}>{l.sampling.sampleSize}{l.sampling.inspectAll ? ' (100 %)' : ''}</TableCell>
                  <TableCell className={s.num}>{formatWhen(l.receivedAt)}</TableCell>
                  <TableCell><LotStatusPill status={l.status} /></TableCell>
                </TableRow>
              ))}
            </TableBody>
          </Table>
        </TableFrame>
      )}
    </Page>
  );
}
