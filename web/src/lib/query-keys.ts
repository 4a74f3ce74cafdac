import type { QueryClient, QueryKey } from '@tanstack/react-query';

/**
 * The first element of every query key, one per kind of data the client caches. Each feature
 * builds its own keys on its root (general → specific: root, then list/detail, then parameters),
 * and a change that touches another feature's data invalidates that feature's root from here, since
 * features never import each other. No query key starts with a literal elsewhere (lint checks).
 */
export const queryRoots = {
  account: ['account'],
  auth: ['auth'],
  depots: ['depots'],
  exposure: ['exposure'],
  inspections: ['inspections'],
  jobs: ['jobs'],
  map: ['map'],
  outbox: ['outbox'],
  rideReports: ['ride-reports'],
  routes: ['routes'],
  segments: ['segments'],
  specs: ['specs'],
  speedAdvice: ['speed-advice'],
  trips: ['trips'],
  users: ['users'],
  vehicles: ['vehicles'],
  wear: ['wear'],
  workshop: ['workshop'],
} as const satisfies Record<string, readonly [string]>;

export type QueryRoot = keyof typeof queryRoots;

/**
 * What each kind of change makes stale, named once so the mutations that make it agree:
 * - the workshop's records (test-lane readings, findings and verdicts; work done, dampers or
 *   springs replaced, odometer read) revise the corners' damping and fitted parts, so the wear,
 *   the predictions, the due list, the vehicle pages and the fleet's life figures;
 * - road data (a survey, a ride report accepted, a class or speed set, a route drawn) changes the
 *   map, the routes, their segments and the speed advice on them.
 */
export const staleAfter = {
  workshop: ['workshop', 'wear', 'vehicles', 'inspections'],
  roadData: ['routes', 'segments', 'map', 'speedAdvice'],
} as const satisfies Record<string, readonly QueryRoot[]>;

/** Marks every cached query under the given roots stale (refetched when shown). */
export function invalidateRoots(qc: QueryClient, roots: readonly QueryRoot[]): Promise<void> {
  return Promise.all(roots.map((r) => qc.invalidateQueries({ queryKey: queryRoots[r] as unknown as QueryKey }))).then(() => undefined);
}
