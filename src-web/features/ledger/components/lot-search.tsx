import { Caption1, Field, Input, Select, Table, TableBody, TableCell, TableHeader, TableRow, makeStyles, tokens } from '@fluentui/react-components';
import { Link } from 'react-router-dom';
import { LOT_STATUSES, LOT_STATUS_LABELS, type LotStatus } from '@shared/schemas/receiving';
import { MAX_READINGS_RANGE_DAYS } from '@shared/schemas/ledger';
import { useState } from 'react';
import { HeadCell, ListToolbar, Loading, Pager, SearchInput, SortHeader, TableFrame } from '../../../components/data-table';
import { EmptyState } from '../../../components/empty-state';
import { LotStatusPill } from '../../lots/components/lot-status';
import { useListParams } from '../../../lib/use-list-params';
import { paths } from '../../../config/paths';
import { exportUrls, useLedgerLotSearch, usePartChoices, useSupplierChoices } from '../api/ledger';
import { ExportButton } from './export-button';
import { formatWhen } from '../../../lib/format';

const useStyles = makeStyles({
  // Selects as tall as the search box, so the labels line up along the toolbar.
  filter: { minWidth: '130px', maxWidth: '180px', '& select': { height: '44px' } },
  touch: { minHeight: '44px' },
  date: { minHeight: '44px', width: '140px' },
  range: { display: 'flex', flexDirection: 'column', gap: '2px' },
  rangeLabel: { fontSize: tokens.fontSizeBase300, lineHeight: tokens.lineHeightBase300, fontWeight: tokens.fontWeightRegular, paddingBottom: '2px' },
  rangeInputs: { display: 'flex', alignItems: 'center', gap: '6px' },
  ref: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 600 },
  link: { color: tokens.colorBrandForeground1, fontWeight: 600, textDecoration: 'none', ':hover': { textDecoration: 'underline' } },
  num: { fontVariantNumeric: 'tabular-nums', whiteSpace: 'nowrap' },
  muted: { color: tokens.colorNeutralForeground3 },
  exports: {
    display: 'flex',
    gap: '16px',
    alignItems: 'flex-end',
    flexWrap: 'wrap',
    padding: '12px 14px',
    marginTop: '16px',
    border: `1px solid ${tokens.colorNeutralStroke2}`,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground2,
  },
  exportsTitle: { fontWeight: 600, width: '100%' },
  divider: { alignSelf: 'stretch', width: '1px', backgroundColor: tokens.colorNeutralStroke2 },
});

const FILTERS = ['tab', 'supplierId', 'partId', 'status', 'receivedFrom', 'receivedTo'] as const;
const monthAgo = () => new Date(Date.now() - 30 * 86_400_000).toISOString().slice(0, 10);
const today = () => new Date().toISOString().slice(0, 10);

