import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestServer, type TestServer } from '../support/server';
import { ApiClient, DEMO } from '../support/client';

/**
 * Every API route × {anonymous, driver, mechanic, manager}. A route added to the app but not to
 * this table fails the first test, so access rules are always written down and checked.
 *
 * `allow`: roles that get through (others get 403, anonymous 401). `open`: no sign-in needed.
 * `expect`: the status an allowed caller gets with the probe below (an empty or invalid body for
 * writes, so the check never changes data). `path`: a concrete address when the route has
 * parameters ({vehicle} is the demo driver's own vehicle).
 */
type Role = 'driver' | 'mechanic' | 'manager';
interface Rule {
  open?: true;
  allow?: Role[];
  expect: number;
  path?: string;
  body?: unknown;
}
const ALL: Role[] = ['driver', 'mechanic', 'manager'];

export const ACCESS: Record<string, Rule> = {
  'GET /api/health': { open: true, expect: 200 },
  'GET /api/auth/csrf': { open: true, expect: 200 },
  'POST /api/auth/login': { open: true, expect: 400, body: {} },
  'POST /api/auth/logout': { open: true, expect: 204 },
  'GET /api/auth/me': { allow: ALL, expect: 200 },
  'POST /api/auth/password': { allow: ALL, expect: 400, body: {} },
  'GET /api/users': { allow: ['manager'], expect: 200 },
  'GET /api/users/export': { allow: ['manager'], expect: 200 },
  'POST /api/users': { allow: ['manager'], expect: 400, body: {} },
  'PATCH /api/users/:id': { allow: ['manager'], expect: 400, path: '/api/users/1', body: {} },
  'GET /api/depots': { allow: ALL, expect: 200 },
  'GET /api/specs': { allow: ['manager', 'mechanic'], expect: 200 },
  'GET /api/specs/:id': { allow: ['manager', 'mechanic'], expect: 200, path: '/api/specs/1' },
  'GET /api/vehicles': { allow: ALL, expect: 200 },
  'GET /api/vehicles/export': { allow: ALL, expect: 200 },
  'GET /api/vehicles/:id': { allow: ALL, expect: 200, path: '/api/vehicles/{vehicle}' },
  'GET /api/routes': { allow: ALL, expect: 200 },
  'GET /api/routes/export': { allow: ALL, expect: 200 },
  // Fleet writes, roads, surveys, trips, map
  'GET /api/spec-presets': { allow: ['manager', 'mechanic'], expect: 200 },
  'POST /api/specs/preview': { allow: ['manager', 'mechanic'], expect: 400, body: {} },
  'POST /api/specs': { allow: ['manager'], expect: 400, body: {} },
  'PUT /api/specs/:id': { allow: ['manager'], expect: 400, path: '/api/specs/1', body: {} },
  'POST /api/depots': { allow: ['manager'], expect: 400, body: {} },
  'PATCH /api/depots/:id': { allow: ['manager'], expect: 400, path: '/api/depots/1', body: {} },
  'POST /api/vehicles': { allow: ['manager'], expect: 400, body: {} },
  'PATCH /api/vehicles/:id': { allow: ['manager'], expect: 400, path: '/api/vehicles/{vehicle}', body: {} },
  'GET /api/map-config': { allow: ALL, expect: 200 },
  'GET /api/map/segments': { allow: ALL, expect: 200 },
  'POST /api/routes': { allow: ['manager'], expect: 400, body: {} },
  'GET /api/routes/:id': { allow: ALL, expect: 200, path: '/api/routes/1' },
  'PATCH /api/routes/:id': { allow: ['manager'], expect: 400, path: '/api/routes/1', body: {} },
  'PUT /api/routes/:id/speeds': { allow: ['manager'], expect: 400, path: '/api/routes/1/speeds', body: {} },
  'POST /api/routes/:id/roughness': { allow: ['manager'], expect: 400, path: '/api/routes/1/roughness', body: {} },
  'POST /api/routes/:id/surveys': { allow: ['manager'], expect: 400, path: '/api/routes/1/surveys', body: {} },
  'GET /api/surveys/:id/file': { allow: ['manager'], expect: 200, path: '/api/surveys/1/file' },
  'GET /api/segments': { allow: ALL, expect: 200 },
  'GET /api/segments/export': { allow: ALL, expect: 200 },
  'GET /api/segments/:id': { allow: ALL, expect: 200, path: '/api/segments/1' },
  'GET /api/trips': { allow: ['manager'], expect: 200 },
  'GET /api/trips/export': { allow: ['manager'], expect: 200 },
  'POST /api/trips': { allow: ['manager'], expect: 400, body: {} },
  'POST /api/trips/import': { allow: ['manager'], expect: 400, body: {} },
  // Nightly job, due inspections, wear, outbox, notification preferences
  'POST /api/jobs/nightly/run': { allow: ['manager'], expect: 400, body: { asOf: 'not-a-date' } },
  'GET /api/jobs/runs': { allow: ['manager'], expect: 200 },
  'GET /api/jobs/runs/:id': { allow: ['manager'], expect: 404, path: '/api/jobs/runs/999999' },
  'GET /api/inspections/due': { allow: ['manager', 'mechanic'], expect: 200 },
  'GET /api/vehicles/:id/wear': { allow: ALL, expect: 200, path: '/api/vehicles/{vehicle}/wear' },
  'GET /api/outbox': { allow: ['manager'], expect: 200 },
  'GET /api/outbox/:id': { allow: ['manager'], expect: 404, path: '/api/outbox/999999' },
  'GET /api/account/notifications': { allow: ALL, expect: 200 },
  'PATCH /api/account/notifications': { allow: ALL, expect: 400, body: {} },
  // Workshop (inspections recorded by mechanics, work records, fleet life, forecast)
  'GET /api/inspections': { allow: ['manager', 'mechanic'], expect: 200 },
  'GET /api/inspections/:id': { allow: ['manager', 'mechanic'], expect: 404, path: '/api/inspections/999999' },
  'PATCH /api/inspections/:id': { allow: ['manager'], expect: 400, path: '/api/inspections/999999', body: {} },
  'POST /api/inspections/:id/results': { allow: ['mechanic'], expect: 400, path: '/api/inspections/999999/results', body: {} },
  'POST /api/inspections/:id/attachments': { allow: ['mechanic'], expect: 400, path: '/api/inspections/999999/attachments', body: {} },
  'GET /api/attachments/:id/file': { allow: ['manager', 'mechanic'], expect: 404, path: '/api/attachments/999999/file' },
  'GET /api/work-records': { allow: ['manager', 'mechanic'], expect: 200 },
  'GET /api/work-records/:id': { allow: ['manager', 'mechanic'], expect: 404, path: '/api/work-records/999999' },
  'POST /api/work-records': { allow: ['mechanic'], expect: 400, body: {} },
  'GET /api/fleet-life': { allow: ['manager', 'mechanic'], expect: 200, path: '/api/fleet-life?specId=1' },
  'GET /api/life-backtest': { allow: ['manager', 'mechanic'], expect: 200, path: '/api/life-backtest?specId=1' },
  'GET /api/forecast': { allow: ['manager'], expect: 200 },
  'GET /api/workload': { allow: ['manager'], expect: 200 },
  'GET /api/model-check': { allow: ['manager'], expect: 200 },
  'GET /api/vehicles/:id/workshop': { allow: ['manager', 'mechanic'], expect: 200, path: '/api/vehicles/{vehicle}/workshop' },
  'GET /api/workshop/options': { allow: ['manager', 'mechanic'], expect: 200 },
  // Drivers' ride reports, exposure, speed advice
  'GET /api/ride-reports/scale': { allow: ['driver', 'manager'], expect: 200 },
  'POST /api/ride-reports/snap': { allow: ['driver', 'manager'], expect: 400, body: {} },
  'POST /api/ride-reports': { allow: ['driver'], expect: 400, body: {} },
  'GET /api/ride-reports': { allow: ['driver', 'manager'], expect: 200 },
  'GET /api/ride-reports/by-segment': { allow: ['manager'], expect: 200 },
  'GET /api/ride-reports/:id': { allow: ['driver', 'manager'], expect: 404, path: '/api/ride-reports/999999' },
  'GET /api/ride-reports/:id/photo': { allow: ['driver', 'manager'], expect: 404, path: '/api/ride-reports/999999/photo' },
  'POST /api/ride-reports/:id/accept': { allow: ['manager'], expect: 400, path: '/api/ride-reports/999999/accept', body: {} },
  'POST /api/ride-reports/:id/dismiss': { allow: ['manager'], expect: 400, path: '/api/ride-reports/999999/dismiss', body: {} },
  'GET /api/exposure': { allow: ['driver', 'manager'], expect: 400, path: '/api/exposure?from=not-a-date' },
  'GET /api/exposure/overview': { allow: ['manager'], expect: 200 },
  'GET /api/routes/:id/speed-advice': { allow: ALL, expect: 200, path: '/api/routes/1/speed-advice' },
};

