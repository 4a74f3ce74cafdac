import type { ReactNode } from 'react';
import type { Role } from '@/lib/roles';

/**
 * Which pages each role may use, in one place: the navigation and the route guards both read
 * this, so a page is never in the menu of a role that the guard would turn away. (The server
 * checks every request on its own as well.)
 */
export interface PageAccess {
  path: string;
  label: string;
  roles: readonly Role[];
  icon: ReactNode;
  /** In the manager's grouped menu: the group this page sits under (pages without one stand on their own). */
  group?: MenuGroupId;
  /** Its name inside that group, when the group's name would repeat it (e.g. "Overview" under "Fleet"). */
  groupLabel?: string;
}

/** The manager's menu groups, in menu order. Which pages go in each is set on the pages below. */
export const menuGroups = {
  fleet: 'Fleet',
  roads: 'Roads',
  workshop: 'Workshop',
  drivers: 'Drivers',
} as const;
export type MenuGroupId = keyof typeof menuGroups;

/** Roles whose menu is grouped; the others are short and stay flat. */
const groupedRoles: readonly Role[] = ['manager'];

const icon = (d: string) => (
  <svg aria-hidden="true" viewBox="0 0 24 24" className="size-5" fill="none" stroke="currentColor" strokeWidth="1.7" strokeLinecap="round" strokeLinejoin="round">
    <path d={d} />
  </svg>
);

export const pages = {
  due: { path: '/due', label: 'Due', roles: ['manager'], icon: icon('M12 7v5l3 2M12 21a9 9 0 1 0 0-18 9 9 0 0 0 0 18z') },
  jobs: { path: '/jobs', label: 'Job runs', roles: ['manager'], group: 'workshop', icon: icon('M4 12a8 8 0 0 1 14-5.3M20 12a8 8 0 0 1-14 5.3M18 3v4h-4M6 21v-4h4') },
  outbox: { path: '/outbox', label: 'Outbox', roles: ['manager'], group: 'workshop', icon: icon('M3 6h18v12H3zM3 7l9 6 9-6') },
  fleet: { path: '/fleet', label: 'Fleet', roles: ['manager'], group: 'fleet', groupLabel: 'Overview', icon: icon('M4 4h7v7H4zM13 4h7v7h-7zM4 13h7v7H4zM13 13h7v7h-7z') },
  workshop: {
    path: '/workshop',
    label: 'Workshop',
    roles: ['mechanic'],
    icon: icon('M14.5 4.5a4 4 0 0 0-5 5L4 15l2.5 2.5 2.5 2.5 5.5-5.5a4 4 0 0 0 5-5l-2.5 2.5-2.5-.5-.5-2.5z'),
  },
  myVehicle: { path: '/my-vehicle', label: 'My vehicle', roles: ['driver'], icon: icon('M3 16V8h11v8M14 11h4l3 3v2h-7M6.5 18.5a1.5 1.5 0 1 0 0-3 1.5 1.5 0 0 0 0 3zM17.5 18.5a1.5 1.5 0 1 0 0-3 1.5 1.5 0 0 0 0 3z') },
  vehicles: { path: '/vehicles', label: 'Vehicles', roles: ['manager', 'mechanic'], group: 'fleet', icon: icon('M4 6h16M4 12h16M4 18h16M8 4v16') },
  specs: { path: '/specs', label: 'Specs', roles: ['manager'], group: 'fleet', icon: icon('M12 3v3l-5 2 10 3-10 3 10 3-5 2v2') },
  routes: { path: '/routes', label: 'Routes', roles: ['manager'], group: 'roads', icon: icon('M5 19c0-4 4-4 7-7s7-3 7-7M5 19a1.5 1.5 0 1 0 0 .01M19 5a1.5 1.5 0 1 0 0 .01') },
  map: { path: '/map', label: 'Roads', roles: ['manager', 'mechanic'], group: 'roads', groupLabel: 'Map', icon: icon('M9 4 3 6v14l6-2 6 2 6-2V4l-6 2-6-2zM9 4v14M15 6v14') },
  // Route pages and the road map can be read by every role (not in every menu); segments table
  roadsRead: { path: '/map', label: 'Roads', roles: ['manager', 'mechanic', 'driver'], icon: icon('M9 4 3 6v14l6-2 6 2 6-2V4l-6 2-6-2zM9 4v14M15 6v14') },
  segments: { path: '/segments', label: 'Segments', roles: ['manager'], group: 'roads', icon: icon('M4 18 9 6l6 12 5-10') },
  trips: { path: '/trips', label: 'Trips', roles: ['manager'], group: 'roads', icon: icon('M4 17h2l2-9h8l2 9h2M7 17a2 2 0 1 0 4 0M13 17a2 2 0 1 0 4 0') },
  people: {
    path: '/people',
    label: 'People',
    roles: ['manager'],
    group: 'fleet',
    icon: icon('M9 11a3 3 0 1 0 0-6 3 3 0 0 0 0 6zM3.5 19a5.5 5.5 0 0 1 11 0M16 11a2.5 2.5 0 1 0 0-5M17 14a4.5 4.5 0 0 1 3.5 5'),
  },
  planning: { path: '/planning', label: 'Planning', roles: ['manager'], group: 'workshop', icon: icon('M4 5h16v15H4zM4 9h16M9 5v15M8 3v4M16 3v4') },
  fleetLife: { path: '/damper-life', label: 'Damper life', roles: ['manager', 'mechanic'], group: 'workshop', icon: icon('M4 20V4M4 20h16M6 16c4 0 6-9 14-10') },
  // reached from the damper-life page, not in the menu (the menu marks "Damper life" while it is open)
  lifeBacktest: { path: '/damper-life/back-test', label: 'Back-test', roles: ['manager', 'mechanic'], icon: icon('M4 20V4M4 20h16M7 15l3-3 3 2 5-6') },
  modelCheck: { path: '/model-check', label: 'Model check', roles: ['manager'], group: 'workshop', icon: icon('M4 20 20 4M6 14l2 2M12 9l2 2M15 16l2-2') },
  // Drivers' reports and exposure
  report: { path: '/report', label: 'Report', roles: ['driver'], icon: icon('M12 21s-6-5.5-6-11a6 6 0 0 1 12 0c0 5.5-6 11-6 11zM12 7v4M12 13.5v.5') },
  myReports: { path: '/my-reports', label: 'My reports', roles: ['driver'], icon: icon('M6 3h9l3 3v15H6zM9 10h6M9 14h6M9 18h4') },
  rideReports: { path: '/ride-reports', label: 'Ride reports', roles: ['manager'], group: 'drivers', icon: icon('M12 21s-6-5.5-6-11a6 6 0 0 1 12 0c0 5.5-6 11-6 11zM9.5 10h5') },
  exposure: { path: '/exposure', label: 'Exposure', roles: ['driver', 'manager'], group: 'drivers', icon: icon('M3 12h3l2-5 3 10 3-8 2 3h5') },
  account: { path: '/account', label: 'Account', roles: ['manager', 'mechanic', 'driver'], icon: icon('M12 12a4 4 0 1 0 0-8 4 4 0 0 0 0 8zM4.5 20a7.5 7.5 0 0 1 15 0') },
} satisfies Record<string, PageAccess>;

