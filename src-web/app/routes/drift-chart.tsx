import { Button, Caption1, Field, Input, MessageBar, MessageBarBody, Subtitle2, Table, TableBody, TableCell, TableHeader, TableRow, makeStyles, tokens } from '@fluentui/react-components';
import { Suspense, lazy, useRef, useState } from 'react';
import { Link, useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { useQueryClient } from '@tanstack/react-query';
import type { ChartResponse, DriftSignal } from '@shared/schemas/drift';
import { Page } from '../../components/page';
import { EmptyState } from '../../components/empty-state';
import { HeadCell, Loading, TableFrame } from '../../components/data-table';
import { StatusPill } from '../../components/status-pill';
import { paths } from '../../config/paths';
import { useChart } from '../../features/drift/api/drift';
import { chartsPng, download, fmt, pointsCsv } from '../../features/drift/components/chart-data';
import { CapabilityPanel } from '../../features/drift/components/capability-panel';
import { ForecastPanel } from '../../features/drift/components/forecast-panel';
import { FreezeDialog } from '../../features/drift/components/freeze-dialog';
import { AckDialog } from '../../features/drift/components/ack-dialog';
import { RaiseNcrPanel } from '../../features/ncrs/components/raise-ncr-panel';
import { useCanManageMasterData } from '../../features/auth/hooks/use-can';
import { chartColours } from '../../theme/theme';
import { useThemeMode } from '../../theme/theme-mode';
import { formatDay } from '../../lib/format';

// The chart library loads only when a chart is opened.
const ControlCharts = lazy(() => import('../../features/drift/components/control-charts'));

const useStyles = makeStyles({
  back: { color: tokens.colorBrandForeground1, textDecoration: 'none', display: 'inline-flex', minHeight: '32px', alignItems: 'center' },
  actions: { display: 'flex', gap: '8px', flexWrap: 'wrap' },
  touch: { minHeight: '44px' },
  rowBtn: { minHeight: '36px' },
  rowActions: { display: 'flex', gap: '6px', whiteSpace: 'nowrap' },
  card: { border: `1px solid ${tokens.colorNeutralStroke2}`, borderRadius: tokens.borderRadiusLarge, padding: '14px 16px', backgroundColor: tokens.colorNeutralBackground1, marginBottom: '16px' },
  info: { display: 'flex', flexWrap: 'wrap', gap: '6px 18px', alignItems: 'center', marginBottom: '10px' },
  muted: { color: tokens.colorNeutralForeground3 },
  range: { display: 'flex', gap: '10px', alignItems: 'flex-end', flexWrap: 'wrap', marginLeft: 'auto' },
  grid: { display: 'grid', gridTemplateColumns: 'minmax(0, 1fr) minmax(0, 1fr)', gap: '16px', marginBottom: '16px', '@media (max-width: 1000px)': { gridTemplateColumns: '1fr' } },
  rule: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 700 },
  num: { fontVariantNumeric: 'tabular-nums', whiteSpace: 'nowrap' },
  h2: { display: 'block', margin: '8px 0 10px' },
  lotLink: { color: tokens.colorBrandForeground1 },
  more: { display: 'flex', justifyContent: 'space-between', alignItems: 'center', gap: '12px', padding: '8px 12px', borderTop: `1px solid ${tokens.colorNeutralStroke2}` },
});

const CHART_TITLE: Record<ChartResponse['chart'], string> = { 'xbar-r': 'X̄ and R chart', 'xbar-s': 'X̄ and s chart', 'i-mr': 'Individuals and moving range chart', p: 'p chart (fraction nonconforming)' };

function LimitsLine({ chart }: { chart: ChartResponse }) {
  const s = useStyles();
  const l = chart.limits;
  if (!l) {
    return (
      <span>
        <StatusPill tone="info">Trial limits</StatusPill>{' '}
        <span className={s.muted}>
          {chart.trial ? `Phase I from all ${chart.trial.count} unfrozen subgroups; freeze limits to judge new lots against a fixed baseline.` : (chart.trialNote ?? 'Not enough subgroups for limits yet.')}
        </span>
      </span>
    );
  }
  return (
    <span>
      <StatusPill tone="ok">Limits version {l.version}</StatusPill>{' '}
      <span className={s.muted}>
        frozen {formatDay(l.frozenAt)}
        {l.frozenByEmail ? ` by ${l.frozenByEmail}` : ''} from the {l.baseline.description}
        {l.excludedPoints.length ? `, ${l.excludedPoints.length} excluded (lots ${[...new Set(l.excludedPoints.map((p) => p.lotRef))].join(', ')})` : ''}: “{l.reason.replace(/[.\s]+$/, '')}”. Centre {fmt(l.center)}
        {l.ucl != null ? `, limits ${fmt(l.lcl)} – ${fmt(l.ucl)}` : ''}.
        {chart.segments.some((g) => g.limitVersion === l.version) ? '' : ' It applies to lots decided from now on; the points shown were judged before it.'}
      </span>
    </span>
  );
}

