import { Body1, Caption1, Table, TableBody, TableCell, TableHeader, TableRow, makeStyles, mergeClasses, tokens } from '@fluentui/react-components';
import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { ROLE_LABELS, ROLES, type SessionUser } from '@shared/schemas/auth';
import type { AdminDashboard, AuditorDashboard, DashboardDueStep, EngineerDashboard, InspectorDashboard, SupplierDashboard } from '@shared/schemas/dashboard';
import { Page } from '../../components/page';
import { Section } from '../../components/section';
import { EmptyState } from '../../components/empty-state';
import { HeadCell, Loading, TableFrame } from '../../components/data-table';
import { StatusPill, type Tone } from '../../components/status-pill';
import { paths } from '../../config/paths';
import { navFor } from '../../config/nav';
import { useDashboard } from '../../features/dashboard/api/dashboard';
import { formatCalendarDay, formatWhen } from '../../lib/format';

// The first page after sign-in: counts and short lists only, no chart library, no feature modules.
const useStyles = makeStyles({
  tiles: { display: 'grid', gridTemplateColumns: 'repeat(auto-fill, minmax(200px, 1fr))', gap: '12px', marginBottom: '12px' },
  tile: {
    display: 'flex',
    flexDirection: 'column',
    gap: '2px',
    minHeight: '96px',
    padding: '12px 14px',
    border: `1px solid ${tokens.colorNeutralStroke2}`,
    borderLeft: `4px solid ${tokens.colorBrandStroke1}`,
    borderRadius: tokens.borderRadiusMedium,
    backgroundColor: tokens.colorNeutralBackground1,
    color: tokens.colorNeutralForeground1,
    textDecoration: 'none',
  },
  tileLink: { ':hover': { backgroundColor: tokens.colorNeutralBackground1Hover }, ':focus-visible': { outline: `2px solid ${tokens.colorBrandStroke1}`, outlineOffset: '2px' } },
  bad: { borderLeftColor: tokens.colorPaletteRedBorder2 },
  pending: { borderLeftColor: tokens.colorPaletteMarigoldBorderActive },
  ok: { borderLeftColor: tokens.colorPaletteGreenBorder2 },
  count: { fontSize: '32px', lineHeight: '40px', fontWeight: 700, fontVariantNumeric: 'tabular-nums' },
  label: { fontWeight: 600 },
  hint: { color: tokens.colorNeutralForeground3 },
  list: { listStyle: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: '6px' },
  item: { display: 'flex', gap: '10px', alignItems: 'baseline', flexWrap: 'wrap' },
  link: { color: tokens.colorBrandForeground1, fontWeight: 600, textDecoration: 'none', ':hover': { textDecoration: 'underline' } },
  mono: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 600 },
  muted: { color: tokens.colorNeutralForeground3 },
  pages: { display: 'flex', flexWrap: 'wrap', gap: '8px 18px', listStyle: 'none', margin: 0, padding: 0 },
  notice: {
    border: `1px solid ${tokens.colorNeutralStroke2}`,
    borderLeft: `4px solid ${tokens.colorPaletteMarigoldBorderActive}`,
    borderRadius: tokens.borderRadiusMedium,
    padding: '10px 12px',
    display: 'flex',
    flexDirection: 'column',
    gap: '2px',
  },
});

const n = (v: number) => v.toLocaleString('en-GB');
const plural = (v: number, one: string, many = `${one}s`) => `${n(v)} ${v === 1 ? one : many}`;

/** "45 min", "5 h", "3 d 4 h": how long the oldest lot has waited. */
function age(hours: number): string {
  if (hours < 1) return `${Math.max(1, Math.round(hours * 60))} min`;
  if (hours < 48) return `${Math.round(hours)} h`;
  const d = Math.floor(hours / 24);
  const h = Math.round(hours - d * 24);
  return h ? `${d} d ${h} h` : `${d} d`;
}

type TileTone = 'bad' | 'pending' | 'ok' | 'info';

/** A count with its label; a link to the page that lists exactly what it counts, when there is one. */
function Tile({ label, value, to, hint, tone = 'info', testId }: { label: string; value: number; to?: string; hint?: ReactNode; tone?: TileTone; testId?: string }) {
  const s = useStyles();
  const cls = mergeClasses(s.tile, to && s.tileLink, tone === 'bad' && value > 0 && s.bad, tone === 'pending' && value > 0 && s.pending, tone === 'ok' && s.ok);
  const body = (
    <>
      <span className={s.count}>{n(value)}</span>
      <span className={s.label}>{label}</span>
      {hint ? <Caption1 className={s.hint}>{hint}</Caption1> : null}
    </>
  );
  return to ? (
    <Link className={cls} to={to} data-testid={testId} aria-label={`${label}: ${value}`}>{body}</Link>
  ) : (
    <div className={cls} data-testid={testId}>{body}</div>
  );
}

