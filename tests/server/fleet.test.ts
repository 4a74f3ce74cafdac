import { describe, expect, it } from 'vitest';
import { managerForFile } from '../support/server';
import { ApiClient, DEMO } from '../support/client';
import { modes } from '../../server/physics/quarter-car';

const { srv, manager } = managerForFile();

interface VehicleItem {
  id: number;
  fleetNumber: string;
  odometerKm: number;
  depotName: string;
  specName: string;
  status: string;
  driverId: number | null;
}
interface List<T> {
  items: T[];
  total: number;
}

describe('demo fleet', () => {
  it('when seeded, then it has 2 depots, ≥ 40 vehicles of ≥ 3 specs and ≥ 12 routes', async () => {
    const depots = await manager.get<List<unknown>>('/api/depots');
    const vehicles = await manager.get<List<VehicleItem>>('/api/vehicles?pageSize=200');
    const specs = await manager.get<List<unknown>>('/api/specs');
    const routes = await manager.get<List<{ segmentCount: number; worstClass: string }>>('/api/routes?pageSize=200');
    expect(depots.body.total).toBe(2);
    expect(vehicles.body.total).toBeGreaterThanOrEqual(40);
    expect(specs.body.total).toBeGreaterThanOrEqual(3);
    expect(routes.body.total).toBeGreaterThanOrEqual(12);
    expect(routes.body.items.every((r) => r.segmentCount > 50)).toBe(true);
    expect(new Set(routes.body.items.map((r) => r.worstClass)).size).toBeGreaterThanOrEqual(3);
  });

  it('when seeded, then every spec corner has body bounce and wheel hop in the typical ranges (docs/methods.md "Typical parameters")', async () => {
    const specs = await manager.get<List<{ name: string; vehicleClass: string; axles: { corner: Parameters<typeof modes>[0] }[] }>>('/api/specs');
    for (const s of specs.body.items) {
      for (const a of s.axles) {
        const m = modes(a.corner);
        const heavy = s.vehicleClass === 'heavy goods';
        const ctx = `${s.name}: ${JSON.stringify(m)}`;
        // docs/methods.md "Typical parameters" (textbook ranges, from memory): cars/vans body 1.0–1.5 Hz, trucks 1–4 Hz; wheel hop ~10–15 Hz
        expect(m.bodyHz, ctx).toBeGreaterThanOrEqual(1.0);
        expect(m.bodyHz, ctx).toBeLessThanOrEqual(heavy ? 4 : 1.6);
        expect(m.wheelHz, ctx).toBeGreaterThanOrEqual(heavy ? 7 : 9);
        expect(m.wheelHz, ctx).toBeLessThanOrEqual(16);
        expect(m.bodyDampingRatio, ctx).toBeGreaterThanOrEqual(0.2);
        expect(m.bodyDampingRatio, ctx).toBeLessThanOrEqual(0.45);
        expect(a.corner.unsprungMassKg).toBeLessThan(a.corner.sprungMassKg / 3);
      }
    }
  });
});

describe('vehicles', () => {
  it('when sorted by odometer descending, then the page is in that order', async () => {
    const r = await manager.get<List<VehicleItem>>('/api/vehicles?sort=-odometerKm&pageSize=10');
    const odo = r.body.items.map((v) => v.odometerKm);
    expect([...odo].sort((a, b) => b - a)).toEqual(odo);
  });

  it('when sorted by depot name, then it sorts by the joined name', async () => {
    const r = await manager.get<List<VehicleItem>>('/api/vehicles?sort=depotName&pageSize=200');
    const names = r.body.items.map((v) => v.depotName);
    expect([...names].sort()).toEqual(names);
  });

  it('when filtered by status and searched by fleet number, then only matches come back', async () => {
    const w = await manager.get<List<VehicleItem>>('/api/vehicles?status=workshop');
    expect(w.body.total).toBeGreaterThan(0);
    expect(w.body.items.every((v) => v.status === 'workshop')).toBe(true);
    const q = await manager.get<List<VehicleItem>>('/api/vehicles?q=RT-10');
    expect(q.body.total).toBeGreaterThan(0);
    expect(q.body.items.every((v) => v.fleetNumber.startsWith('RT-10'))).toBe(true);
  });

  it('when paging, then pages do not overlap and the total is stable', async () => {
    const p1 = await manager.get<List<VehicleItem>>('/api/vehicles?pageSize=15&page=1');
    const p2 = await manager.get<List<VehicleItem>>('/api/vehicles?pageSize=15&page=2');
    expect(p1.body.total).toBe(p2.body.total);
    const ids1 = new Set(p1.body.items.map((v) => v.id));
    expect(p2.body.items.some((v) => ids1.has(v.id))).toBe(false);
  });

  it('when the query is bad, then 400 names each bad key', async () => {
    const r = await manager.get<{ error: { fields: Record<string, string> } }>('/api/vehicles?sort=colour&pageSize=1000&status=flying&bogus=1');
    expect(r.status).toBe(400);
    expect(Object.keys(r.body.error.fields)).toEqual(expect.arrayContaining(['sort', 'pageSize', 'status']));
  });

  it('when a vehicle page is opened, then it lists its dampers by corner with install date and km', async () => {
    const list = await manager.get<List<VehicleItem>>('/api/vehicles?q=CV-102');
    const d = await manager.get<{ dampers: { position: string; installedAt: string; installedOdometerKm: number; removedAt: string | null }[]; recentTrips: unknown[]; spec: { axles: unknown[] } }>(
      `/api/vehicles/${list.body.items[0].id}`,
    );
    expect(d.status).toBe(200);
    const fitted = d.body.dampers.filter((x) => !x.removedAt).map((x) => x.position).sort();
    expect(fitted).toEqual(['FL', 'FR', 'RL', 'RR']);
    expect(d.body.recentTrips.length).toBeGreaterThan(0);
    expect(d.body.spec.axles).toHaveLength(2);
  });

  it('when a driver lists vehicles, then only their own comes back, and another vehicle is 403', async () => {
    const drv = new ApiClient(srv.url);
    const me = await drv.login(DEMO.driver);
    const mine = await drv.get<List<VehicleItem>>('/api/vehicles');
    expect(mine.body.total).toBe(1);
    expect(mine.body.items[0].driverId).toBe(me.body.user.id);
    const all = await manager.get<List<VehicleItem>>('/api/vehicles?pageSize=200');
    const other = all.body.items.find((v) => v.driverId !== me.body.user.id)!;
    expect((await drv.get(`/api/vehicles/${other.id}`)).status).toBe(403);
  });

  it('when a vehicle does not exist, then 404', async () => {
    expect((await manager.get('/api/vehicles/99999')).status).toBe(404);
  });
});