let srv: TestServer;
let driverVehicleId: number;

beforeAll(async () => {
  srv = await startTestServer({ auth: { loginLimitPerPair: 1000, loginLimitPerAddress: 1000 } });
  const c = new ApiClient(srv.url);
  await c.login(DEMO.driver);
  const mine = await c.get<{ items: { id: number }[] }>('/api/vehicles');
  driverVehicleId = mine.body.items[0].id;
});
afterAll(() => srv?.stop());

function routesOfApp(): string[] {
  const keys: string[] = [];
  for (const layer of (srv.api as unknown as { stack: { route?: { path: string; methods: Record<string, boolean> } }[] }).stack) {
    if (!layer.route) continue;
    for (const [m, on] of Object.entries(layer.route.methods)) if (on && m !== '_all') keys.push(`${m.toUpperCase()} /api${layer.route.path}`);
  }
  return keys.sort();
}

describe('role access', () => {
  it('when a route exists in the app, then it is listed in the access table (and vice versa)', () => {
    expect(routesOfApp()).toEqual(Object.keys(ACCESS).sort());
  });

  const who: ('anonymous' | Role)[] = ['anonymous', ...ALL];
  // logout last, since it ends the session it is called with
  const entries = Object.entries(ACCESS).sort(([a], [b]) => Number(a.includes('logout')) - Number(b.includes('logout')));
  for (const as of who) {
    it(`when ${as} calls each route, then the status matches the table`, async () => {
      const c = new ApiClient(srv.url);
      if (as !== 'anonymous') expect((await c.login(DEMO[as])).status).toBe(200);
      const got: string[] = [];
      const want: string[] = [];
      for (const [key, rule] of entries) {
        const [method, pattern] = key.split(' ');
        const path = (rule.path ?? pattern).replace('{vehicle}', String(driverVehicleId));
        const res = await c.raw(method, path, { body: rule.body });
        const expected = rule.open ? rule.expect : as === 'anonymous' ? 401 : rule.allow!.includes(as) ? rule.expect : 403;
        got.push(`${key} → ${res.status}`);
        want.push(`${key} → ${expected}`);
      }
      expect(got).toEqual(want);
    });
  }
});

