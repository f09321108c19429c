import { Body1, Caption1, MessageBar, MessageBarBody, MessageBarTitle, Table, TableBody, TableCell, TableHeader, TableRow, makeStyles, mergeClasses, tokens } from '@fluentui/react-components';
import { Link, useSearchParams } from 'react-router-dom';
import { STEP_INFO } from '@shared/schemas/corrective-action';
import { LOT_STATUS_LABELS } from '@shared/schemas/receiving';
import { Page } from '../../components/page';
import { Section } from '../../components/section';
import { EmptyState } from '../../components/empty-state';
import { HeadCell, Loading, TableFrame } from '../../components/data-table';
import { paths } from '../../config/paths';
import { useMe } from '../../features/auth/api/get-me';
import { useNotices, useOpenSteps, useScars } from '../../features/corrective-actions/api/scars';
import { DueDate, ScarStatusPill } from '../../features/corrective-actions/components/scar-status';
import { useNcrs } from '../../features/ncrs/api/ncrs';
import { NcrStatusPill } from '../../features/ncrs/components/ncr-status';
import { useLots } from '../../features/lots/api/lots';
import { formatDay } from '../../lib/format';

const useStyles = makeStyles({
  number: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 700, color: tokens.colorBrandForeground1, textDecoration: 'none', whiteSpace: 'nowrap', ':hover': { textDecoration: 'underline' } },
  todo: { display: 'grid', gridTemplateColumns: 'repeat(auto-fill, minmax(280px, 1fr))', gap: '12px', listStyle: 'none', margin: 0, padding: 0 },
  todoItem: { border: `1px solid ${tokens.colorNeutralStroke2}`, borderLeft: `4px solid ${tokens.colorPaletteMarigoldBorderActive}`, borderRadius: tokens.borderRadiusMedium, padding: '10px 12px', display: 'flex', flexDirection: 'column', gap: '2px' },
  returned: { borderLeft: `4px solid ${tokens.colorPaletteRedBorder2}` },
  notice: { marginBottom: '10px' },
  highlight: { outline: `3px solid ${tokens.colorBrandStroke1}` },
  muted: { color: tokens.colorNeutralForeground3 },
  code: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 600, marginRight: '6px' },
});