const menuOrder: PageAccess[] = [pages.due, pages.fleet, pages.workshop, pages.myVehicle, pages.map, pages.vehicles, pages.specs, pages.routes, pages.trips, pages.planning, pages.fleetLife, pages.modelCheck, pages.people, pages.account];

// The driver's report pages after "My vehicle"; ride reports and exposure after "Map"
menuOrder.splice(menuOrder.indexOf(pages.myVehicle) + 1, 0, pages.report, pages.myReports);
menuOrder.splice(menuOrder.indexOf(pages.map) + 1, 0, pages.rideReports, pages.exposure);
// grouped menu: pages reached only from other pages until the menu had room for them
menuOrder.splice(menuOrder.indexOf(pages.routes) + 1, 0, pages.segments);
menuOrder.splice(menuOrder.indexOf(pages.modelCheck) + 1, 0, pages.jobs, pages.outbox);

/** The menu for a role, in order, flat (the phone's bottom bar). */
export function menuFor(role: Role): PageAccess[] {
  return menuOrder.filter((p) => p.roles.includes(role));
}

export type MenuEntry =
  | { kind: 'page'; page: PageAccess }
  | { kind: 'group'; id: MenuGroupId; label: string; pages: PageAccess[] };

/**
 * The menu for a role as shown at a desk: for grouped roles, pages with a `group` gather under it
 * (the group stands where its first page would be, pages in group order below, Account last); for
 * the others, every page stands on its own.
 */
export function menuEntriesFor(role: Role): MenuEntry[] {
  const flat = menuFor(role);
  if (!groupedRoles.includes(role)) return flat.map((page) => ({ kind: 'page', page }));
  const entries: MenuEntry[] = [];
  for (const page of flat.filter((p) => !p.group)) entries.push({ kind: 'page', page });
  const account = entries.findIndex((e) => e.kind === 'page' && e.page === pages.account);
  const groups: MenuEntry[] = (Object.keys(menuGroups) as MenuGroupId[])
    .map((id) => ({ kind: 'group' as const, id, label: menuGroups[id], pages: flat.filter((p) => p.group === id) }))
    .filter((g) => g.pages.length > 0);
  entries.splice(account === -1 ? entries.length : account, 0, ...groups);
  return entries;
}

/** Whether `pathname` is this page or one below it (`/vehicles/12` belongs to Vehicles). */
export function isWithin(pathname: string, page: PageAccess): boolean {
  return pathname === page.path || pathname.startsWith(`${page.path}/`);
}

/** Where each role starts after signing in. */
export const landingPaths: Record<Role, string> = {
  manager: pages.due.path,
  mechanic: pages.workshop.path,
  driver: pages.myVehicle.path,
};

export const vehiclePath = (id: number) => `/vehicles/${id}`;
export const inspectionPath = (id: number) => `/inspections/${id}`;
export const workRecordPath = (id: number) => `/work-records/${id}`;

/** The page someone with a temporary password (set by a fleet manager) sees instead of the app. */
export const choosePasswordPath = '/choose-password';

/** A `next` address from the query string, if it is a safe path inside this app. */
export function safeNext(next: string | null): string | null {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/sign-in')) return null;
  return next;
}