/**
 * Ownership behind the role: a second driver and a mechanic of the second depot, with bodies that
 * pass validation so the request reaches the depot, assignee and driver checks.
 */
describe('scope within a role', () => {
  interface UserRow { id: number; name: string; email: string; role: Role; depotId: number | null }
  interface VehicleRow { id: number; depotId: number; odometerKm: number; status: string; driverId?: number | null }
  const MILLBROOK = 'mechanic.millbrook@reboundry.test';
  let users: UserRow[];
  let vehicles: VehicleRow[];
  let manager: ApiClient;

  const signedIn = async (email: string, password?: string) => {
    const c = new ApiClient(srv.url);
    expect((await c.login(email, password)).status).toBe(200);
    return c;
  };
  const workBody = async (vehicleId: number, over: Record<string, unknown> = {}) => {
    const w = await manager.get<{ corners: { position: string }[] }>(`/api/vehicles/${vehicleId}/workshop`);
    return {
      vehicleId, performedOn: '2026-11-30', odometerKm: vehicles.find((v) => v.id === vehicleId)!.odometerKm + 40, summary: 'Front left damper replaced', labourHours: 0.5,
      items: [{ position: w.body.corners[0].position, component: 'damper', partDescription: 'Twin-tube damper', cost: 120, removalReason: 'leaking' }],
      ...over,
    };
  };

  beforeAll(async () => {
    manager = await signedIn(DEMO.manager);
    users = (await manager.get<{ items: UserRow[] }>('/api/users?pageSize=200')).body.items;
    vehicles = (await manager.get<{ items: VehicleRow[] }>('/api/vehicles?pageSize=200&status=in_service')).body.items;
  });

  it('when either of two drivers calls every read they are allowed, then no other driver\'s name or email is in any answer', async () => {
    const drivers = users.filter((u) => u.role === 'driver').slice(0, 2);
    expect(drivers).toHaveLength(2);
    const routes = (await manager.get<{ items: { id: number }[] }>('/api/routes?pageSize=200')).body.items;
    for (const me of drivers) {
      const c = await signedIn(me.email);
      const own = (await c.get<{ items: { id: number }[] }>('/api/vehicles')).body.items[0]?.id ?? driverVehicleId;
      const paths = Object.entries(ACCESS)
        .filter(([k, r]) => k.startsWith('GET ') && r.allow?.includes('driver'))
        .map(([k, r]) => (r.path ?? k.slice(4)).replace('{vehicle}', String(own)))
        .filter((p) => !p.includes(':'));
      paths.push(...routes.map((r) => `/api/routes/${r.id}`));
      const others = users.filter((u) => u.id !== me.id && u.role === 'driver');
      const leaks: string[] = [];
      let ownTrips = 0;
      for (const p of paths) {
        const res = await c.raw('GET', p);
        const text = await res.text();
        for (const o of others) if (text.includes(o.name) || text.includes(o.email)) leaks.push(`${p} names ${o.name}`);
        if (/^\/api\/routes\/\d+$/.test(p) && res.status === 200) ownTrips += (JSON.parse(text) as { trips: { recent: unknown[] } }).trips.recent.length;
      }
      expect(leaks, me.email).toEqual([]);
      // the route pages still show the driver's own trips (the check is not passing by showing none)
      expect(ownTrips, me.email).toBeGreaterThan(0);
    }
  });

  it('when a mechanic of the second depot writes for a vehicle of the first without an inspection, then it is refused and no damper changes', async () => {
    const mill = users.find((u) => u.email === MILLBROOK)!;
    const c = await signedIn(MILLBROOK);
    const other = vehicles.find((v) => v.depotId !== mill.depotId)!;
    const before = (await manager.get<{ corners: { damperId: number }[] }>(`/api/vehicles/${other.id}/workshop`)).body.corners.map((x) => x.damperId);
    const refused = await c.json('POST', '/api/work-records', await workBody(other.id));
    expect(refused.status).toBe(403);
    const after = (await manager.get<{ corners: { damperId: number }[] }>(`/api/vehicles/${other.id}/workshop`)).body.corners.map((x) => x.damperId);
    expect(after).toEqual(before);
    // the same body for a vehicle of their own depot goes through, so the refusal was the depot's
    const mine = vehicles.find((v) => v.depotId === mill.depotId)!;
    const ok = await c.json('POST', '/api/work-records', await workBody(mine.id));
    expect(ok.status).toBe(201);
  });

  it('when a workshop odometer goes backwards or jumps beyond the daily limit, then it is refused naming the field', async () => {
    const mill = users.find((u) => u.email === MILLBROOK)!;
    const c = await signedIn(MILLBROOK);
    const mine = vehicles.filter((v) => v.depotId === mill.depotId)[1];
    const km = (await manager.get<{ vehicle: { odometerKm: number } }>(`/api/vehicles/${mine.id}`)).body.vehicle.odometerKm;
    const jump = await c.json<{ error: { fields: Record<string, string> } }>('POST', '/api/work-records', await workBody(mine.id, { odometerKm: 5_000_000 }));
    expect(jump.status).toBe(400);
    expect(jump.body.error.fields.odometerKm).toMatch(/at most/);
    const back = await c.json<{ error: { fields: Record<string, string> } }>('POST', '/api/work-records', await workBody(mine.id, { odometerKm: km - 1 }));
    expect(back.status).toBe(400);
    expect(back.body.error.fields.odometerKm).toMatch(/backwards/);
    // inspection results are held to the same rule
    const insp = (await manager.get<{ items: { id: number; vehicle: { id: number } }[] }>(`/api/inspections?status=open&depotId=${mill.depotId}&assignee=none&pageSize=200`)).body.items[0];
    const vkm = (await manager.get<{ vehicle: { odometerKm: number } }>(`/api/vehicles/${insp.vehicle.id}`)).body.vehicle.odometerKm;
    const res = await c.json<{ error: { fields: Record<string, string> } }>('POST', `/api/inspections/${insp.id}/results`, {
      odometerKm: vkm + 4_000_000, corners: [{ position: 'FL', adhesionPct: 60, findings: [], verdict: 'ok' }],
    });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.odometerKm).toMatch(/at most/);
  });

  it('when a mechanic reads the due list, work records and vehicle workshop views, then only their own scope is answered and every listed item opens', async () => {
    const mill = users.find((u) => u.email === MILLBROOK)!;
    const c = await signedIn(MILLBROOK);
    // a work record in the first depot, by its own mechanic
    const first = vehicles.filter((v) => v.depotId !== mill.depotId)[1];
    expect((await (await signedIn(DEMO.mechanic)).json('POST', '/api/work-records', await workBody(first.id))).status).toBe(201);
    const firstDepot = vehicles.find((v) => v.depotId !== mill.depotId)!.depotId;
    for (const q of ['', `?depotId=${firstDepot}`]) {
      const due = await c.get<{ items: { id: number }[] }>(`/api/inspections/due${q}`);
      expect(due.status).toBe(200);
      for (const i of due.body.items) expect((await c.get(`/api/inspections/${i.id}`)).status, `due item ${i.id}`).toBe(200);
    }
    expect((await c.get<{ items: unknown[] }>(`/api/inspections/due?depotId=${firstDepot}`)).body.items).toEqual([]);
    const all = (await manager.get<{ items: { id: number; vehicle: { id: number } }[] }>('/api/work-records')).body.items;
    const theirs = (await c.get<{ items: { id: number; vehicle: { id: number } }[] }>('/api/work-records')).body.items;
    const depotOf = (id: number) => vehicles.find((v) => v.id === id)?.depotId;
    const elsewhere = all.filter((w) => depotOf(w.vehicle.id) !== mill.depotId);
    expect(elsewhere.length).toBeGreaterThan(0);
    expect(theirs.length).toBeGreaterThan(0);
    // the rule: vehicles of their depot, or vehicles with one of their inspections (assigned to them, or sent to their depot unassigned)
    const withTheirs = new Set(
      (await srv.db.sequelize.query<{ vehicle_id: number }>(
        'SELECT DISTINCT vehicle_id FROM inspections WHERE assignee_id = ? OR (assignee_id IS NULL AND assigned_depot_id = ?)',
        { replacements: [mill.id, mill.depotId], type: 'SELECT' as never },
      )).map((r) => r.vehicle_id),
    );
    expect(theirs.filter((w) => depotOf(w.vehicle.id) !== mill.depotId && !withTheirs.has(w.vehicle.id))).toEqual([]);
    expect((await c.get(`/api/work-records/${elsewhere[0].id}`)).status).toBe(403);
    expect((await c.get(`/api/work-records/${theirs[0].id}`)).status).toBe(200);
    expect((await c.get(`/api/vehicles/${elsewhere[0].vehicle.id}/workshop`)).status).toBe(403);
    expect((await c.get(`/api/vehicles/${theirs[0].vehicle.id}/workshop`)).status).toBe(200);
  });

  it('when a mechanic acts on an inspection assigned to another mechanic of the same depot, then results and attachments are refused', async () => {
    const tomasz = users.find((u) => u.email === DEMO.mechanic)!;
    const created = await manager.json<{ user: { id: number } }>('POST', '/api/users', {
      name: 'Priya Lund', email: 'priya.lund@reboundry.test', role: 'mechanic', password: 'a-long-enough-password', depotId: tomasz.depotId,
    });
    expect(created.status).toBe(201);
    const insp = (await manager.get<{ items: { id: number; vehicle: { id: number } }[] }>(`/api/inspections?status=open&depotId=${tomasz.depotId}&pageSize=200`)).body.items[0];
    expect((await manager.json('PATCH', `/api/inspections/${insp.id}`, { assigneeId: created.body.user.id })).status).toBe(200);
    const c = await signedIn(DEMO.mechanic);
    const km = (await manager.get<{ vehicle: { odometerKm: number } }>(`/api/vehicles/${insp.vehicle.id}`)).body.vehicle.odometerKm;
    const results = { odometerKm: km + 10, corners: [{ position: 'FL', adhesionPct: 60, findings: [], verdict: 'ok' }] };
    expect((await c.json('POST', `/api/inspections/${insp.id}/results`, results)).status).toBe(403);
    const f = new FormData();
    f.append('kind', 'photo');
    f.append('file', new Blob([new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, ...new Array(64).fill(1)])]), 'lane.png');
    expect((await c.raw('POST', `/api/inspections/${insp.id}/attachments`, { form: f })).status).toBe(403);
    // the assignee may, once she has replaced the first password the manager set
    const priya = await signedIn('priya.lund@reboundry.test', 'a-long-enough-password');
    expect((await priya.json('POST', '/api/auth/password', { currentPassword: 'a-long-enough-password', newPassword: 'priya-own-password' })).status).toBe(204);
    expect((await priya.json('POST', `/api/inspections/${insp.id}/results`, results)).status).toBe(200);
  });
});