function InspectorHome({ d }: { d: InspectorDashboard }) {
  const s = useStyles();
  const todays = `${paths.lots}?receivedFrom=${d.today.date}&receivedTo=${d.today.date}`;
  return (
    <>
      <Section title="Dock">
        <div className={s.tiles}>
          <Tile label="Lots waiting" value={d.dock.queue} to={paths.dock} tone="pending" hint={d.dock.oldestAgeHours != null ? `Oldest has waited ${age(d.dock.oldestAgeHours)}` : 'Nothing waiting'} testId="tile-dock" />
          <Tile label="Inspection under way" value={d.dock.inspecting} to={paths.dock} hint="Of the lots waiting" />
        </div>
      </Section>
      <Section title={`Today, ${formatCalendarDay(d.today.date)}`}>
        <div className={s.tiles}>
          <Tile label="Received today" value={d.today.received} to={todays} />
          <Tile label="Decided today" value={d.today.decided} hint={`${plural(d.today.accepted, 'accepted', 'accepted')}, ${plural(d.today.rejected, 'rejected', 'rejected')}`} tone={d.today.rejected ? 'bad' : 'info'} />
        </div>
      </Section>
    </>
  );
}

function StepList({ items, to }: { items: (Omit<DashboardDueStep, 'dueOn'> & { dueOn: string | null; status?: string })[]; to: (id: string) => string }) {
  const s = useStyles();
  return (
    <ul className={s.list}>
      {items.map((x) => (
        <li key={`${x.scarId}:${x.step}`} className={s.item}>
          <Link className={s.link} to={to(x.scarId)}>{x.scarNumber} · {x.step} {x.title}</Link>
          <span className={s.muted}>{x.status === 'returned' ? 'Returned: please revise' : x.supplierCode}</span>
          {x.dueOn ? <StatusPill tone={x.overdue ? 'bad' : 'pending'}>{x.overdue ? `Overdue since ${formatCalendarDay(x.dueOn)}` : `Due ${formatCalendarDay(x.dueOn)}`}</StatusPill> : <StatusPill tone="neutral">No due date</StatusPill>}
        </li>
      ))}
    </ul>
  );
}

function EngineerHome({ d }: { d: EngineerDashboard }) {
  const s = useStyles();
  return (
    <>
      <Section title="Nonconformances">
        <div className={s.tiles}>
          <Tile label="NCRs not closed" value={d.ncrs.notClosed} to={`${paths.ncrs}?status=active`} tone="pending" hint={`${n(d.ncrs.open)} open · ${n(d.ncrs.inReview)} in review · ${n(d.ncrs.dispositioned)} dispositioned`} testId="tile-ncrs" />
          <Tile label="Held lots without an NCR" value={d.ncrs.heldLotsWithoutNcr} to={`${paths.ncrs}?tab=waiting`} tone="bad" />
          <Tile label="New drift signals" value={d.driftSignals.open} to={paths.drift} tone="pending" hint={d.driftSignals.latestAt ? `Latest ${formatWhen(d.driftSignals.latestAt)}` : 'None waiting for review'} testId="tile-drift" />
        </div>
      </Section>
      <Section title="Corrective actions">
        <div className={s.tiles}>
          <Tile label="Steps overdue" value={d.scarSteps.overdue} to={`${paths.scars}?status=active`} tone="bad" testId="tile-steps-overdue" />
          <Tile label="Steps due within 7 days" value={d.scarSteps.dueSoon} to={`${paths.scars}?status=active`} tone="pending" />
        </div>
        {d.scarSteps.items.length ? <StepList items={d.scarSteps.items} to={paths.scar} /> : <Body1 className={s.muted}>No step is due within 7 days.</Body1>}
      </Section>
      <Section title="Gauges">
        <div className={s.tiles}>
          <Tile label="Calibration overdue" value={d.gauges.overdue} to={`${paths.gauges}?calibration=overdue`} tone="bad" />
          <Tile label="Due within 30 days" value={d.gauges.dueSoon} to={`${paths.gauges}?calibration=due-soon`} tone="pending" testId="tile-gauges-due" />
        </div>
        {d.gauges.items.length ? (
          <ul className={s.list}>
            {d.gauges.items.map((g) => (
              <li key={g.id} className={s.item}>
                <span className={s.mono}>{g.assetTag}</span>
                <span>{g.description}</span>
                <StatusPill tone={g.overdue ? 'bad' : 'pending'}>{g.overdue ? `Overdue since ${formatCalendarDay(g.calibrationDueOn)}` : `Due ${formatCalendarDay(g.calibrationDueOn)}`}</StatusPill>
              </li>
            ))}
          </ul>
        ) : null}
      </Section>
    </>
  );
}

function SupplierHome({ d }: { d: SupplierDashboard }) {
  const s = useStyles();
  return (
    <>
      {d.notices.length ? (
        <Section title="Notices">
          <ul className={s.list}>
            {d.notices.map((x) => (
              <li key={x.id} className={s.notice}>
                <Link className={s.link} to={`${paths.supplierDesk}?notice=${x.id}`}>{x.title}</Link>
                <Body1>{x.body}</Body1>
                <Caption1 className={s.muted}>{formatWhen(x.createdAt)}</Caption1>
              </li>
            ))}
          </ul>
        </Section>
      ) : null}
      <Section title="Corrective action steps to answer">
        {d.openSteps.length ? <StepList items={d.openSteps} to={paths.deskScar} /> : <Body1 className={s.muted}>Nothing to answer right now.</Body1>}
      </Section>
      <Section title="Your lots">
        <div className={s.tiles}>
          <Tile label="Lots on hold" value={d.lotsOnHold} to={`${paths.lots}?status=on-hold`} tone="bad" hint="Rejected at receiving, waiting for a decision" testId="tile-on-hold" />
        </div>
        <Link className={s.link} to={paths.scorecards}>See your scorecard</Link>
      </Section>
    </>
  );
}

