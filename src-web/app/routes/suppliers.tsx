import { Button, Caption1, Table, TableBody, TableCell, TableHeader, TableRow, makeStyles, tokens } from '@fluentui/react-components';
import { useState } from 'react';
import { Link, useLocation, useNavigate, useParams } from 'react-router-dom';
import { APPROVAL_STATUSES, type ApprovalStatus } from '@shared/schemas/master-data';
import { Page } from '../../components/page';
import { EmptyState } from '../../components/empty-state';
import { FilterSelect, HeadCell, ListToolbar, Loading, Pager, SearchInput, SortHeader, TableFrame } from '../../components/data-table';
import { useListParams } from '../../lib/use-list-params';
import { paths } from '../../config/paths';
import { useSupplier, useSuppliers } from '../../features/suppliers/api/suppliers';
import { APPROVAL_LABELS, ApprovalPill } from '../../features/suppliers/components/approval-pill';
import { SupplierPanel } from '../../features/suppliers/components/supplier-panel';
import { useCanManageMasterData } from '../../features/auth/hooks/use-can';
import { formatDay } from '../../lib/format';

const useStyles = makeStyles({
  touch: { minHeight: '44px' },
  code: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 600, color: tokens.colorBrandForeground1, textDecoration: 'none', ':hover': { textDecoration: 'underline' } },
  muted: { color: tokens.colorNeutralForeground3 },
  reason: { maxWidth: '26ch', overflow: 'hidden', textOverflow: 'ellipsis', whiteSpace: 'nowrap', display: 'block' },
  name: { minWidth: '170px' },
  nowrap: { whiteSpace: 'nowrap' },
});

const FILTERS = ['approvalStatus'] as const;

export function SuppliersPage() {
  const s = useStyles();
  const canWrite = useCanManageMasterData();
  const { id } = useParams();
  const location = useLocation();
  const navigate = useNavigate();
  const [lp, setLp] = useListParams(FILTERS, { pageSize: 25 });
  const approvalStatus = lp.filters.approvalStatus as ApprovalStatus | undefined;
  const list = useSuppliers({ page: lp.page, pageSize: lp.pageSize, sort: lp.sort, q: lp.q || undefined, approvalStatus });
  const one = useSupplier(id);
  const [creating, setCreating] = useState(false);
  const close = () => (creating ? setCreating(false) : navigate({ pathname: paths.suppliers, search: location.search }));
  const items = list.data?.items ?? [];

  return (
    <Page
      title="Suppliers"
      lead="Stamping suppliers, who to contact there, and whether lots may be received from them."
      actions={canWrite ? <Button className={s.touch} appearance="primary" onClick={() => setCreating(true)}>New supplier</Button> : undefined}
    >
      <ListToolbar>
        <SearchInput label="Search code or name" value={lp.q} onChange={(q) => setLp({ q })} />
        <FilterSelect label="Approval" value={approvalStatus} allLabel="All statuses" options={APPROVAL_STATUSES.map((a) => ({ value: a, label: APPROVAL_LABELS[a] }))} onChange={(v) => setLp({ filters: { approvalStatus: v } })} />
      </ListToolbar>
      {list.isPending ? (
        <Loading />
      ) : items.length === 0 && !lp.q && !approvalStatus ? (
        <EmptyState title="No suppliers yet">{canWrite ? 'Add the first supplier with “New supplier”.' : 'An engineer adds suppliers here.'}</EmptyState>
      ) : (
        <TableFrame footer={<Pager page={lp.page} pageSize={lp.pageSize} total={list.data?.total ?? 0} fetching={list.isFetching} onPage={(page) => setLp({ page })} />}>
          <Table aria-label="Suppliers" size="small">
            <TableHeader>
              <TableRow>
                <SortHeader field="code" sort={lp.sort} onSort={(sort) => setLp({ sort })}>Code</SortHeader>
                <SortHeader field="name" sort={lp.sort} onSort={(sort) => setLp({ sort })}>Name</SortHeader>
                <HeadCell>Contacts</HeadCell>
                <SortHeader field="approvalStatus" sort={lp.sort} onSort={(sort) => setLp({ sort })}>Approval</SortHeader>
                <HeadCell>Reason</HeadCell>
                <HeadCell>Last changed</HeadCell>
              </TableRow>
            </TableHeader>
            <TableBody>
              {items.length === 0 ? (
                <TableRow><TableCell colSpan={6}>No supplier matches this search.</TableCell></TableRow>
              ) : null}
              {items.map((x) => (
                <TableRow key={x.id}>
                  <TableCell className={s.nowrap}>
                    <Link className={s.code} to={{ pathname: paths.supplier(x.id), search: location.search }} aria-label={`${canWrite ? 'Edit' : 'Open'} supplier ${x.code}`}>{x.code}</Link>
                  </TableCell>
                  <TableCell className={s.name}>{x.name}</TableCell>
                  <TableCell className={s.nowrap}>
                    {x.contactEmails[0] ?? <span className={s.muted}>none on record</span>}
                    {x.contactEmails.length > 1 ? <Caption1 className={s.muted}> +{x.contactEmails.length - 1} more</Caption1> : null}
                  </TableCell>
                  <TableCell className={s.nowrap}><ApprovalPill status={x.approvalStatus} reason={x.approvalReason} /></TableCell>
                  <TableCell><span className={s.reason} title={x.approvalReason ?? undefined}>{x.approvalReason ?? '—'}</span></TableCell>
                  <TableCell className={s.muted}>{formatDay(x.updatedAt)}</TableCell>
                </TableRow>
              ))}
            </TableBody>
          </Table>
        </TableFrame>
      )}
      <SupplierPanel
        mode={creating ? 'create' : id ? (canWrite ? 'edit' : 'view') : null}
        supplier={creating ? undefined : one.data}
        loading={one.isPending}
        error={one.error?.message}
        onClose={close}
        onSaved={() => close()}
      />
    </Page>
  );
}
