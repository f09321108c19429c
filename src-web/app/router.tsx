import { createBrowserRouter, redirect, useLoaderData, type LoaderFunctionArgs } from 'react-router-dom';
import type { SessionUser } from '@shared/schemas/auth';
import { queryClient } from '../lib/query-client';
import { getMeQueryOptions, useMe } from '../features/auth/api/get-me';
import { paths } from '../config/paths';
import { NAV } from '../config/nav';
import { Shell } from './shell';
import { NotFoundPage } from './routes/not-found';
import { ArrivesSoon } from './routes/arrives-soon';
import { RouteErrorBoundary } from './routes/error-boundary';

/** Signed-in area: go to sign-in (and come back) when there is no session. */
async function requireUser({ request }: LoaderFunctionArgs): Promise<SessionUser> {
  const user = await queryClient.fetchQuery(getMeQueryOptions());
  if (!user) {
    const url = new URL(request.url);
    throw redirect(`${paths.signIn}?next=${encodeURIComponent(url.pathname + url.search)}`);
  }
  return user;
}

async function signInLoader({ request }: LoaderFunctionArgs): Promise<null> {
  const user = await queryClient.fetchQuery(getMeQueryOptions());
  if (user) {
    const next = new URL(request.url).searchParams.get('next');
    throw redirect(next && next.startsWith('/') && !next.startsWith('//') ? next : paths.home);
  }
  return null;
}

function ShellRoute() {
  const loaded = useLoaderData() as SessionUser;
  const { data } = useMe();
  return <Shell user={data ?? loaded} />;
}

// Sign-in and Home load on first visit like every other page: a signed-in inspector opening the
// Dock downloads neither the sign-in form (react-hook-form, zod) nor the dashboards.
async function homeRoute() {
  const { HomePage } = await import('./routes/home');
  return {
    Component: function Home() {
      const user = useLoaderData() as SessionUser;
      return <HomePage user={user} />;
    },
  };
}

// Pages that later work fills in; each shows an honest empty state until then.
const built = new Set<string>([paths.admin, paths.plans, paths.suppliers, paths.gauges, paths.dock, paths.lots, paths.ledger, paths.drift, paths.ncrs, paths.scars, paths.supplierDesk, paths.calculators, paths.scorecards]);
const placeholders = NAV.filter((n) => !built.has(n.to)).map((n) => ({ path: n.to, element: <ArrivesSoon to={n.to} /> }));

export const router = createBrowserRouter([
  { path: paths.signIn, loader: signInLoader, errorElement: <RouteErrorBoundary />, lazy: async () => ({ Component: (await import('./routes/sign-in')).SignInPage }) },
  // The hold tag prints alone on an A6 page, outside the app's frame.
  { path: paths.ncrHoldTag(':id'), loader: requireUser, errorElement: <RouteErrorBoundary />, lazy: async () => ({ Component: (await import('./routes/hold-tag')).HoldTagPage }) },
  {
    id: 'app',
    path: '/',
    element: <ShellRoute />,
    loader: requireUser,
    errorElement: <RouteErrorBoundary />,
    children: [
      { errorElement: <RouteErrorBoundary />, children: [
        { index: true, loader: requireUser, lazy: homeRoute },
        { path: paths.admin, lazy: async () => ({ Component: (await import('./routes/admin')).AdminPage }) },
        { path: paths.mailbox, lazy: async () => ({ Component: (await import('./routes/mailbox')).MailboxPage }) },
        // Master data loads on first visit too: the first download stays small for the dock.
        { path: paths.plans, lazy: async () => ({ Component: (await import('./routes/plans-parts')).PlansPartsPage }) },
        { path: `${paths.plans}/parts/:id`, lazy: async () => ({ Component: (await import('./routes/part')).PartPage }) },
        { path: `${paths.plans}/plans/:id/:tab?`, lazy: async () => ({ Component: (await import('./routes/plan')).PlanPage }) },
        // One route with an optional id, so opening a supplier's panel keeps the list mounted.
        { path: `${paths.suppliers}/:id?`, lazy: async () => ({ Component: (await import('./routes/suppliers')).SuppliersPage }) },
        { path: paths.gauges, lazy: async () => ({ Component: (await import('./routes/gauges')).GaugesPage }) },
        // The History ledger loads on first visit (auditors, engineers and admins only).
        { path: paths.ledger, lazy: async () => ({ Component: (await import('./routes/ledger')).LedgerPage }) },
        { path: paths.ledgerLot(':id'), lazy: async () => ({ Component: (await import('./routes/ledger-lot')).LedgerLotPage }) },
        // Receiving loads on first visit: the bench sheet and its maths stay out of the first download.
        { path: paths.dock, lazy: async () => ({ Component: (await import('./routes/dock')).DockPage }) },
        { path: paths.lots, lazy: async () => ({ Component: (await import('./routes/lots')).LotsPage }) },
        { path: paths.lot(':id'), lazy: async () => ({ Component: (await import('./routes/lot')).LotPage }) },
        // Drift watch loads on first visit; its chart library loads only when a chart is opened.
        { path: paths.drift, lazy: async () => ({ Component: (await import('./routes/drift-watch')).DriftWatchPage }) },
        { path: `${paths.drift}/:supplierId/:partId/:code`, lazy: async () => ({ Component: (await import('./routes/drift-chart')).DriftChartPage }) },
        // Nonconformances, corrective actions and the Supplier desk load on first visit.
        { path: paths.ncrs, lazy: async () => ({ Component: (await import('./routes/ncrs')).NcrsPage }) },
        { path: paths.ncr(':id'), lazy: async () => ({ Component: (await import('./routes/ncr')).NcrPage }) },
        { path: paths.scars, lazy: async () => ({ Component: (await import('./routes/scars')).ScarsPage }) },
        { path: paths.scar(':id'), lazy: async () => ({ Component: (await import('./routes/scar')).ScarPage }) },
        { path: paths.supplierDesk, lazy: async () => ({ Component: (await import('./routes/supplier-desk')).SupplierDeskPage }) },
        { path: paths.deskScar(':id'), lazy: async () => ({ Component: (await import('./routes/desk-scar')).DeskScarPage }) },
        { path: paths.deskNcr(':id'), lazy: async () => ({ Component: (await import('./routes/desk-ncr')).DeskNcrPage }) },
        // Scorecards load on first visit; their trend charts load recharts only when drawn.
        { path: paths.scorecards, lazy: async () => ({ Component: (await import('./routes/scorecards')).ScorecardsPage }) },
        // The calculators load on first visit, with the geometry and steel maths they run.
        { path: paths.calculators, lazy: async () => ({ Component: (await import('./routes/calculators')).CalculatorsPage }) },
        ...placeholders,
        { path: '*', element: <NotFoundPage /> },
      ] },
    ],
  },
]);