function AuditorHome({ d }: { d: AuditorDashboard }) {
  const s = useStyles();
  const c = d.chain;
  const tone: Tone = c.ok ? 'ok' : 'bad';
  return (
    <>
      <Section title="Audit chain">
        <div className={s.item}>
          <StatusPill tone={tone}>{c.ok ? 'Chain intact' : `Chain broken at record ${c.firstBrokenId ?? '?'}`}</StatusPill>
          <span>{plural(c.count, 'record')} verified {formatWhen(c.checkedAt)}{c.cached ? ' (re-checked at most once a minute)' : ''}.</span>
          <Link className={s.link} to={paths.ledger}>History ledger</Link>
        </div>
      </Section>
      <Section title="Recent changes">
        {d.recent.length ? (
          <TableFrame>
            <Table aria-label="Recent changes" size="small">
              <TableHeader>
                <TableRow>
                  <HeadCell>#</HeadCell>
                  <HeadCell>When</HeadCell>
                  <HeadCell>Who</HeadCell>
                  <HeadCell>What</HeadCell>
                  <HeadCell>Record</HeadCell>
                </TableRow>
              </TableHeader>
              <TableBody>
                {d.recent.map((e) => (
                  <TableRow key={e.id}>
                    <TableCell className={s.mono}>{e.id}</TableCell>
                    <TableCell>{formatWhen(e.at)}</TableCell>
                    <TableCell>{e.actorEmail ?? 'system'}</TableCell>
                    <TableCell><span className={s.mono}>{e.action}</span>{e.reason ? <Caption1 className={s.muted}> · {e.reason}</Caption1> : null}</TableCell>
                    <TableCell>{e.entity === 'lot' ? <Link className={s.link} to={paths.ledgerLot(e.entityId)}>Lot story</Link> : <span className={s.muted}>{e.entity}</span>}</TableCell>
                  </TableRow>
                ))}
              </TableBody>
            </Table>
          </TableFrame>
        ) : (
          <Body1 className={s.muted}>No changes recorded yet.</Body1>
        )}
      </Section>
    </>
  );
}

function AdminHome({ d }: { d: AdminDashboard }) {
  const s = useStyles();
  return (
    <>
      <Section title="Users">
        <div className={s.tiles}>
          <Tile label="Users" value={d.users.total} to={paths.admin} hint={`${n(d.users.active)} active · ${n(d.users.inactive)} deactivated`} testId="tile-users" />
          <Tile label="Locked accounts" value={d.users.locked} to={paths.admin} tone="bad" hint="After repeated failed sign-ins" />
          {ROLES.map((r) => <Tile key={r} label={ROLE_LABELS[r]} value={d.users.byRole[r] ?? 0} to={paths.admin} />)}
        </div>
        {d.lockedAccounts.length ? (
          <ul className={s.list}>
            {d.lockedAccounts.map((u) => (
              <li key={u.id} className={s.item}>
                <span className={s.label}>{u.name}</span>
                <span className={s.muted}>{u.email} · {ROLE_LABELS[u.role]}</span>
                <StatusPill tone="bad">Locked until {formatWhen(u.lockedUntil)}</StatusPill>
              </li>
            ))}
          </ul>
        ) : null}
      </Section>
    </>
  );
}

/** Home: the signed-in role's work, as counts that open the lists behind them. */
export function HomePage({ user }: { user: SessionUser }) {
  const s = useStyles();
  const q = useDashboard();
  const d = q.data;
  return (
    <Page title={`Good to see you, ${user.name.split(' ')[0]}`} lead={`Signed in as ${ROLE_LABELS[user.role].toLowerCase()}.`}>
      {q.isPending ? (
        <Loading label="Loading your dashboard" />
      ) : !d ? (
        <EmptyState title="Your dashboard could not be loaded">{q.error?.message ?? 'Try again in a moment.'}</EmptyState>
      ) : d.role === 'inspector' ? (
        <InspectorHome d={d} />
      ) : d.role === 'engineer' ? (
        <EngineerHome d={d} />
      ) : d.role === 'supplier' ? (
        <SupplierHome d={d} />
      ) : d.role === 'auditor' ? (
        <AuditorHome d={d} />
      ) : (
        <AdminHome d={d} />
      )}
      <Section title="Your pages">
        <ul className={s.pages}>
          {navFor(user.role).map((x) => (
            <li key={x.to}>
              <Link className={s.link} to={x.to} title={x.purpose}>{x.label}</Link>
            </li>
          ))}
        </ul>
      </Section>
    </Page>
  );
}
