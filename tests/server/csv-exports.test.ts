import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import { managerForFile } from '../support/server';
import { ApiClient, DEMO } from '../support/client';

/** The CSV exports of the five lists: every matching row, the list's filters, sort, roles and scope. */

const { srv, manager } = managerForFile();

async function exportOf(c: ApiClient, path: string) {
  const res = await c.raw('GET', path);
  const text = await res.text();
  const rows = res.status === 200 ? (parse(text, { bom: true }) as string[][]) : [];
  return { status: res.status, res, text, header: rows[0], rows: rows.slice(1) };
}

async function totalOf(c: ApiClient, path: string) {
  const r = await c.get<{ total: number; items: Record<string, unknown>[] }>(path);
  expect(r.status).toBe(200);
  return r.body;
}

describe('CSV export of every matching row', () => {
  const HEADERS: Record<string, string[]> = {
    vehicles: ['Fleet number', 'Plate', 'Status', 'Spec', 'Depot', 'Driver', 'Odometer (km)'],
    routes: ['Route', 'Length (km)', 'Usual speed (km/h)', 'Segments', 'Roughest ISO 8608 class'],
    segments: ['Route', 'Segment number', 'From – to (km)', 'ISO 8608 class', 'IRI (m/km)', 'Source', 'Observed', 'Speed (km/h)'],
    trips: ['Started', 'Vehicle', 'Route', 'Driver', 'Distance (km)', 'Mean speed (km/h)', 'Payload (kg)'],
    users: ['Name', 'E-mail', 'Role', 'Sign-in', 'Added'],
  };
  const FILE: Record<string, string> = { vehicles: 'vehicles', routes: 'routes', segments: 'segments', trips: 'trips', users: 'people' };

  for (const list of Object.keys(HEADERS)) {
    it(`when a manager exports ${list}, then the file holds as many rows as the list's total, under the table's headers with units`, async () => {
      const { total } = await totalOf(manager, `/api/${list}`);
      const out = await exportOf(manager, `/api/${list}/export`);
      expect(out.status).toBe(200);
      expect(out.res.headers.get('content-type')).toBe('text/csv; charset=utf-8');
      // TEST_NOW is 2026-11-30T12:00Z and the test app's time zone UTC
      expect(out.res.headers.get('content-disposition')).toBe(`attachment; filename="reboundry-${FILE[list]}-2026-11-30.csv"`);
      expect(out.header).toEqual(HEADERS[list]);
      expect(out.rows).toHaveLength(total);
      expect(out.rows.every((r) => r.length === HEADERS[list].length)).toBe(true);
    });
  }

  it('when trips and segments are exported, then the file goes past one page of 200 and keeps the list order across chunks', async () => {
    const trips = await totalOf(manager, '/api/trips?pageSize=200&page=3&sort=distanceKm');
    expect(trips.total).toBeGreaterThan(500);
    const out = await exportOf(manager, '/api/trips/export?sort=distanceKm');
    expect(out.rows).toHaveLength(trips.total);
    const page3 = trips.items.map((t) => [t.startedAt, t.fleetNumber]);
    expect(out.rows.slice(400, 600).map((r) => [r[0], r[1]])).toEqual(page3);
    const distances = out.rows.map((r) => Number(r[4]));
    expect(distances).toEqual([...distances].sort((a, b) => a - b));

    const segments = await totalOf(manager, '/api/segments?pageSize=1');
    expect(segments.total).toBeGreaterThan(1000);
    const seg = await exportOf(manager, '/api/segments/export');
    expect(seg.rows).toHaveLength(segments.total);
    expect(new Set(seg.rows.map((r) => `${r[0]}#${r[1]}`)).size).toBe(segments.total);
  });

  it('when filters are given, then the export holds exactly the rows the list matches with them', async () => {
    const cls = await totalOf(manager, '/api/segments?isoClass=C&pageSize=1');
    const seg = await exportOf(manager, '/api/segments/export?isoClass=C');
    expect(cls.total).toBeGreaterThan(0);
    expect(seg.rows).toHaveLength(cls.total);
    expect(seg.rows.every((r) => r[3] === 'C')).toBe(true);

    const window = await totalOf(manager, '/api/trips?from=2026-11-01&to=2026-11-15&pageSize=1');
    const trips = await exportOf(manager, '/api/trips/export?from=2026-11-01&to=2026-11-15');
    expect(trips.rows).toHaveLength(window.total);
    expect(trips.rows.every((r) => r[0] >= '2026-11-01' && r[0] < '2026-11-16')).toBe(true);

    const workshop = await totalOf(manager, '/api/vehicles?status=workshop&pageSize=200');
    const vehicles = await exportOf(manager, '/api/vehicles/export?status=workshop');
    expect(vehicles.rows.map((r) => r[0])).toEqual(workshop.items.map((v) => v.fleetNumber));
    expect(vehicles.rows.every((r) => r[2] === 'In workshop')).toBe(true);

    const drivers = await totalOf(manager, '/api/users?role=driver&active=true&pageSize=200');
    const people = await exportOf(manager, '/api/users/export?role=driver&active=true&sort=-name');
    expect(people.rows).toHaveLength(drivers.total);
    expect(people.rows.every((r) => r[2] === 'Driver' && r[3] === 'Active')).toBe(true);
    expect(people.rows.map((r) => r[0])).toEqual([...drivers.items.map((u) => String(u.name))].reverse());

    const none = await exportOf(manager, '/api/routes/export?q=no-such-route');
    expect(none.status).toBe(200);
    expect(none.header).toEqual(HEADERS.routes);
    expect(none.rows).toEqual([]);
  });

  it('when a driver exports vehicles, then the file holds only their own vehicle, as their list does', async () => {
    const driver = new ApiClient(srv.url);
    await driver.login(DEMO.driver);
    const mine = await totalOf(driver, '/api/vehicles');
    expect(mine.total).toBe(1);
    const out = await exportOf(driver, '/api/vehicles/export');
    expect(out.status).toBe(200);
    expect(out.rows.map((r) => r[0])).toEqual([mine.items[0].fleetNumber]);
    // a filter naming another depot or status does not widen it
    const all = await exportOf(driver, '/api/vehicles/export?status=in_service');
    expect(all.rows.length).toBeLessThanOrEqual(1);
  });

  it('when a role the list refuses asks for its export, then it gets 403 (401 when not signed in)', async () => {
    const driver = new ApiClient(srv.url);
    await driver.login(DEMO.driver);
    const mechanic = new ApiClient(srv.url);
    await mechanic.login(DEMO.mechanic);
    for (const c of [driver, mechanic]) {
      expect((await c.raw('GET', '/api/trips/export')).status).toBe(403);
      expect((await c.raw('GET', '/api/users/export')).status).toBe(403);
      expect((await c.raw('GET', '/api/segments/export')).status).toBe(200);
      expect((await c.raw('GET', '/api/routes/export')).status).toBe(200);
    }
    expect((await mechanic.raw('GET', '/api/vehicles/export')).status).toBe(200);
    const anonymous = new ApiClient(srv.url);
    expect((await anonymous.raw('GET', '/api/vehicles/export')).status).toBe(401);
  });

  it('when the query has an unknown key, paging, or a bad sort, then it is refused with 400 naming it', async () => {
    for (const [path, field] of [
      ['/api/vehicles/export?colour=red', ''],
      ['/api/trips/export?page=2', ''],
      ['/api/segments/export?pageSize=50', ''],
      ['/api/routes/export?sort=worstClass', 'sort'],
      ['/api/users/export?role=admin', 'role'],
    ] as const) {
      const res = await manager.raw('GET', path);
      expect(res.status, path).toBe(400);
      expect(res.headers.get('content-type')).toMatch(/^application\/json/);
      const body = (await res.json()) as { error: { code: string; fields?: Record<string, string> } };
      if (field) expect(Object.keys(body.error.fields ?? {}), path).toContain(field);
    }
  });

  it('when a name holds commas, quotes or starts like a formula, then the cell is quoted and guarded with an apostrophe', async () => {
    const name = '=HYPERLINK("http://example.test"), "Boss" Smith';
    const r = await manager.json('POST', '/api/users', { name, email: 'formula.person@reboundry.test', role: 'driver', password: 'long-enough-pw' });
    expect(r.status).toBe(201);
    // the day the row was stored, in the test app's time zone (UTC)
    const added = String((await totalOf(manager, '/api/users?q=formula.person')).items[0].createdAt).slice(0, 10);
    const out = await exportOf(manager, '/api/users/export?q=formula.person');
    // a password the manager set is temporary until its owner chooses one, and the export says so
    expect(out.text).toContain(`"'=HYPERLINK(""http://example.test""), ""Boss"" Smith",formula.person@reboundry.test,Driver,"Active, temporary password",${added}\r\n`);
    expect(out.rows).toEqual([[`'${name}`, 'formula.person@reboundry.test', 'Driver', 'Active, temporary password', added]]);
  });
});