/** Find a lot by its ref, supplier lot, PO or heat number, by supplier or part; open its story. */
export function LotSearch() {
  const s = useStyles();
  const [lp, setLp] = useListParams(FILTERS, { pageSize: 25, sort: '-receivedAt' });
  const f = lp.filters;
  const suppliers = useSupplierChoices();
  const parts = usePartChoices();
  const filters = { q: lp.q || undefined, supplierId: f.supplierId, partId: f.partId, status: f.status as LotStatus | undefined, receivedFrom: f.receivedFrom, receivedTo: f.receivedTo };
  const list = useLedgerLotSearch({ page: lp.page, pageSize: lp.pageSize, sort: lp.sort, ...filters });
  const [range, setRange] = useState({ from: monthAgo(), to: today() });
  const items = list.data?.items ?? [];
  const filtered = Object.values(filters).some(Boolean);

  return (
    <section aria-label="Find a lot">
      <ListToolbar>
        <SearchInput label="Lot ref, supplier lot, heat or PO number" placeholder="Ref, supplier lot, heat, PO" value={lp.q} onChange={(q) => setLp({ q })} />
        <Field label="Supplier">
          <Select className={s.filter} value={f.supplierId ?? ''} onChange={(_, d) => setLp({ filters: { supplierId: d.value || undefined } })}>
            <option value="">All suppliers</option>
            {suppliers.data?.items.map((x) => <option key={x.id} value={x.id}>{x.code} · {x.name}</option>)}
          </Select>
        </Field>
        <Field label="Part">
          <Select className={s.filter} value={f.partId ?? ''} onChange={(_, d) => setLp({ filters: { partId: d.value || undefined } })}>
            <option value="">All parts</option>
            {parts.data?.items.map((x) => <option key={x.id} value={x.id}>{x.partNumber} rev {x.revision}</option>)}
          </Select>
        </Field>
        <Field label="Status">
          <Select className={s.filter} value={f.status ?? ''} onChange={(_, d) => setLp({ filters: { status: d.value || undefined } })}>
            <option value="">Any status</option>
            {LOT_STATUSES.map((x) => <option key={x} value={x}>{LOT_STATUS_LABELS[x]}</option>)}
          </Select>
        </Field>
        <div role="group" aria-labelledby="received-between" className={s.range}>
          <span id="received-between" className={s.rangeLabel}>Received between</span>
          <span className={s.rangeInputs}>
            <Input className={s.date} type="date" aria-label="Received from" value={f.receivedFrom ?? ''} onChange={(_, d) => setLp({ filters: { receivedFrom: d.value || undefined } })} />
            <span aria-hidden>and</span>
            <Input className={s.date} type="date" aria-label="Received to" value={f.receivedTo ?? ''} onChange={(_, d) => setLp({ filters: { receivedTo: d.value || undefined } })} />
          </span>
        </div>
      </ListToolbar>
      {list.error ? (
        <EmptyState title="The lots could not be listed">{list.error.message}</EmptyState>
      ) : list.isPending ? (
        <Loading />
      ) : items.length === 0 && !filtered ? (
        <EmptyState title="No lots yet">Lots appear here as soon as they are received at the dock.</EmptyState>
      ) : (
        <TableFrame footer={<Pager page={lp.page} pageSize={lp.pageSize} total={list.data?.total ?? 0} fetching={list.isFetching} onPage={(page) => setLp({ page })} />}>
          <Table aria-label="Lots" size="small">
            <TableHeader>
              <TableRow>
                <SortHeader field="ref" sort={lp.sort} onSort={(sort) => setLp({ sort })}>Lot</SortHeader>
                <HeadCell>Supplier lot</HeadCell>
                <HeadCell>Supplier</HeadCell>
                <HeadCell>Part</HeadCell>
                <SortHeader field="receivedAt" sort={lp.sort} onSort={(sort) => setLp({ sort })}>Received</SortHeader>
                <SortHeader field="status" sort={lp.sort} onSort={(sort) => setLp({ sort })}>Status</SortHeader>
              </TableRow>
            </TableHeader>
            <TableBody>
              {items.length === 0 ? <TableRow><TableCell colSpan={6}>No lot matches these filters.</TableCell></TableRow> : null}
              {items.map((l) => (
                <TableRow key={l.id}>
                  <TableCell>
                    <Link className={s.link} to={paths.ledgerLot(l.id)} aria-label={`Story of lot ${l.ref}, supplier lot ${l.supplierLotNumber}`}>
                      <span className={s.ref}>#{l.ref}</span>
                    </Link>
                  </TableCell>
                  <TableCell>{l.supplierLotNumber}{l.poNumber ? <Caption1 className={s.muted} title="Purchase order"> · {l.poNumber}</Caption1> : null}</TableCell>
                  <TableCell title={l.supplierName}>{l.supplierCode}</TableCell>
                  <TableCell>{l.partNumber} rev {l.partRevision}</TableCell>
                  <TableCell className={s.num}>{formatWhen(l.receivedAt)}</TableCell>
                  <TableCell><LotStatusPill status={l.status} /></TableCell>
                </TableRow>
              ))}
            </TableBody>
          </Table>
        </TableFrame>
      )}
      <div className={s.exports} role="group" aria-label="Exports">
        <span className={s.exportsTitle}>Exports</span>
        <ExportButton url={exportUrls.lots(filters)} label={filtered ? 'Export these lots (CSV)' : 'Export all lots (CSV)'} />
        <span className={s.divider} aria-hidden />
        <Field label="Readings entered from">
          <Input className={s.date} type="date" value={range.from} onChange={(_, d) => setRange({ ...range, from: d.value })} />
        </Field>
        <Field label="to">
          <Input className={s.date} type="date" value={range.to} onChange={(_, d) => setRange({ ...range, to: d.value })} />
        </Field>
        <ExportButton url={exportUrls.readings({ from: range.from, to: range.to })} label="Export readings (CSV)" disabled={!range.from || !range.to} />
        <Caption1 className={s.muted}>Readings go out a period of at most {MAX_READINGS_RANGE_DAYS} days at a time; each lot’s own readings from its story.</Caption1>
      </div>
    </section>
  );
}
