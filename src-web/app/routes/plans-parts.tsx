import { Button, Table, TableBody, TableCell, TableHeader, TableRow, makeStyles, tokens } from '@fluentui/react-components';
import { useMemo, useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { CONSTRUCTIONS, type Construction } from '@shared/schemas/master-data';
import { Page } from '../../components/page';
import { EmptyState } from '../../components/empty-state';
import { FilterSelect, HeadCell, ListToolbar, Loading, Pager, SearchInput, SortHeader, TableFrame } from '../../components/data-table';
import { StatusPill } from '../../components/status-pill';
import { useListParams } from '../../lib/use-list-params';
import { paths } from '../../config/paths';
import { useParts } from '../../features/parts/api/parts';
import { usePlans } from '../../features/plans/api/plans';
import { PartPanel } from '../../features/parts/components/part-panel';
import { CONSTRUCTION_LABELS } from '../../features/parts/components/construction';
import { useCanManageMasterData } from '../../features/auth/hooks/use-can';
import { formatDay } from '../../lib/format';

const useStyles = makeStyles({
  touch: { minHeight: '44px' },
  pn: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 600, color: tokens.colorBrandForeground1, textDecoration: 'none', ':hover': { textDecoration: 'underline' } },
  mono: { fontFamily: tokens.fontFamilyMonospace },
  planLink: { textDecoration: 'none' },
  nowrap: { whiteSpace: 'nowrap' },
});

const FILTERS = ['construction'] as const;

export function PlansPartsPage() {
  const s = useStyles();
  const canWrite = useCanManageMasterData();
  const navigate = useNavigate();
  const [lp, setLp] = useListParams(FILTERS, { pageSize: 25 });
  const construction = lp.filters.construction as Construction | undefined;
  const list = useParts({ page: lp.page, pageSize: lp.pageSize, sort: lp.sort, q: lp.q || undefined, construction });
  // The part row knows its active plan's id; the revision number comes from the active plans.
  const active = usePlans({ status: 'active', pageSize: 200 });
  const revOf = useMemo(() => new Map((active.data?.items ?? []).map((p) => [p.id, p.revision])), [active.data]);
  const [creating, setCreating] = useState(false);
  const items = list.data?.items ?? [];

  return (
    <Page
      title="Plans & parts"
      lead="Part revisions and the inspection plan each is received against. Plans are revised, never edited once active."
      actions={canWrite ? <Button className={s.touch} appearance="primary" onClick={() => setCreating(true)}>New part</Button> : undefined}
    >
      <ListToolbar>
        <SearchInput label="Search part number or description" value={lp.q} onChange={(q) => setLp({ q })} />
        <FilterSelect label="Construction" value={construction} allLabel="All constructions" options={CONSTRUCTIONS.map((c) => ({ value: c, label: CONSTRUCTION_LABELS[c] }))} onChange={(v) => setLp({ filters: { construction: v } })} />
      </ListToolbar>
      {list.isPending ? (
        <Loading />
      ) : items.length === 0 && !lp.q && !construction ? (
        <EmptyState title="No parts yet">{canWrite ? 'Add the first part revision with “New part”, then give it a plan from a template.' : 'An engineer adds parts and their plans here.'}</EmptyState>
      ) : (
        <TableFrame footer={<Pager page={lp.page} pageSize={lp.pageSize} total={list.data?.total ?? 0} fetching={list.isFetching} onPage={(page) => setLp({ page })} />}>
          <Table aria-label="Parts" size="small">
            <TableHeader>
              <TableRow>
                <SortHeader field="partNumber" sort={lp.sort} onSort={(sort) => setLp({ sort })}>Part number</SortHeader>
                <HeadCell>Rev</HeadCell>
                <HeadCell>Description</HeadCell>
                <SortHeader field="construction" sort={lp.sort} onSort={(sort) => setLp({ sort })}>Construction</SortHeader>
                <HeadCell>Grade</HeadCell>
                <HeadCell>Active plan</HeadCell>
                <SortHeader field="updatedAt" sort={lp.sort} onSort={(sort) => setLp({ sort })}>Last changed</SortHeader>
              </TableRow>
            </TableHeader>
            <TableBody>
              {items.length === 0 ? <TableRow><TableCell colSpan={7}>No part matches these filters.</TableCell></TableRow> : null}
              {items.map((p) => (
                <TableRow key={p.id}>
                  <TableCell className={s.nowrap}><Link className={s.pn} to={paths.part(p.id)}>{p.partNumber}</Link></TableCell>
                  <TableCell className={s.mono}>{p.revision}</TableCell>
                  <TableCell>{p.description}</TableCell>
                  <TableCell>{CONSTRUCTION_LABELS[p.construction]}</TableCell>
                  <TableCell className={s.mono}>{p.steelGrade}</TableCell>
                  <TableCell className={s.nowrap}>
                    {p.activePlanId ? (
                      <Link className={s.planLink} to={paths.plan(p.activePlanId)} aria-label={`Active plan of ${p.partNumber}`}>
                        <StatusPill tone="ok">{revOf.has(p.activePlanId) ? `Rev ${revOf.get(p.activePlanId)}` : 'Active'}</StatusPill>
                      </Link>
                    ) : (
                      <StatusPill tone="pending" title="Lots of this part cannot be inspected until a plan is active">No active plan</StatusPill>
                    )}
                  </TableCell>
                  <TableCell>{formatDay(p.updatedAt)}</TableCell>
                </TableRow>
              ))}
            </TableBody>
          </Table>
        </TableFrame>
      )}
      <PartPanel open={creating} onClose={() => setCreating(false)} onCreated={(p) => navigate(paths.part(p.id))} />
    </Page>
  );
}
