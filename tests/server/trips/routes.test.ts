// The trip routes (server/trips/routes.ts) in a bare app on the demo fleet's database: the list's
// query rules, the CSV export's columns and file name in the app's time zone, one trip entered by
// hand with each field's rule and its edges, and the import with and without preview. The same
// routes in the whole app (sign-in, CSRF) are in tests/server/trips.test.ts; the rules behind them in
// tests/server/trips/service.test.ts and tests/server/trips/file-report.test.ts.
import { parse as parseCsv } from 'csv-parse/sync';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import { registerTripRoutes } from '../../../server/trips/routes';
import { TRIP_COLUMNS } from '../../../server/trips/service';
import { startTestServer, TEST_NOW, type TestServer } from '../../support/server';
import { asUser, miniApp, type MiniApp } from '../../support/mini-app';

let srv: TestServer;
let sq: Sequelize;
let app: MiniApp;
let utcApp: MiniApp;
let vehicle: { id: number; fleet_number: string };
let route: { id: number; name: string };
let driver: { id: number; email: string; name: string };
const manager = asUser(1, 'manager');

type Errors = { error: { code: string; fields: Record<string, string> } };

beforeAll(async () => {
  srv = await startTestServer();
  sq = srv.db.sequelize;
  [vehicle] = await sq.query<typeof vehicle>(`SELECT id, fleet_number FROM vehicles WHERE status = 'in_service' ORDER BY fleet_number LIMIT 1`, { type: QueryTypes.SELECT });
  [route] = await sq.query<typeof route>('SELECT id, name FROM routes ORDER BY name LIMIT 1', { type: QueryTypes.SELECT });
  [driver] = await sq.query<typeof driver>(`SELECT id, email, name FROM users WHERE role = 'driver' AND active = TRUE ORDER BY id LIMIT 1`, { type: QueryTypes.SELECT });
  // TEST_NOW is 2026-11-30T12:00Z: already 1 December in Auckland (UTC+13 in summer)
  app = await miniApp((r) => registerTripRoutes(r, { now: () => TEST_NOW, timeZone: 'Pacific/Auckland' }));
  utcApp = await miniApp((r) => registerTripRoutes(r, { now: () => TEST_NOW }));
});
afterAll(async () => {
  await app?.close();
  await utcApp?.close();
  await srv?.stop();
});

const post = (body: unknown) => app.call('POST', '/api/trips', { user: manager, json: body });
/** A trip in 2024, where the demo has none, `h` hours into 3 March. */
const body = (h: number, o: Record<string, unknown> = {}) => ({
  vehicleId: vehicle.id,
  routeId: route.id,
  startedAt: new Date(Date.UTC(2024, 2, 3, h)).toISOString(),
  endedAt: new Date(Date.UTC(2024, 2, 3, h, 30)).toISOString(),
  distanceKm: 10,
  meanSpeedKmh: 20,
  ...o,
});

