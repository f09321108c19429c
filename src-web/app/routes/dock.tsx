import { Button, Caption1, Table, TableBody, TableCell, TableHeader, TableRow, makeStyles, tokens } from '@fluentui/react-components';
import { lazy, Suspense, useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { Page } from '../../components/page';
import { EmptyState } from '../../components/empty-state';
import { HeadCell, Loading, Pager, TableFrame } from '../../components/data-table';
import { paths } from '../../config/paths';
import { useMe } from '../../features/auth/api/get-me';
import { useLots } from '../../features/lots/api/lots';
import { LotStatusPill, formatAge } from '../../features/lots/components/lot-status';
import { statusColours } from '../../theme/theme';
import { useThemeMode } from '../../theme/theme-mode';
import { formatWhen } from '../../lib/format';

const useStyles = makeStyles({
  receive: { minHeight: '56px', minWidth: '220px', fontSize: tokens.fontSizeBase500, paddingLeft: '28px', paddingRight: '28px' },
  ref: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 700, fontSize: tokens.fontSizeBase400, color: tokens.colorBrandForeground1, textDecoration: 'none', ':hover': { textDecoration: 'underline' } },
  age: { fontWeight: 700, fontVariantNumeric: 'tabular-nums', whiteSpace: 'nowrap', fontSize: tokens.fontSizeBase400 },
  num: { fontVariantNumeric: 'tabular-nums', whiteSpace: 'nowrap' },
  muted: { color: tokens.colorNeutralForeground3, display: 'block' },
  acre: { color: tokens.colorNeutralForeground3, display: 'block', whiteSpace: 'nowrap' },
  // The whole row opens the lot: a large target for a gloved finger (the link stays for keyboards).
  row: { height: '56px', cursor: 'pointer' },
  count: { color: tokens.colorNeutralForeground2, marginBottom: '10px', display: 'block' },
});

// The receive form (react-hook-form, zod, the sampling tables) loads when it is first wanted: on
// hover or focus of the button, so it is there by the time the button is pressed.
const loadReceiveDialog = () => import('../../features/lots/components/receive-lot-dialog');
const ReceiveLotDialog = lazy(async () => ({ default: (await loadReceiveDialog()).ReceiveLotDialog }));

/** A lot waiting longer than a shift at the dock is worth a look (common practice). */
const LONG_WAIT_H = 8;

export function DockPage() {
  const s = useStyles();
  const { data: me } = useMe();
  const navigate = useNavigate();
  const canReceive = me?.role === 'inspector' || me?.role === 'engineer';
  const [page, setPage] = useState(1);
  const [receiving, setReceiving] = useState(false);
  // Once opened, the dialog stays mounted so that closing it animates and keeps its state tidy.
  const [wanted, setWanted] = useState(false);
  // Refreshed every minute so the ages stay true on a screen left open at the dock.
  const lots = useLots({ page, pageSize: 50, status: 'waiting' }, 60_000);
  const items = lots.data?.items ?? [];
  const now = Date.now();
  const amber = statusColours[useThemeMode().mode].pending;

  return (
    <Page
      title="Dock"
      lead="Lots waiting for inspection, oldest first. Receive a lot as it comes off the truck; the sample to pull is worked out for you."
      actions={canReceive ? <Button appearance="primary" size="large" className={s.receive} onPointerEnter={() => void loadReceiveDialog()} onFocus={() => void loadReceiveDialog()} onClick={() => (setWanted(true), setReceiving(true))}>Receive a lot</Button> : undefined}
    >
      {lots.isPending ? (
        <Loading />
      ) : lots.error ? (
        <EmptyState title="The dock cannot be loaded">{lots.error.message}</EmptyState>
      ) : items.length === 0 ? (
        <EmptyState title="No lots waiting">
          {canReceive ? 'Everything received has been decided. When a pallet arrives, press “Receive a lot”.' : 'Everything received has been decided.'}
        </EmptyState>
      ) : (
        <>
          <Caption1 className={s.count} aria-live="polite">{lots.data.total} lot{lots.data.total === 1 ? '' : 's'} waiting</Caption1>
          <TableFrame footer={lots.data.total > 50 ? <Pager page={page} pageSize={50} total={lots.data.total} fetching={lots.isFetching} onPage={setPage} /> : undefined}>
            <Table aria-label="Lots waiting" size="medium">
              <TableHeader>
                <TableRow>
                  <HeadCell>Lot</HeadCell>
                  <HeadCell>Waiting</HeadCell>
                  <HeadCell>Supplier</HeadCell>
                  <HeadCell>Part</HeadCell>
                  <HeadCell>Quantity</HeadCell>
                  <HeadCell>Sample</HeadCell>
                  <HeadCell>Status</HeadCell>
                </TableRow>
              </TableHeader>
              <TableBody>
                {items.map((l) => {
                  const hours = (now - Date.parse(l.receivedAt)) / 3_600_000;
                  return (
                    <TableRow key={l.id} className={s.row} onClick={(e) => (e.target as HTMLElement).closest('a') || void navigate(paths.lot(l.id))}>
                      <TableCell>
                        <Link className={s.ref} to={paths.lot(l.id)} aria-label={`Open lot ${l.ref}`}>{l.ref}</Link>
                        <Caption1 className={s.muted}>{l.supplierLotNumber}</Caption1>
                      </TableCell>
                      <TableCell>
                        <span className={s.age} style={hours >= LONG_WAIT_H ? { color: amber } : undefined} title={`Received ${formatWhen(l.receivedAt)}`}>{formatAge(l.receivedAt, now)}</span>
                      </TableCell>
                      <TableCell>
                        <strong>{l.supplierCode}</strong>
                        <Caption1 className={s.muted}>{l.supplierName}</Caption1>
                      </TableCell>
                      <TableCell>
                        {l.partNumber} <Caption1>rev {l.partRevision}</Caption1>
                      </TableCell>
                      <TableCell className={s.num}>{l.quantity}</TableCell>
                      <TableCell className={s.num}>
                        {l.sampling.sampleSize}
                        {l.sampling.inspectAll ? ' (100 %)' : ''}
                        <Caption1 className={s.acre}>Ac {l.sampling.accept} / Re {l.sampling.reject}{l.sampling.severity !== 'normal' ? ` · ${l.sampling.severity}` : ''}</Caption1>
                      </TableCell>
                      <TableCell><LotStatusPill status={l.status} /></TableCell>
                    </TableRow>
                  );
                })}
              </TableBody>
            </Table>
          </TableFrame>
        </>
      )}
      {canReceive && wanted ? (
        <Suspense fallback={null}>
          <ReceiveLotDialog open={receiving} onClose={() => setReceiving(false)} />
        </Suspense>
      ) : null}
    </Page>
  );
}
