import { makeStyles, tokens, Caption1 } from '@fluentui/react-components';
import { NavLink, Outlet, useLocation } from 'react-router-dom';
import type { SessionUser } from '@shared/schemas/auth';
import { navFor } from '../config/nav';
import { AccountMenu } from '../features/auth/components/account-menu';
import { Mark } from '../components/mark';
import { copper } from '../theme/theme';

const useStyles = makeStyles({
  root: { display: 'grid', gridTemplateColumns: '232px minmax(0, 1fr)', gridTemplateRows: '60px minmax(0, 1fr)', minHeight: '100vh',
    '@media (max-width: 1100px)': { gridTemplateColumns: '196px minmax(0, 1fr)' },
    // A tablet held upright at the dock: the pages get the whole width, the menu becomes a row.
    '@media (max-width: 900px)': { gridTemplateColumns: 'minmax(0, 1fr)', gridTemplateRows: '60px auto minmax(0, 1fr)' } },
  top: {
    gridColumn: '1 / -1',
    display: 'flex',
    alignItems: 'center',
    justifyContent: 'space-between',
    padding: '0 16px 0 20px',
    backgroundColor: '#0c3d39',
    color: '#eef5f3',
    borderBottom: `3px solid ${copper.light}`,
  },
  brand: { display: 'flex', alignItems: 'center', gap: '10px', fontWeight: 700, fontSize: '19px', letterSpacing: '0.03em', color: 'inherit', textDecoration: 'none' },
  plant: { opacity: 0.75, marginLeft: '10px', fontWeight: 400, fontSize: tokens.fontSizeBase300, '@media (max-width: 700px)': { display: 'none' } },
  nav: {
    backgroundColor: tokens.colorNeutralBackground2,
    borderRight: `1px solid ${tokens.colorNeutralStroke2}`,
    padding: '12px 8px',
    display: 'flex',
    flexDirection: 'column',
    gap: '2px',
    '@media (max-width: 900px)': {
      flexDirection: 'row',
      overflowX: 'auto',
      padding: '6px 8px',
      borderRight: 'none',
      borderBottom: `1px solid ${tokens.colorNeutralStroke2}`,
    },
  },
  link: {
    display: 'flex',
    alignItems: 'center',
    minHeight: '44px',
    padding: '0 14px',
    borderRadius: tokens.borderRadiusMedium,
    color: tokens.colorNeutralForeground1,
    textDecoration: 'none',
    fontSize: tokens.fontSizeBase300,
    borderLeft: '4px solid transparent',
    ':hover': { backgroundColor: tokens.colorNeutralBackground1Hover },
    '@media (max-width: 900px)': { whiteSpace: 'nowrap', flexShrink: 0, borderLeft: 'none', borderBottom: '4px solid transparent', padding: '0 12px' },
    ':focus-visible': { outline: `2px solid ${tokens.colorBrandStroke1}`, outlineOffset: '1px' },
  },
  active: {
    backgroundColor: tokens.colorNeutralBackground1,
    fontWeight: 600,
    borderLeft: `4px solid ${copper.light}`,
    color: tokens.colorBrandForeground1,
    '@media (max-width: 900px)': { borderLeft: 'none', borderBottom: `4px solid ${copper.light}` },
  },
  main: { padding: '24px 28px 48px', minWidth: 0, backgroundColor: tokens.colorNeutralBackground1, '@media (max-width: 900px)': { padding: '16px 16px 40px' } },
  foot: { marginTop: 'auto', padding: '12px 14px', color: tokens.colorNeutralForeground3, '@media (max-width: 900px)': { display: 'none' } },
});

export function Shell({ user }: { user: SessionUser }) {
  const s = useStyles();
  const items = navFor(user.role);
  useLocation();
  return (
    <div className={s.root}>
      <header className={s.top}>
        <NavLink to="/" className={s.brand} aria-label="Yokeline home">
          <Mark /> Yokeline <span className={s.plant}>Harrowgate Drive Systems</span>
        </NavLink>
        <AccountMenu user={user} />
      </header>
      <nav className={s.nav} aria-label="Main">
        {items.map((n) => (
          <NavLink key={n.to} to={n.to} title={n.purpose} className={({ isActive }) => (isActive ? `${s.link} ${s.active}` : s.link)}>
            {n.label}
          </NavLink>
        ))}
        <Caption1 className={s.foot}>Receiving quality</Caption1>
      </nav>
      <main className={s.main} id="main">
        <Outlet />
      </main>
    </div>
  );
}
