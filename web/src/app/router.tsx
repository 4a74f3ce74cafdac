import type { ComponentType } from 'react';
import { createBrowserRouter, redirect } from 'react-router';
import type { QueryClient } from '@tanstack/react-query';
import { meQueryOptions } from '@/features/auth/api/get-me';
import { AppShell } from './app-shell';
import { AppLoading } from './routes/app-loading';
import { landingRedirect, requireRole, requireTemporaryPassword, requireUser } from './guards';
import { choosePasswordPath, landingPaths, pages, safeNext } from './navigation';
import { NotFound, RouteError } from './routes/route-error';
import { SignInRoute } from './routes/sign-in-route';

const strip = (path: string) => path.replace(/^\//, '');

/**
 * After a new version is installed, a page still open from the old one asks for chunks that are
 * gone: load the page afresh once (the new build's files), rather than show an error.
 */
function reloadOnce(error: unknown): never {
  const key = 'reboundry.reloadedForChunk';
  const last = Number(sessionStorage.getItem(key) ?? 0);
  if (Date.now() - last > 60_000) {
    sessionStorage.setItem(key, String(Date.now()));
    window.location.reload();
  }
  throw error;
}

/**
 * A page loaded on first visit: each page is its own chunk, so the sign-in page and the start
 * pages do not carry the map (leaflet), the charts (recharts) or other roles' pages.
 */
const page =
  <K extends string>(load: () => Promise<Record<K, ComponentType>>, name: K) =>
  () =>
    load().then((m) => ({ Component: m[name] }), reloadOnce);

/** The route tree. Each page's loader checks the role from `pages` before anything renders. */
export function createAppRouter(queryClient: QueryClient) {
  const only = (access: { roles: readonly ('manager' | 'mechanic' | 'driver')[] }) => requireRole(queryClient, access.roles);

  return createBrowserRouter([
    {
      path: '/sign-in',
      // Someone already signed in goes straight on.
      loader: async ({ request }) => {
        const user = await queryClient.ensureQueryData(meQueryOptions());
        if (user) return redirect(safeNext(new URL(request.url).searchParams.get('next')) ?? landingPaths[user.role]);
        return null;
      },
      element: <SignInRoute />,
      hydrateFallbackElement: <AppLoading />,
      errorElement: <RouteError />,
    },
    {
      // instead of the app while the password is one a fleet manager set (its own chunk: the
      // password form brings the whole of zod, which the sign-in page leaves out)
      path: choosePasswordPath,
      loader: requireTemporaryPassword(queryClient),
      lazy: page(() => import('./routes/choose-password-route'), 'ChoosePasswordRoute'),
      hydrateFallbackElement: <AppLoading />,
      errorElement: <RouteError />,
    },
    {
      path: '/',
      loader: requireUser(queryClient),
      element: <AppShell />,
      hydrateFallbackElement: <AppLoading />,
      errorElement: <RouteError />,
      children: [
        {
          errorElement: <RouteError />,
          children: [
            { index: true, loader: landingRedirect(queryClient) },
            { path: strip(pages.fleet.path), loader: only(pages.fleet), lazy: page(() => import('./routes/fleet-page'), 'FleetPage') },
            { path: strip(pages.workshop.path), loader: only(pages.workshop), lazy: page(() => import('./routes/workshop-page'), 'WorkshopPage') },
            { path: strip(pages.myVehicle.path), loader: only(pages.myVehicle), lazy: page(() => import('./routes/my-vehicle-page'), 'MyVehiclePage') },
            { path: strip(pages.vehicles.path), loader: only(pages.vehicles), lazy: page(() => import('./routes/vehicles-page'), 'VehiclesPage') },
            { path: `${strip(pages.vehicles.path)}/:vehicleId`, lazy: () => import('./routes/vehicle-page').then((m) => ({ loader: m.vehicleLoader(queryClient, pages.vehicles.roles), Component: m.VehiclePage }), reloadOnce) },
            { path: strip(pages.specs.path), loader: only(pages.specs), lazy: page(() => import('./routes/specs-page'), 'SpecsPage') },
            { path: strip(pages.routes.path), loader: only(pages.routes), lazy: page(() => import('./routes/routes-page'), 'RoutesPage') },
            { path: `${strip(pages.routes.path)}/:routeId`, loader: only(pages.roadsRead), lazy: page(() => import('./routes/route-page'), 'RoutePage') },
            { path: strip(pages.segments.path), loader: only(pages.segments), lazy: page(() => import('./routes/segments-page'), 'SegmentsPage') },
            { path: strip(pages.map.path), loader: only(pages.roadsRead), lazy: page(() => import('./routes/map-page'), 'MapPage') },
            { path: strip(pages.trips.path), loader: only(pages.trips), lazy: page(() => import('./routes/trips-page'), 'TripsPage') },
            { path: `${strip(pages.specs.path)}/new`, loader: only(pages.specs), lazy: page(() => import('./routes/spec-edit-page'), 'SpecEditPage') },
            { path: `${strip(pages.specs.path)}/:specId/edit`, loader: only(pages.specs), lazy: page(() => import('./routes/spec-edit-page'), 'SpecEditPage') },
            { path: strip(pages.people.path), loader: only(pages.people), lazy: page(() => import('./routes/people-page'), 'PeoplePage') },
            { path: strip(pages.account.path), loader: only(pages.account), lazy: page(() => import('./routes/account-route'), 'AccountRoute') },
            { path: strip(pages.due.path), loader: only(pages.due), lazy: page(() => import('./routes/due-page'), 'DuePage') },
            { path: strip(pages.jobs.path), loader: only(pages.jobs), lazy: page(() => import('./routes/job-runs-page'), 'JobRunsPage') },
            { path: strip(pages.outbox.path), loader: only(pages.outbox), lazy: page(() => import('./routes/outbox-page'), 'OutboxPage') },
            { path: 'inspections/:inspectionId', loader: only({ roles: ['mechanic', 'manager'] }), lazy: page(() => import('./routes/inspection-page'), 'InspectionPage') },
            { path: 'work-records/:workRecordId', loader: only({ roles: ['mechanic', 'manager'] }), lazy: page(() => import('./routes/work-record-page'), 'WorkRecordPage') },
            { path: strip(pages.planning.path), loader: only(pages.planning), lazy: page(() => import('./routes/planning-page'), 'PlanningPage') },
            { path: strip(pages.fleetLife.path), loader: only(pages.fleetLife), lazy: page(() => import('./routes/fleet-life-page'), 'FleetLifePage') },
            { path: strip(pages.lifeBacktest.path), loader: only(pages.lifeBacktest), lazy: () => import('./routes/life-backtest-page').then((m) => ({ Component: m.LifeBacktestPage })) },
            { path: strip(pages.modelCheck.path), loader: only(pages.modelCheck), lazy: page(() => import('./routes/model-check-page'), 'ModelCheckPage') },
            { path: strip(pages.report.path), loader: only(pages.report), lazy: page(() => import('./routes/report-page'), 'ReportPage') },
            { path: strip(pages.myReports.path), loader: only(pages.myReports), lazy: page(() => import('./routes/my-reports-page'), 'MyReportsPage') },
            { path: strip(pages.rideReports.path), loader: only(pages.rideReports), lazy: page(() => import('./routes/ride-reports-page'), 'RideReportsPage') },
            { path: strip(pages.exposure.path), loader: only(pages.exposure), lazy: page(() => import('./routes/exposure-page'), 'ExposurePage') },
            { path: '*', element: <NotFound /> },
          ],
        },
      ],
    },
  ]);
}