const SHOWN_SIGNALS = 20;

function SignalsTable({ chart, onAck, onRaise, canAck }: { chart: ChartResponse; onAck: (s: DriftSignal) => void; onRaise: (s: DriftSignal) => void; canAck: boolean }) {
  const s = useStyles();
  const [all, setAll] = useState(false);
  if (!chart.signals.length) return <Caption1 className={s.muted}>No drift signals have been raised for this chart.</Caption1>;
  // Open signals first (newest first within each), so the work to do is on top.
  const sorted = [...chart.signals].sort((a, b) => (a.status === 'open' ? 0 : 1) - (b.status === 'open' ? 0 : 1) || b.createdAt.localeCompare(a.createdAt) || b.lotRef - a.lotRef);
  const shown = all ? sorted : sorted.slice(0, SHOWN_SIGNALS);
  const open = chart.signals.filter((g) => g.status === 'open').length;
  return (
    <TableFrame
      footer={
        sorted.length > SHOWN_SIGNALS ? (
          <div className={s.more}>
            <Caption1 className={s.muted}>
              {shown.length} of {sorted.length} signals shown · {open} open
            </Caption1>
            <Button className={s.rowBtn} onClick={() => setAll(!all)}>{all ? `Show the first ${SHOWN_SIGNALS}` : `Show all ${sorted.length}`}</Button>
          </div>
        ) : undefined
      }
    >
      <Table aria-label="Drift signals" size="small">
        <TableHeader>
          <TableRow>
            <HeadCell>Rule</HeadCell>
            <HeadCell>Lot</HeadCell>
            <HeadCell>What happened</HeadCell>
            <HeadCell>Judged against</HeadCell>
            <HeadCell>Raised</HeadCell>
            <HeadCell>Status</HeadCell>
            {canAck ? <HeadCell /> : null}
          </TableRow>
        </TableHeader>
        <TableBody>
          {shown.map((g) => (
            <TableRow key={g.id}>
              <TableCell>
                <span className={s.rule}>{g.rule}</span> <span className={s.muted}>{g.chart === 'dispersion' ? '(spread)' : ''}</span>
              </TableCell>
              <TableCell className={s.num}>
                <Link className={s.lotLink} to={paths.lot(g.lotId)}>{g.lotRef}</Link>
                {g.serial != null ? ` · core ${g.serial}` : ''}
              </TableCell>
              <TableCell>{g.message}</TableCell>
              <TableCell>{g.limitVersion === null ? 'trial limits' : `version ${g.limitVersion}`}</TableCell>
              <TableCell className={s.num}>{formatDay(g.createdAt)}</TableCell>
              <TableCell>
                {g.status === 'open' ? <StatusPill tone="pending">Open</StatusPill> : g.status === 'acknowledged' ? <StatusPill tone="neutral" title={g.ackNote ?? undefined}>Acknowledged</StatusPill> : <StatusPill tone="info">NCR opened</StatusPill>}
                {g.ncrId ? (
                  <>
                    {' '}
                    <Link className={s.lotLink} to={paths.ncr(g.ncrId)}>{g.ncrNumber ?? 'the NCR'}</Link>
                  </>
                ) : null}
              </TableCell>
              {canAck ? (
                <TableCell>
                  <div className={s.rowActions}>
                    {g.status === 'open' ? (
                      <Button className={s.rowBtn} size="small" onClick={() => onAck(g)} aria-label={`Acknowledge ${g.rule}${g.chart === 'dispersion' ? ' (spread)' : ''} on lot ${g.lotRef}`}>
                        Acknowledge
                      </Button>
                    ) : null}
                    {g.status !== 'ncr-opened' ? (
                      <Button className={s.rowBtn} size="small" onClick={() => onRaise(g)} aria-label={`Open an NCR from ${g.rule}${g.chart === 'dispersion' ? ' (spread)' : ''} on lot ${g.lotRef}`}>
                        Open NCR
                      </Button>
                    ) : null}
                  </div>
                </TableCell>
              ) : null}
            </TableRow>
          ))}
        </TableBody>
      </Table>
    </TableFrame>
  );
}

