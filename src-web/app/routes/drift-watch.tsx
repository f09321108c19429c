import { Caption1, MessageBar, MessageBarBody, MessageBarTitle, Table, TableBody, TableCell, TableHeader, TableRow, makeStyles, tokens } from '@fluentui/react-components';
import { Fragment, useMemo } from 'react';
import { Link } from 'react-router-dom';
import { WATCH_STATUS_LABELS, type WatchRow, type WatchStatus } from '@shared/schemas/drift';
import { Page } from '../../components/page';
import { EmptyState } from '../../components/empty-state';
import { HeadCell, Loading, TableFrame } from '../../components/data-table';
import { StatusPill, type Tone } from '../../components/status-pill';
import { paths } from '../../config/paths';
import { useWatch } from '../../features/drift/api/drift';
import { lotsText } from '../../features/drift/components/forecast-panel';
import { formatDay } from '../../lib/format';

const useStyles = makeStyles({
  group: { backgroundColor: tokens.colorNeutralBackground3 },
  groupCell: { fontWeight: 700, paddingTop: '10px', paddingBottom: '6px' },
  groupSub: { fontWeight: 400, color: tokens.colorNeutralForeground3, marginLeft: '8px' },
  code: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 700, color: tokens.colorBrandForeground1, textDecoration: 'none', display: 'inline-flex', minHeight: '36px', alignItems: 'center', ':hover': { textDecoration: 'underline' } },
  name: { color: tokens.colorNeutralForeground2, marginLeft: '8px' },
  num: { fontVariantNumeric: 'tabular-nums', whiteSpace: 'nowrap' },
  muted: { color: tokens.colorNeutralForeground3 },
  notices: { display: 'flex', flexDirection: 'column', gap: '8px', marginBottom: '16px' },
  noticeLink: { color: 'inherit', fontWeight: 600 },
});

export const STATUS_TONE: Record<WatchStatus, Tone> = { 'in-control': 'ok', signal: 'pending', 'die-service-due': 'bad', 'insufficient-data': 'neutral' };
const CHART_LABEL: Record<WatchRow['chart'], string> = { 'xbar-r': 'X̄–R', 'xbar-s': 'X̄–s', 'i-mr': 'I–MR', p: 'p' };

/** Drift watch: every charted characteristic per supplier and part, its status, and die-service notices first. */
export function DriftWatchPage() {
  const s = useStyles();
  const watch = useWatch();
  const rows = useMemo(() => watch.data ?? [], [watch.data]);
  const groups = useMemo(() => {
    const m = new Map<string, WatchRow[]>();
    for (const r of rows) {
      const k = `${r.supplierId}|${r.partId}`;
      m.set(k, [...(m.get(k) ?? []), r]);
    }
    return [...m.values()];
  }, [rows]);
  const due = rows.filter((r) => r.status === 'die-service-due');
  const open = rows.reduce((a, r) => a + r.openSignals, 0);

  return (
    <Page title="Drift watch" lead="Control charts per supplier, part and characteristic: run-rule signals, capability and the die-wear forecast, so a drifting process is seen before a lot fails.">
      {watch.isPending ? (
        <Loading />
      ) : rows.length === 0 ? (
        <EmptyState title="Nothing to watch yet">Charts appear here once lots of a part with charted characteristics have been decided.</EmptyState>
      ) : (
        <>
          <div className={s.notices}>
            {due.map((r) => (
              <MessageBar key={`${r.supplierId}${r.partId}${r.characteristicCode}`} intent="error" layout="multiline">
                <MessageBarBody>
                  <MessageBarTitle>Die service due</MessageBarTitle>
                  {r.supplierName}, {r.partNumber} rev {r.partRevision}:{' '}
                  <Link className={s.noticeLink} to={paths.driftChart(r.supplierId, r.partId, r.characteristicCode)}>
                    {r.characteristicName}
                  </Link>{' '}
                  reaches its limit in about {lotsText(r.lotsToLimit)} (conservative {lotsText(r.lotsToLimitLower)}).
                </MessageBarBody>
              </MessageBar>
            ))}
            <Caption1 className={s.muted}>
              {rows.length} chart{rows.length === 1 ? '' : 's'} · {open} open signal{open === 1 ? '' : 's'} · {due.length} die-service notice{due.length === 1 ? '' : 's'}
            </Caption1>
          </div>
          <TableFrame>
            <Table aria-label="Drift watch" size="small">
              <TableHeader>
                <TableRow>
                  <HeadCell>Characteristic</HeadCell>
                  <HeadCell>Chart</HeadCell>
                  <HeadCell>Status</HeadCell>
                  <HeadCell>Open signals</HeadCell>
                  <HeadCell>Lots to limit</HeadCell>
                  <HeadCell>Limits</HeadCell>
                  <HeadCell>Lots</HeadCell>
                  <HeadCell>Last lot</HeadCell>
                </TableRow>
              </TableHeader>
              <TableBody>
                {groups.map((g) => (
                  <Fragment key={`${g[0].supplierId}${g[0].partId}`}>
                    <TableRow className={s.group}>
                      <TableCell colSpan={8} className={s.groupCell}>
                        {g[0].supplierName} <span className={s.muted}>({g[0].supplierCode})</span>
                        <span className={s.groupSub}>{g[0].partNumber} rev {g[0].partRevision}</span>
                      </TableCell>
                    </TableRow>
                    {g.map((r) => (
                      <TableRow key={r.characteristicCode} aria-label={`${r.supplierCode} ${r.partNumber} ${r.characteristicCode}`}>
                        <TableCell>
                          <Link className={s.code} to={paths.driftChart(r.supplierId, r.partId, r.characteristicCode)}>
                            {r.characteristicCode}
                          </Link>
                          <span className={s.name}>{r.characteristicName}</span>
                        </TableCell>
                        <TableCell>{CHART_LABEL[r.chart]}</TableCell>
                        <TableCell>
                          <StatusPill tone={STATUS_TONE[r.status]}>{WATCH_STATUS_LABELS[r.status]}</StatusPill>
                        </TableCell>
                        <TableCell className={s.num}>{r.openSignals || <span className={s.muted}>0</span>}</TableCell>
                        <TableCell className={s.num}>
                          {r.wearDriven ? (
                            r.lotsToLimit != null ? (
                              <>
                                about {lotsText(r.lotsToLimit)} <span className={s.muted}>(≥ {lotsText(r.lotsToLimitLower)})</span>
                              </>
                            ) : (
                              <span className={s.muted}>no upward trend</span>
                            )
                          ) : (
                            <span className={s.muted}>—</span>
                          )}
                        </TableCell>
                        <TableCell>{r.limitVersion ? `version ${r.limitVersion}` : <span className={s.muted}>trial</span>}</TableCell>
                        <TableCell className={s.num}>{r.lots}</TableCell>
                        <TableCell className={s.num}>{r.lastLotAt ? formatDay(r.lastLotAt) : '—'}</TableCell>
                      </TableRow>
                    ))}
                  </Fragment>
                ))}
              </TableBody>
            </Table>
          </TableFrame>
        </>
      )}
    </Page>
  );
}