describe('one trip entered by hand', () => {
  it('when a manager enters a trip without driver or payload, then it is stored with none and answered 201 with its id', async () => {
    const r = await post(body(0));
    expect(r.status).toBe(201);
    const { id } = (await r.json()) as { id: number };
    const [row] = await sq.query<{ vehicle_id: number; route_id: number; driver_id: number | null; payload_kg: number | null; distance_km: number }>('SELECT vehicle_id, route_id, driver_id, payload_kg, distance_km FROM trips WHERE id = ?', { replacements: [id], type: QueryTypes.SELECT });
    expect(row).toEqual({ vehicle_id: vehicle.id, route_id: route.id, driver_id: null, payload_kg: null, distance_km: 10 });
    const withBoth = await post(body(1, { driverId: driver.id, payloadKg: 250 }));
    expect(withBoth.status).toBe(201);
    const [two] = await sq.query<{ driver_id: number; payload_kg: number }>('SELECT driver_id, payload_kg FROM trips WHERE id = ?', { replacements: [((await withBoth.json()) as { id: number }).id], type: QueryTypes.SELECT });
    expect(two).toEqual({ driver_id: driver.id, payload_kg: 250 });
    const nulls = await post(body(2, { driverId: null, payloadKg: null }));
    expect(nulls.status).toBe(201);
  });

  it('when a field breaks its rule, then the answer names the field with its rule', async () => {
    const cases: [Record<string, unknown>, string, string][] = [
      [{ vehicleId: 'CV-101' }, 'vehicleId', 'must be a vehicle id'],
      [{ vehicleId: 0 }, 'vehicleId', 'must be a vehicle id'],
      // zod words a broken whole-number or positive rule with the field's own message
      [{ vehicleId: 1.5 }, 'vehicleId', 'must be a vehicle id'],
      [{ routeId: 2.5 }, 'routeId', 'must be a route id'],
      [{ driverId: 0 }, 'driverId', 'must be a driver id'],
      [{ driverId: 1.5 }, 'driverId', 'must be a driver id'],
      [{ routeId: 'x' }, 'routeId', 'must be a route id'],
      [{ routeId: -1 }, 'routeId', 'must be a route id'],
      [{ driverId: 'someone' }, 'driverId', 'must be a driver id'],
      [{ startedAt: 7 }, 'startedAt', 'must be an ISO 8601 date-time'],
      [{ startedAt: '2024-03-3' }, 'startedAt', 'must be an ISO 8601 date-time'],
      [{ endedAt: false }, 'endedAt', 'must be an ISO 8601 date-time'],
      [{ endedAt: '3/3/2024' }, 'endedAt', 'must be an ISO 8601 date-time'],
      [{ distanceKm: '10' }, 'distanceKm', 'must be a number in km'],
      [{ distanceKm: 0.09 }, 'distanceKm', 'must be at least 0.1 km'],
      [{ distanceKm: 2000.5 }, 'distanceKm', 'must be at most 2000 km'],
      [{ meanSpeedKmh: '20' }, 'meanSpeedKmh', 'must be a number in km/h'],
      [{ meanSpeedKmh: 0.9 }, 'meanSpeedKmh', 'must be at least 1 km/h'],
      [{ meanSpeedKmh: 130.5 }, 'meanSpeedKmh', 'impossible speed: must be at most 130 km/h'],
      [{ payloadKg: '5' }, 'payloadKg', 'must be a number in kg'],
      [{ payloadKg: -0.5 }, 'payloadKg', 'must be 0 kg or more'],
      [{ payloadKg: 40_001 }, 'payloadKg', 'must be at most 40 000 kg'],
      [{ colour: 'red' }, '', ''],
    ];
    for (const [o, field, words] of cases) {
      const r = await post(body(5, o));
      expect(r.status, JSON.stringify(o)).toBe(400);
      const e = (await r.json()) as Errors;
      if (field) expect(e.error.fields[field], JSON.stringify(o)).toEqual(words);
    }
    const [n] = await sq.query<{ n: number }>('SELECT COUNT(*) AS n FROM trips WHERE started_at >= ? AND started_at < ?', { replacements: ['2024-03-03 05:00:00.000 +00:00', '2024-03-03 06:00:00.000 +00:00'], type: QueryTypes.SELECT });
    expect(n.n).toBe(0);
  });

  it('when values sit on the edges of their rules, then the rules let them through', async () => {
    // 0.1 km at 1 km/h takes 6 minutes; 2000 km at 130 km/h takes 15 h 23 min, given a minute more so the mean stays under 130
    const slow = await post({ ...body(6), endedAt: new Date(Date.UTC(2024, 2, 3, 6, 6)).toISOString(), distanceKm: 0.1, meanSpeedKmh: 1, payloadKg: 0 });
    expect(slow.status, JSON.stringify(await slow.clone().json())).toBe(201);
    const far = await post({ ...body(7), endedAt: new Date(Date.UTC(2024, 2, 3, 7) + (2000 / 130) * 3_600_000 + 60_000).toISOString(), distanceKm: 2000, meanSpeedKmh: 130, payloadKg: 40_000 });
    expect(far.status, JSON.stringify(await far.clone().json())).toBe(201);
    // ten characters are enough to reach the date check of the service, which names the field its own way
    const short = (await (await post(body(9, { startedAt: '2024-03-03' }))).json()) as Errors;
    expect(short.error.fields.startedAt).not.toBe('must be an ISO 8601 date-time');
  });
});

