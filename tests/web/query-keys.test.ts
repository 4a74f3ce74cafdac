import { describe, expect, it } from 'vitest';
import { QueryClient, type QueryKey } from '@tanstack/react-query';
import { invalidateRoots, queryRoots, staleAfter } from '../../web/src/lib/query-keys';
import { vehicleKeys } from '../../web/src/features/vehicles/api/vehicle-keys';
import { wearKeys } from '../../web/src/features/wear/api/get-vehicle-wear';
import { workshopKeys } from '../../web/src/features/workshop/api/types';
import { inspectionKeys } from '../../web/src/features/inspections/api/get-due-inspections';
import { tripKeys } from '../../web/src/features/trips/api/get-trips';
import { userKeys } from '../../web/src/features/users/api/user-keys';
import { mapKeys } from '../../web/src/features/map/api/get-map-data';
import { routeDetailKey } from '../../web/src/features/road-routes/api/get-route';
import { speedAdviceKeys } from '../../web/src/features/speed-advice/api/get-speed-advice';

/** A client cache holding one fresh answer under each key, as after visiting those pages. */
function cacheWith(keys: QueryKey[]) {
  const qc = new QueryClient();
  for (const k of keys) qc.setQueryData(k, { cached: true });
  return qc;
}
const stale = (qc: QueryClient, k: QueryKey) => qc.getQueryState(k)?.isInvalidated ?? false;

describe('what a change makes stale in the client cache', () => {
  const pages = {
    vehicle: vehicleKeys.detail(7),
    wear: wearKeys.vehicle(7),
    inspection: workshopKeys.inspection(3),
    fleetLife: workshopKeys.fleetLife(1),
    due: inspectionKeys.due(null),
    trips: tripKeys.list({ page: 1, pageSize: 25 }),
    people: userKeys.list({ page: 1, pageSize: 25 }),
    map: mapKeys.data(),
    route: routeDetailKey(2),
    advice: speedAdviceKeys.route(2, { specId: 1 } as never),
  };

  it('when the workshop records lane results or work, then the wear, vehicle page, due list and life figures refetch, and unrelated lists stay cached', async () => {
    const qc = cacheWith(Object.values(pages));
    await invalidateRoots(qc, staleAfter.workshop);
    for (const k of [pages.vehicle, pages.wear, pages.inspection, pages.fleetLife, pages.due]) expect(stale(qc, k), JSON.stringify(k)).toBe(true);
    for (const k of [pages.trips, pages.people, pages.map, pages.route]) expect(stale(qc, k), JSON.stringify(k)).toBe(false);
  });

  it('when road data changes, then the map, the route and its speed advice refetch, and the workshop stays cached', async () => {
    const qc = cacheWith(Object.values(pages));
    await invalidateRoots(qc, staleAfter.roadData);
    for (const k of [pages.map, pages.route, pages.advice]) expect(stale(qc, k), JSON.stringify(k)).toBe(true);
    for (const k of [pages.wear, pages.inspection, pages.people]) expect(stale(qc, k), JSON.stringify(k)).toBe(false);
  });

  it('each root is one distinct first key element', () => {
    const firsts = Object.values(queryRoots).map((r) => r[0]);
    expect(new Set(firsts).size).toBe(firsts.length);
  });
});
