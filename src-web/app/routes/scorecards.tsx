import { Button, Field, Input, Select, Subtitle1, Table, TableBody, TableCell, TableHeader, TableRow, makeStyles, tokens } from '@fluentui/react-components';
import { useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';
import { scorecardRange } from '@shared/compute/scorecard';
import { ComputeError } from '@shared/compute/errors';
import { SCORECARD_DEFINITIONS, SCORECARD_PERIOD_LABELS, SCORECARD_PERIODS, type ScorecardPeriod } from '@shared/schemas/scorecard';
import { Page } from '../../components/page';
import { EmptyState } from '../../components/empty-state';
import { HeadCell, ListToolbar, Loading, TableFrame } from '../../components/data-table';
import { StatusPill } from '../../components/status-pill';
import { useMe } from '../../features/auth/api/get-me';
import { useScorecards } from '../../features/scorecards/api/scorecards';
import { ScorecardCard } from '../../features/scorecards/components/scorecard-card';
import { formatCost, formatCount, formatPpm } from '../../features/scorecards/components/format';

const useStyles = makeStyles({
  section: { marginBottom: '28px' },
  h2: { display: 'block', margin: '0 0 10px' },
  cards: { display: 'grid', gridTemplateColumns: 'repeat(auto-fill, minmax(360px, 1fr))', gap: '16px' },
  num: { fontVariantNumeric: 'tabular-nums', whiteSpace: 'nowrap', textAlign: 'right' },
  date: { width: '160px' },
  touch: { minHeight: '44px' },
  link: { color: tokens.colorBrandForeground1, fontWeight: 600, textDecoration: 'none', ':hover': { textDecoration: 'underline' } },
  code: { fontFamily: tokens.fontFamilyMonospace, color: tokens.colorNeutralForeground3, marginLeft: '6px' },
  notes: { color: tokens.colorNeutralForeground3, margin: '8px 0 0', paddingLeft: '18px', maxWidth: '100ch', fontSize: tokens.fontSizeBase200 },
});

const todayIso = () => new Date().toISOString().slice(0, 10);

/** Supplier scorecards: a ranking across suppliers and one card each; a supplier user sees its own card. */
export function ScorecardsPage() {
  const s = useStyles();
  const { data: me } = useMe();
  const isSupplier = me?.role === 'supplier';
  const [sp, setSp] = useSearchParams();
  const period: ScorecardPeriod = (SCORECARD_PERIODS as readonly string[]).includes(sp.get('period') ?? '') ? (sp.get('period') as ScorecardPeriod) : 'month';
  const from = sp.get('from') || undefined;
  const to = sp.get('to') || undefined;
  // The same range rules as the API, checked here so a bad range says why before anything is sent.
  const checked = useMemo(() => {
    try {
      return { range: scorecardRange({ from, to, period }, todayIso()), error: null as null | { field: string; message: string } };
    } catch (e) {
      if (e instanceof ComputeError) return { range: null, error: { field: e.field ?? 'to', message: e.message } };
      throw e;
    }
  }, [from, to, period]);
  const list = useScorecards({ period, from, to }, !!checked.range);
  const set = (patch: Record<string, string | undefined>) =>
    setSp(
      (prev) => {
        const next = new URLSearchParams(prev);
        for (const [k, v] of Object.entries(patch)) {
          if (v) next.set(k, v);
          else next.delete(k);
        }
        return next;
      },
      { replace: true },
    );

  const data = checked.range ? list.data : undefined;
  const items = data?.items ?? [];
  return (
    <Page
      title={isSupplier ? 'Your scorecard' : 'Scorecards'}
      lead={isSupplier ? 'How your lots fared at Harrowgate receiving inspection: lots, PPM rejected, corrective actions and the cost of poor quality.' : 'Supplier performance per period: lots, PPM rejected, corrective actions, cost of poor quality and inspection severity, ranked.'}
    >
      <ListToolbar>
        <Field label="Periods">
          <Select className={s.touch} value={period} onChange={(_, d) => set({ period: d.value === 'month' ? undefined : d.value })}>
            {SCORECARD_PERIODS.map((p) => <option key={p} value={p}>{SCORECARD_PERIOD_LABELS[p]}</option>)}
          </Select>
        </Field>
        <Field label="From" validationState={checked.error?.field === 'from' ? 'error' : 'none'} validationMessage={checked.error?.field === 'from' ? checked.error.message : undefined}>
          <Input className={s.date} type="date" value={from ?? checked.range?.from ?? ''} max={to ?? checked.range?.to} onChange={(_, d) => set({ from: d.value || undefined })} />
        </Field>
        <Field label="To" validationState={checked.error?.field === 'to' ? 'error' : 'none'} validationMessage={checked.error?.field === 'to' ? checked.error.message : undefined}>
          <Input className={s.date} type="date" value={to ?? checked.range?.to ?? ''} min={from ?? checked.range?.from} onChange={(_, d) => set({ to: d.value || undefined })} />
        </Field>
        {from || to || period !== 'month' ? <Button className={s.touch} onClick={() => set({ from: undefined, to: undefined, period: undefined })}>Last 6 months</Button> : null}
      </ListToolbar>

      {!checked.range ? (
        <EmptyState title="Choose another range">{checked.error?.message}</EmptyState>
      ) : list.isError && !data ? (
        <EmptyState title="The scorecards could not be loaded">{list.error.message}</EmptyState>
      ) : !data ? (
        <Loading />
      ) : items.length === 0 ? (
        <EmptyState title="No suppliers yet">An engineer adds suppliers under Suppliers.</EmptyState>
      ) : (
        <>
          {!isSupplier ? (
            <section className={s.section} aria-label="Ranking">
              <Subtitle1 as="h2" className={s.h2}>Ranking</Subtitle1>
              <TableFrame>
                <Table aria-label="Supplier ranking" size="small">
                  <TableHeader>
                    <TableRow>
                      <HeadCell>Rank</HeadCell>
                      <HeadCell>Supplier</HeadCell>
                      <HeadCell>PPM</HeadCell>
                      <HeadCell>Lots</HeadCell>
                      <HeadCell>Rejected</HeadCell>
                      <HeadCell>Quantity</HeadCell>
                      <HeadCell>SCARs (on time / overdue)</HeadCell>
                      <HeadCell>Cost of poor quality</HeadCell>
                    </TableRow>
                  </TableHeader>
                  <TableBody>
                    {items.map((i) => (
                      <TableRow key={i.supplierId}>
                        <TableCell className={s.num}>{i.rank ?? '—'}</TableCell>
                        <TableCell>
                          <a className={s.link} href={`#card-${i.supplierId}`}>{i.supplierName}</a>
                          <span className={s.code}>{i.supplierCode}</span>
                          {i.approvalStatus !== 'approved' ? <> <StatusPill tone={i.approvalStatus === 'disapproved' ? 'bad' : 'pending'}>{i.approvalStatus === 'disapproved' ? 'Disapproved' : 'Conditional'}</StatusPill></> : null}
                        </TableCell>
                        <TableCell className={s.num}>{formatPpm(i.ppm)}</TableCell>
                        <TableCell className={s.num}>{formatCount(i.lots.received)}</TableCell>
                        <TableCell className={s.num}>{formatCount(i.lots.rejected)}</TableCell>
                        <TableCell className={s.num}>{formatCount(i.quantity.received)}</TableCell>
                        <TableCell className={s.num}>{i.scars.issued} ({i.scars.closedOnTime} / {i.scars.overdue})</TableCell>
                        <TableCell className={s.num}>{formatCost(i.costOfPoorQuality)}</TableCell>
                      </TableRow>
                    ))}
                  </TableBody>
                </Table>
              </TableFrame>
            </section>
          ) : null}

          <section className={s.section} aria-label={isSupplier ? 'Your card' : 'Supplier cards'}>
            {!isSupplier ? <Subtitle1 as="h2" className={s.h2}>Per supplier</Subtitle1> : null}
            <div className={s.cards}>
              {items.map((i) => <ScorecardCard key={i.supplierId} card={i} periods={data.periods} rankedOf={data.rankedOf} />)}
            </div>
          </section>

          <section aria-label="What the figures mean">
            <Subtitle1 as="h2" className={s.h2}>What the figures mean</Subtitle1>
            <ul className={s.notes}>
              {SCORECARD_DEFINITIONS.map((d) => <li key={d}>{d}</li>)}
            </ul>
          </section>
        </>
      )}
    </Page>
  );
}
