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
  'POST /api/users': { allow: ['manager'], expect: 400, body: {} },
  'PATCH /api/users/:id': { allow: ['manager'], expect: 400, path: '/api/users/1', body: {} },
  'GET /api/depots': { allow: ALL, expect: 200 },
  'GET /api/specs': { allow: ['manager', 'mechanic'], expect: 200 },
  'GET /api/specs/:id': { allow: ['manager', 'mechanic'], expect: 200, path: '/api/specs/1' },
  'GET /api/vehicles': { allow: ALL, expect: 200 },
  'GET /api/vehicles/:id': { allow: ALL, expect: 200, path: '/api/vehicles/{vehicle}' },
  'GET /api/routes': { allow: ALL, expect: 200 },
  // issue 4: fleet writes, roads, surveys, trips, map
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
  'GET /api/segments/:id': { allow: ALL, expect: 200, path: '/api/segments/1' },
  'GET /api/trips': { allow: ['manager'], expect: 200 },
  'POST /api/trips': { allow: ['manager'], expect: 400, body: {} },
  'POST /api/trips/import': { allow: ['manager'], expect: 400, body: {} },
  // issue 5: nightly job, due inspections, wear, outbox, notification preferences
  'POST /api/jobs/nightly/run': { allow: ['manager'], expect: 400, body: { asOf: 'not-a-date' } },
  'GET /api/jobs/runs': { allow: ['manager'], expect: 200 },
  'GET /api/jobs/runs/:id': { allow: ['manager'], expect: 404, path: '/api/jobs/runs/999999' },
  'GET /api/inspections/due': { allow: ['manager', 'mechanic'], expect: 200 },
  'GET /api/vehicles/:id/wear': { allow: ALL, expect: 200, path: '/api/vehicles/{vehicle}/wear' },
  'GET /api/outbox': { allow: ['manager'], expect: 200 },
  'GET /api/outbox/:id': { allow: ['manager'], expect: 404, path: '/api/outbox/999999' },
  'GET /api/account/notifications': { allow: ALL, expect: 200 },
  'PATCH /api/account/notifications': { allow: ALL, expect: 400, body: {} },
  // issue 6: workshop (inspections recorded by mechanics, work records, fleet life, forecast)
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
  // issue 7: drivers' ride reports, exposure, speed advice
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
  srv = await startTestServer({ auth: { loginLimitPerAccount: 1000, loginLimitPerAddress: 1000 } });
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