/** What a supplier sees of Harrowgate: its requests to answer, its nonconformances, lots and notices. */
export function SupplierDeskPage() {
  const s = useStyles();
  const { data: me } = useMe();
  const [sp] = useSearchParams();
  const highlighted = sp.get('notice');
  const notices = useNotices();
  const steps = useOpenSteps();
  const scars = useScars({ page: 1, pageSize: 50, status: undefined });
  const ncrs = useNcrs({ page: 1, pageSize: 50 });
  const lots = useLots({ page: 1, pageSize: 10, sort: '-receivedAt' });
  return (
    <Page title="Supplier desk" lead={`${me?.name ? `${me.name}: ` : ''}the corrective actions Harrowgate Drive Systems asks of you, your nonconformances, lots and notices.`}>
      {notices.data?.items.length ? (
        <Section title="Notices">
          {notices.data.items.map((n) => (
            <MessageBar key={n.id} intent="warning" className={mergeClasses(s.notice, highlighted === n.id && s.highlight)} id={`notice-${n.id}`}>
              <MessageBarBody>
                <MessageBarTitle>{n.title}</MessageBarTitle>
                {n.body} <Caption1 className={s.muted}>{formatDay(n.createdAt)}</Caption1>
              </MessageBarBody>
            </MessageBar>
          ))}
        </Section>
      ) : null}

      <Section title="To answer">
        {steps.isPending ? (
          <Loading />
        ) : steps.data?.items.length ? (
          <ul className={s.todo}>
            {steps.data.items.map((x) => (
              <li key={`${x.id}:${x.step}`} className={mergeClasses(s.todoItem, x.status === 'returned' && s.returned)}>
                <Link className={s.number} to={paths.deskScar(x.id)}>{x.number} · {x.step} {STEP_INFO[x.step].title}</Link>
                <Caption1>{x.status === 'returned' ? 'Returned: please revise' : 'To answer'}</Caption1>
                <DueDate dueOn={x.dueOn} overdue={!!x.dueOn && x.dueOn < new Date().toISOString().slice(0, 10)} />
              </li>
            ))}
          </ul>
        ) : (
          <Body1 className={s.muted}>Nothing to answer right now.</Body1>
        )}
      </Section>

      <Section title="Corrective actions">
        {scars.isPending ? <Loading /> : scars.data?.items.length ? (
          <TableFrame>
            <Table aria-label="Your corrective actions" size="small">
              <TableHeader><TableRow><HeadCell>Number</HeadCell><HeadCell>State</HeadCell><HeadCell>Title</HeadCell><HeadCell>Part</HeadCell><HeadCell>Next due</HeadCell></TableRow></TableHeader>
              <TableBody>
                {scars.data.items.map((x) => (
                  <TableRow key={x.id}>
                    <TableCell><Link className={s.number} to={paths.deskScar(x.id)}>{x.number}</Link></TableCell>
                    <TableCell><ScarStatusPill status={x.status} /></TableCell>
                    <TableCell>{x.title}</TableCell>
                    <TableCell>{x.partNumber ? `${x.partNumber} ${x.partRevision}` : '—'}</TableCell>
                    <TableCell>{x.nextDueStep ? <>{x.nextDueStep} · <DueDate dueOn={x.nextDueOn} overdue={x.overdue} /></> : '—'}</TableCell>
                  </TableRow>
                ))}
              </TableBody>
            </Table>
          </TableFrame>
        ) : <EmptyState title="No corrective action requests">When Harrowgate asks for one, it appears here and you get a mail.</EmptyState>}
      </Section>

      <Section title="Nonconformances">
        {ncrs.isPending ? <Loading /> : ncrs.data?.items.length ? (
          <TableFrame>
            <Table aria-label="Your nonconformances" size="small">
              <TableHeader><TableRow><HeadCell>Number</HeadCell><HeadCell>State</HeadCell><HeadCell>Title</HeadCell><HeadCell>Lot</HeadCell><HeadCell>Defects</HeadCell><HeadCell>Cores</HeadCell><HeadCell>Raised</HeadCell></TableRow></TableHeader>
              <TableBody>
                {ncrs.data.items.map((n) => (
                  <TableRow key={n.id}>
                    <TableCell><Link className={s.number} to={paths.deskNcr(n.id)}>{n.number}</Link></TableCell>
                    <TableCell><NcrStatusPill status={n.status} /></TableCell>
                    <TableCell>{n.title}</TableCell>
                    <TableCell>{n.supplierLotNumber ?? '—'}</TableCell>
                    <TableCell>{n.defectCodes.map((c) => <span key={c} className={s.code}>{c}</span>)}</TableCell>
                    <TableCell>{n.suspectQuantity}</TableCell>
                    <TableCell className={s.muted}>{formatDay(n.raisedAt)}</TableCell>
                  </TableRow>
                ))}
              </TableBody>
            </Table>
          </TableFrame>
        ) : <Body1 className={s.muted}>No nonconformances on your lots.</Body1>}
      </Section>

      <Section title="Recent lots">
        {lots.isPending ? <Loading /> : lots.data?.items.length ? (
          <TableFrame>
            <Table aria-label="Your recent lots" size="small">
              <TableHeader><TableRow><HeadCell>Lot</HeadCell><HeadCell>Your lot number</HeadCell><HeadCell>Part</HeadCell><HeadCell>Cores</HeadCell><HeadCell>Received</HeadCell><HeadCell>State</HeadCell></TableRow></TableHeader>
              <TableBody>
                {lots.data.items.map((l) => (
                  <TableRow key={l.id}>
                    <TableCell><Link className={s.number} to={paths.lot(l.id)}>#{l.ref}</Link></TableCell>
                    <TableCell>{l.supplierLotNumber}</TableCell>
                    <TableCell>{l.partNumber} {l.partRevision}</TableCell>
                    <TableCell>{l.quantity}</TableCell>
                    <TableCell className={s.muted}>{formatDay(l.receivedAt)}</TableCell>
                    <TableCell>{LOT_STATUS_LABELS[l.status]}</TableCell>
                  </TableRow>
                ))}
              </TableBody>
            </Table>
          </TableFrame>
        ) : <Body1 className={s.muted}>No lots received yet.</Body1>}
      </Section>
    </Page>
  );
}