export function DriftChartPage() {
  const s = useStyles();
  const { supplierId = '', partId = '', code = '' } = useParams();
  const [search, setSearch] = useSearchParams();
  const from = search.get('from') ?? undefined;
  const to = search.get('to') ?? undefined;
  const q = useChart({ supplierId, partId, characteristicCode: code, from, to });
  const canWrite = useCanManageMasterData();
  const { mode } = useThemeMode();
  const [freezing, setFreezing] = useState(false);
  const [acking, setAcking] = useState<DriftSignal | null>(null);
  const [raising, setRaising] = useState<DriftSignal | null>(null);
  const navigate = useNavigate();
  const qc = useQueryClient();
  const [exportError, setExportError] = useState<string | null>(null);
  const [range, setRange] = useState({ from: from ?? '', to: to ?? '' });
  const chartRef = useRef<HTMLDivElement>(null);
  const chart = q.data;

  const back = (
    <Link className={s.back} to={paths.drift}>
      ← Drift watch
    </Link>
  );
  if (q.isPending) return <Loading />;
  if (q.isError || !chart) {
    return (
      <Page title="Control chart">
        {back}
        <EmptyState title="This chart cannot be shown">{q.error?.message ?? 'It was not found.'}</EmptyState>
      </Page>
    );
  }
  const c = chart.characteristic;
  const name = `${chart.supplier.code}-${chart.part.partNumber}-${c.code}`;
  const flagged = chart.points.filter((p) => p.flags?.length).length;
  const exportPng = async () => {
    setExportError(null);
    try {
      if (!chartRef.current) throw new Error('There is no chart to export yet.');
      const colours = chartColours[mode];
      download(`${name}.png`, await chartsPng(chartRef.current, `${c.code} ${c.name} · ${chart.supplier.name} · ${chart.part.partNumber} rev ${chart.part.revision}`, colours));
    } catch (err) {
      setExportError(err instanceof Error ? err.message : 'The image could not be made.');
    }
  };

  return (
    <Page
      title={`${c.code} · ${c.name}`}
      lead={`${chart.supplier.name} · ${chart.part.partNumber} rev ${chart.part.revision} · ${CHART_TITLE[chart.chart]} · plan revision ${c.planRevision} · ${c.ruleSet === 'nelson' ? 'Nelson rules' : 'Western Electric rules + 6-point trend'}`}
      actions={
        <div className={s.actions}>
          {canWrite ? (
            <Button className={s.touch} appearance="primary" onClick={() => setFreezing(true)} disabled={chart.totalPoints < 2}>
              Freeze limits…
            </Button>
          ) : null}
          <Button className={s.touch} onClick={exportPng} disabled={!chart.points.length}>Export PNG</Button>
          <Button className={s.touch} onClick={() => download(`${name}.csv`, new Blob([pointsCsv(chart)], { type: 'text/csv' }))} disabled={!chart.points.length}>
            Export CSV
          </Button>
        </div>
      }
    >
      {back}
      <section className={s.card} aria-label="Control chart">
        <div className={s.info}>
          <LimitsLine chart={chart} />
          <form
            className={s.range}
            onSubmit={(e) => {
              e.preventDefault();
              const next = new URLSearchParams();
              if (range.from) next.set('from', range.from);
              if (range.to) next.set('to', range.to);
              setSearch(next);
            }}
          >
            <Field label="Received from">
              <Input type="date" value={range.from} onChange={(_, d) => setRange((r) => ({ ...r, from: d.value }))} />
            </Field>
            <Field label="to">
              <Input type="date" value={range.to} onChange={(_, d) => setRange((r) => ({ ...r, to: d.value }))} />
            </Field>
            <Button type="submit" className={s.touch}>Show</Button>
            {from || to ? (
              <Button
                className={s.touch}
                appearance="subtle"
                onClick={() => {
                  setRange({ from: '', to: '' });
                  setSearch(new URLSearchParams());
                }}
              >
                All lots
              </Button>
            ) : null}
          </form>
        </div>
        <Caption1 className={s.muted}>
          {chart.subgrouping.explanation} {chart.points.length} subgroups shown · flagged points: {flagged}
          {chart.skipped.length ? ` · ${chart.skipped.length} lot${chart.skipped.length === 1 ? '' : 's'} left off (${chart.skipped.slice(0, 3).map((k) => `lot ${k.lotRef}: ${k.reason}`).join('; ')}${chart.skipped.length > 3 ? '; …' : ''})` : ''}
        </Caption1>
        {exportError ? (
          <MessageBar intent="error">
            <MessageBarBody>{exportError}</MessageBarBody>
          </MessageBar>
        ) : null}
        <div ref={chartRef} style={{ marginTop: 10 }}>
          {chart.points.length ? (
            <Suspense fallback={<Loading label="Loading the chart" />}>
              <ControlCharts chart={chart} />
            </Suspense>
          ) : (
            <EmptyState title="No subgroups in this range">Decided lots with results for {c.code} appear here.</EmptyState>
          )}
        </div>
      </section>
      <div className={s.grid}>
        <CapabilityPanel chart={chart} />
        {c.wearDriven ? <ForecastPanel chart={chart} /> : null}
      </div>
      <Subtitle2 as="h2" className={s.h2}>
        Drift signals
      </Subtitle2>
      <SignalsTable chart={chart} canAck={canWrite} onAck={setAcking} onRaise={setRaising} />
      <FreezeDialog chart={chart} open={freezing} onClose={() => setFreezing(false)} />
      <AckDialog signal={acking} onClose={() => setAcking(null)} />
      <RaiseNcrPanel
        open={!!raising}
        lot={null}
        signal={raising ? { signal: raising, chart } : null}
        onClose={() => setRaising(null)}
        onCreated={(n) => {
          void qc.invalidateQueries({ queryKey: ['spc'] });
          void navigate(paths.ncr(n.id));
        }}
      />
    </Page>
  );
}
