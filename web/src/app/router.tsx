import { createBrowserRouter, redirect } from 'react-router';
import type { QueryClient } from '@tanstack/react-query';
import { meQueryOptions } from '@/features/auth/api/get-me';
import { AppShell } from './app-shell';
import { AppLoading } from './routes/app-loading';
import { landingRedirect, requireRole, requireUser } from './guards';
import { landingPaths, pages, safeNext } from './navigation';
import { FleetPage } from './routes/fleet-page';
import { MyVehiclePage } from './routes/my-vehicle-page';
import { PeoplePage } from './routes/people-page';
import { NotFound, RouteError } from './routes/route-error';
import { RoutesPage } from './routes/routes-page';
import { SignInRoute } from './routes/sign-in-route';
import { SpecsPage } from './routes/specs-page';
import { vehicleLoader, VehiclePage } from './routes/vehicle-page';
import { VehiclesPage } from './routes/vehicles-page';
import { WorkshopPage } from './routes/workshop-page';
import { MapPage } from './routes/map-page';
import { RoutePage } from './routes/route-page';
import { SegmentsPage } from './routes/segments-page';
import { TripsPage } from './routes/trips-page';
import { SpecEditPage } from './routes/spec-edit-page';
import { DuePage } from './routes/due-page';
import { JobRunsPage } from './routes/job-runs-page';
import { OutboxPage } from './routes/outbox-page';
import { AccountRoute } from './routes/account-route';

import { InspectionPage } from './routes/inspection-page';
import { WorkRecordPage } from './routes/work-record-page';
import { PlanningPage } from './routes/planning-page';
import { FleetLifePage } from './routes/fleet-life-page';
import { ModelCheckPage } from './routes/model-check-page';

import { ReportPage, MyReportsPage, RideReportsPage, ExposurePage } from './routes/driver-pages';

const strip = (path: string) => path.replace(/^\//, '');

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
            { path: strip(pages.fleet.path), loader: only(pages.fleet), element: <FleetPage /> },
            { path: strip(pages.workshop.path), loader: only(pages.workshop), element: <WorkshopPage /> },
            { path: strip(pages.myVehicle.path), loader: only(pages.myVehicle), element: <MyVehiclePage /> },
            { path: strip(pages.vehicles.path), loader: only(pages.vehicles), element: <VehiclesPage /> },
            { path: `${strip(pages.vehicles.path)}/:vehicleId`, loader: vehicleLoader(queryClient, pages.vehicles.roles), element: <VehiclePage /> },
            { path: strip(pages.specs.path), loader: only(pages.specs), element: <SpecsPage /> },
            { path: strip(pages.routes.path), loader: only(pages.routes), element: <RoutesPage /> },
            { path: `${strip(pages.routes.path)}/:routeId`, loader: only(pages.roadsRead), element: <RoutePage /> },
            { path: strip(pages.segments.path), loader: only(pages.segments), element: <SegmentsPage /> },
            { path: strip(pages.map.path), loader: only(pages.roadsRead), element: <MapPage /> },
            { path: strip(pages.trips.path), loader: only(pages.trips), element: <TripsPage /> },
            { path: `${strip(pages.specs.path)}/new`, loader: only(pages.specs), element: <SpecEditPage /> },
            { path: `${strip(pages.specs.path)}/:specId/edit`, loader: only(pages.specs), element: <SpecEditPage /> },
            { path: strip(pages.people.path), loader: only(pages.people), element: <PeoplePage /> },
            { path: strip(pages.account.path), loader: only(pages.account), element: <AccountRoute /> },
            { path: strip(pages.due.path), loader: only(pages.due), element: <DuePage /> },
            { path: strip(pages.jobs.path), loader: only(pages.jobs), element: <JobRunsPage /> },
            { path: strip(pages.outbox.path), loader: only(pages.outbox), element: <OutboxPage /> },
            { path: 'inspections/:inspectionId', loader: only({ roles: ['mechanic', 'manager'] }), element: <InspectionPage /> },
            { path: 'work-records/:workRecordId', loader: only({ roles: ['mechanic', 'manager'] }), element: <WorkRecordPage /> },
            { path: strip(pages.planning.path), loader: only(pages.planning), element: <PlanningPage /> },
            { path: strip(pages.fleetLife.path), loader: only(pages.fleetLife), element: <FleetLifePage /> },
            { path: strip(pages.lifeBacktest.path), loader: only(pages.lifeBacktest), lazy: () => import('./routes/life-backtest-page').then((m) => ({ Component: m.LifeBacktestPage })) },
            { path: strip(pages.modelCheck.path), loader: only(pages.modelCheck), element: <ModelCheckPage /> },
            // issue 7: drivers
            { path: strip(pages.report.path), loader: only(pages.report), element: <ReportPage /> },
            { path: strip(pages.myReports.path), loader: only(pages.myReports), element: <MyReportsPage /> },
            { path: strip(pages.rideReports.path), loader: only(pages.rideReports), element: <RideReportsPage /> },
            { path: strip(pages.exposure.path), loader: only(pages.exposure), element: <ExposurePage /> },
            { path: '*', element: <NotFound /> },
          ],
        },
      ],
    },
  ]);
}
