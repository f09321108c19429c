import { Button, Table, TableBody, TableCell, TableHeader, TableRow, ToggleButton, makeStyles, mergeClasses, tokens } from '@fluentui/react-components';
import { useState } from 'react';
import { GAUGE_KIND_LABELS, GAUGE_KINDS, type Gauge, type GaugeKind } from '@shared/schemas/master-data';
import { Page } from '../../components/page';
import { EmptyState } from '../../components/empty-state';
import { FilterSelect, FilterToggles, HeadCell, ListToolbar, Loading, Pager, SearchInput, SortHeader, TableFrame } from '../../components/data-table';
import { StatusPill } from '../../components/status-pill';
import { useListParams } from '../../lib/use-list-params';
import { formatCalendarDay } from '../../lib/format';
import { useGauges, type CalibrationFilter } from '../../features/gauges/api/gauges';
import { CalibrationPill } from '../../features/gauges/components/calibration-pill';
import { GaugePanel, GAUGE_STATUS_LABELS } from '../../features/gauges/components/gauge-panel';
import { CalibrationDialog } from '../../features/gauges/components/calibration-dialog';
import { useCanManageMasterData } from '../../features/auth/hooks/use-can';

const useStyles = makeStyles({
  touch: { minHeight: '44px' },
  tag: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 600 },
  muted: { color: tokens.colorNeutralForeground3 },
  num: { fontVariantNumeric: 'tabular-nums', whiteSpace: 'nowrap' },
  actions: { display: 'flex', gap: '6px', justifyContent: 'flex-end' },
  rowBtn: { minHeight: '36px' },
  nowrap: { whiteSpace: 'nowrap' },
  desc: { minWidth: '200px' },
  srOnly: { position: 'absolute', width: '1px', height: '1px', overflow: 'hidden', clip: 'rect(0 0 0 0)', whiteSpace: 'nowrap' },
});

const CAL_FILTERS: { value: CalibrationFilter | undefined; label: string }[] = [
  { value: undefined, label: 'All' },
  { value: 'overdue', label: 'Overdue' },
  { value: 'due-soon', label: 'Due within 30 days' },
  { value: 'ok', label: 'Calibration OK' },
];
const FILTERS = ['calibration', 'kind'] as const;

const range = (g: Gauge) => (g.rangeMin == null && g.rangeMax == null ? '—' : `${g.rangeMin ?? '…'} – ${g.rangeMax ?? '…'} ${g.unit}`);