describe('the trip list and its export', () => {
  it('when the list is filtered to a day and a vehicle, then it holds the trips entered there, newest first by default', async () => {
    const r = await app.call('GET', `/api/trips?from=2024-03-03&to=2024-03-03&vehicleId=${vehicle.id}&routeId=${route.id}&pageSize=2`, { user: manager });
    expect(r.status).toBe(200);
    const b = (await r.json()) as { items: { startedAt: string; fleetNumber: string }[]; total: number };
    expect(b.total).toBe(5);
    expect(b.items.map((x) => x.startedAt)).toEqual(['2024-03-03T07:00:00.000Z', '2024-03-03T06:00:00.000Z']);
    const page2 = (await (await app.call('GET', '/api/trips?from=2024-03-03&to=2024-03-03&pageSize=2&page=2', { user: manager })).json()) as { items: { startedAt: string }[] };
    expect(page2.items.map((x) => x.startedAt)).toEqual(['2024-03-03T02:00:00.000Z', '2024-03-03T01:00:00.000Z']);
    const byDriver = (await (await app.call('GET', `/api/trips?from=2024-03-03&to=2024-03-03&driverId=${driver.id}`, { user: manager })).json()) as { total: number };
    expect(byDriver.total).toBe(1);
  });

  it('when a filter is not a positive id or a day, then the answer names it', async () => {
    const r = await app.call('GET', '/api/trips?vehicleId=abc&routeId=0&driverId=-2&to=2024-13-01&sort=plate', { user: manager });
    expect(r.status).toBe(400);
    const f = ((await r.json()) as Errors).error.fields;
    expect(f).toMatchObject({ vehicleId: 'must be a number', routeId: 'must be a positive id', driverId: 'must be a positive id' });
    expect(Object.keys(f).sort()).toEqual(['driverId', 'routeId', 'sort', 'to', 'vehicleId']);
  });

  it("when the trips are exported, then the file has the table's columns with units, one row per trip in the list's order, named by the day in the app's time zone", async () => {
    const r = await app.call('GET', '/api/trips/export?from=2024-03-03&to=2024-03-03&sort=startedAt', { user: manager });
    expect(r.status).toBe(200);
    expect(r.headers.get('content-disposition')).toBe('attachment; filename="reboundry-trips-2026-12-01.csv"');
    const rows = parseCsv(await r.text(), { bom: true }) as string[][];
    expect(rows[0]).toEqual(['Started', 'Vehicle', 'Route', 'Driver', 'Distance (km)', 'Mean speed (km/h)', 'Payload (kg)']);
    expect(rows).toHaveLength(6);
    expect(rows[1]).toEqual(['2024-03-03T00:00:00.000Z', vehicle.fleet_number, route.name, '', '10', '20', '']);
    expect(rows[2]).toEqual(['2024-03-03T01:00:00.000Z', vehicle.fleet_number, route.name, driver.name, '10', '20', '250']);
    const utc = await utcApp.call('GET', '/api/trips/export?from=2024-03-03&to=2024-03-03', { user: manager });
    expect(utc.headers.get('content-disposition')).toBe('attachment; filename="reboundry-trips-2026-11-30.csv"');
    const desc = parseCsv(await utc.text(), { bom: true }) as string[][];
    expect(desc[1][0]).toBe('2024-03-03T07:00:00.000Z');
    const bad = await app.call('GET', '/api/trips/export?page=2', { user: manager });
    expect(bad.status).toBe(400);
  });
});