export function GaugesPage() {
  const s = useStyles();
  const canWrite = useCanManageMasterData();
  const [lp, setLp] = useListParams(FILTERS, { pageSize: 25, sort: 'calibrationDueOn' });
  const calibration = lp.filters.calibration as CalibrationFilter | undefined;
  const kind = lp.filters.kind as GaugeKind | undefined;
  const list = useGauges({ page: lp.page, pageSize: lp.pageSize, sort: lp.sort, q: lp.q || undefined, calibration, kind });
  const [panel, setPanel] = useState<{ mode: 'create' | 'edit'; gauge?: Gauge } | null>(null);
  const [calibrating, setCalibrating] = useState<Gauge | null>(null);
  const items = list.data?.items ?? [];
  const filtered = !!(lp.q || calibration || kind);

  return (
    <Page
      title="Gauges"
      lead="Measuring equipment and when each is due for calibration. A measurement taken with an overdue gauge is refused."
      actions={canWrite ? <Button className={s.touch} appearance="primary" onClick={() => setPanel({ mode: 'create' })}>New gauge</Button> : undefined}
    >
      <ListToolbar>
        <FilterToggles label="Calibration">
          {CAL_FILTERS.map((f) => (
            <ToggleButton key={f.label} className={s.touch} checked={calibration === f.value} appearance={calibration === f.value ? 'primary' : 'secondary'} onClick={() => setLp({ filters: { calibration: f.value } })}>
              {f.label}
            </ToggleButton>
          ))}
        </FilterToggles>
        <SearchInput label="Search tag or description" value={lp.q} onChange={(q) => setLp({ q })} />
        <FilterSelect label="Kind" value={kind} allLabel="All kinds" options={GAUGE_KINDS.map((k) => ({ value: k, label: GAUGE_KIND_LABELS[k] }))} onChange={(v) => setLp({ filters: { kind: v } })} />
      </ListToolbar>
      {list.isPending ? (
        <Loading />
      ) : items.length === 0 && !filtered ? (
        <EmptyState title="No gauges yet">{canWrite ? 'Add measuring equipment with “New gauge”.' : 'An engineer adds gauges here.'}</EmptyState>
      ) : (
        <TableFrame footer={<Pager page={lp.page} pageSize={lp.pageSize} total={list.data?.total ?? 0} fetching={list.isFetching} onPage={(page) => setLp({ page })} />}>
          <Table aria-label="Gauges" size="small">
            <TableHeader>
              <TableRow>
                <SortHeader field="assetTag" sort={lp.sort} onSort={(sort) => setLp({ sort })}>Asset tag</SortHeader>
                <SortHeader field="kind" sort={lp.sort} onSort={(sort) => setLp({ sort })}>Kind</SortHeader>
                <HeadCell>Description</HeadCell>
                <HeadCell>Resolution</HeadCell>
                <HeadCell>Range</HeadCell>
                <SortHeader field="calibrationDueOn" sort={lp.sort} onSort={(sort) => setLp({ sort })}>Due on</SortHeader>
                <HeadCell>Calibration</HeadCell>
                {canWrite ? <HeadCell><span className={s.srOnly}>Actions</span></HeadCell> : null}
              </TableRow>
            </TableHeader>
            <TableBody>
              {items.length === 0 ? <TableRow><TableCell colSpan={canWrite ? 8 : 7}>No gauge matches these filters.</TableCell></TableRow> : null}
              {items.map((g) => (
                <TableRow key={g.id} aria-label={`Gauge ${g.assetTag}`}>
                  <TableCell className={mergeClasses(s.tag, s.nowrap)}>{g.assetTag}</TableCell>
                  <TableCell className={s.nowrap}>{GAUGE_KIND_LABELS[g.kind]}</TableCell>
                  <TableCell className={s.desc}>{g.description}</TableCell>
                  <TableCell className={s.num}>{g.resolution} {g.unit}</TableCell>
                  <TableCell className={s.num}>{range(g)}</TableCell>
                  <TableCell className={s.num}>{formatCalendarDay(g.calibrationDueOn)}</TableCell>
                  <TableCell className={s.nowrap}>
                    <CalibrationPill gauge={g} />
                    {/* In service is the normal case; only the exception is said. */}
                    {g.status === 'out-of-service' ? <> <StatusPill tone="neutral">{GAUGE_STATUS_LABELS[g.status]}</StatusPill></> : null}
                  </TableCell>
                  {canWrite ? (
                    <TableCell className={s.nowrap}>
                      <div className={s.actions}>
                        <Button className={s.rowBtn} size="small" onClick={() => setCalibrating(g)} aria-label={`Record calibration of ${g.assetTag}`}>Record calibration</Button>
                        <Button className={s.rowBtn} size="small" appearance="subtle" onClick={() => setPanel({ mode: 'edit', gauge: g })} aria-label={`Edit gauge ${g.assetTag}`}>Edit</Button>
                      </div>
                    </TableCell>
                  ) : null}
                </TableRow>
              ))}
            </TableBody>
          </Table>
        </TableFrame>
      )}
      <GaugePanel mode={panel?.mode ?? null} gauge={panel?.gauge} onClose={() => setPanel(null)} />
      <CalibrationDialog gauge={calibrating} onClose={() => setCalibrating(null)} />
    </Page>
  );
}