describe('trip file import', () => {
  const HEADER = TRIP_COLUMNS.join(',');
  const file = (text: string) => {
    const form = new FormData();
    form.set('file', new Blob([text], { type: 'text/csv' }), 'march.csv');
    return form;
  };
  const rowAt = (h: number, o: { kmh?: number } = {}) => `${vehicle.fleet_number},${route.name},,2024-03-04T${String(h).padStart(2, '0')}:00:00Z,2024-03-04T${String(h).padStart(2, '0')}:30:00Z,10,${o.kmh ?? 20},`;

  it('when a file is previewed, then each row is reported with the column names and the counts of good and bad rows, and nothing is stored', async () => {
    const text = [HEADER, rowAt(1), rowAt(2), rowAt(3, { kmh: 500 })].join('\n');
    const r = await app.call('POST', '/api/trips/import?preview=true', { user: manager, form: file(text) });
    expect(r.status).toBe(200);
    const b = (await r.json()) as { columns: string[]; total: number; ok: number; bad: number; rows: { row: number; ok: boolean }[] };
    expect(b).toMatchObject({ columns: [...TRIP_COLUMNS], total: 3, ok: 2, bad: 1 });
    expect(b.rows.map((x) => [x.row, x.ok])).toEqual([
      [2, true],
      [3, true],
      [4, false],
    ]);
    const [n] = await sq.query<{ n: number }>('SELECT COUNT(*) AS n FROM trips WHERE started_at >= ? AND started_at < ?', { replacements: ['2024-03-04 00:00:00.000 +00:00', '2024-03-05 00:00:00.000 +00:00'], type: QueryTypes.SELECT });
    expect(n.n).toBe(0);
  });

  it('when a clean file is imported, then it is answered 201 with the import and the number of trips, stored under the signed-in manager', async () => {
    const text = [HEADER, rowAt(5), rowAt(6)].join('\n');
    const importer = asUser(driver.id === 1 ? 2 : 1, 'manager');
    const r = await app.call('POST', '/api/trips/import', { user: importer, form: file(text) });
    expect(r.status).toBe(201);
    const b = (await r.json()) as { importId: number; imported: number };
    expect(b.imported).toBe(2);
    const [imp] = await sq.query<{ original_name: string; imported_by_id: number; row_count: number }>('SELECT original_name, imported_by_id, row_count FROM trip_imports WHERE id = ?', { replacements: [b.importId], type: QueryTypes.SELECT });
    expect(imp).toEqual({ original_name: 'march.csv', imported_by_id: importer.id, row_count: 2 });
  });

  it('when the preview flag is not a yes or no, or no file is sent, then the answer says so', async () => {
    const r = await app.call('POST', '/api/trips/import?preview=maybe', { user: manager, form: file(HEADER) });
    expect(r.status).toBe(400);
    expect(((await r.json()) as Errors).error.fields).toHaveProperty('preview');
    const other = await app.call('POST', '/api/trips/import?dry=1', { user: manager, form: file(HEADER) });
    expect(other.status).toBe(400);
    const none = await app.call('POST', '/api/trips/import?preview=true', { user: manager, form: new FormData() });
    expect(none.status).toBe(400);
    expect(((await none.json()) as Errors).error.fields).toHaveProperty('file');
  });
});

describe('roles', () => {
  it('when a mechanic, a driver or nobody calls a trip route, then it is refused', async () => {
    for (const [method, path] of [
      ['GET', '/api/trips'],
      ['GET', '/api/trips/export'],
      ['POST', '/api/trips'],
      ['POST', '/api/trips/import'],
    ] as const) {
      expect((await app.call(method, path, { user: asUser(5, 'mechanic') })).status, path).toBe(403);
      expect((await app.call(method, path, { user: asUser(6, 'driver') })).status, path).toBe(403);
      expect((await app.call(method, path)).status, path).toBe(401);
    }
  });
});
