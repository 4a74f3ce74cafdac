import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestServer, type TestServer } from '../support/server';
import { ApiClient, DEMO } from '../support/client';

/**
 * Concurrent requests that used to slip past a check made before the write: each is sent at
 * once (Promise.all over real HTTP) and the stored outcome is checked.
 */
let srv: TestServer;
let manager: ApiClient;
const count = async (sql: string) => Number(((await srv.db.sequelize.query(sql, { plain: true })) as { n: number }).n);

beforeAll(async () => {
  srv = await startTestServer({ auth: { loginLimitPerPair: 1000, loginLimitPerAddress: 1000 } });
  manager = new ApiClient(srv.url);
  await manager.login(DEMO.manager);
  await manager.refreshCsrf();
});
afterAll(() => srv?.stop());

describe('the last active manager', () => {
  it('when a manager deactivates the only other manager and demotes themself at once, then one change is refused and a manager remains (5 tries)', async () => {
    const me = (await manager.get<{ user: { id: number } }>('/api/auth/me')).body.user.id;
    const other = await manager.json<{ user: { id: number } }>('POST', '/api/users', { name: 'Second Manager', email: 'second.manager@reboundry.test', role: 'manager', password: 'second-manager-pw' });
    expect(other.status).toBe(201);
    const otherId = other.body.user.id;
    for (let k = 0; k < 5; k++) {
      // both active managers again (set directly, so the next try does not hang on the last one's outcome)
      await srv.db.sequelize.query(`UPDATE users SET role = 'manager', active = TRUE WHERE id IN (?, ?)`, { replacements: [me, otherId] });
      const c = new ApiClient(srv.url);
      expect((await c.login(DEMO.manager)).status).toBe(200);
      await c.refreshCsrf();
      const [off, demote] = await Promise.all([
        c.json('PATCH', `/api/users/${otherId}`, { active: false }),
        c.json('PATCH', `/api/users/${me}`, { role: 'mechanic' }),
      ]);
      // one goes through; the other is refused as the last manager (409), or, when the demotion
      // is committed before the other request is even let in, as no longer a manager (403)
      const statuses = [off.status, demote.status].sort();
      expect(statuses[0], `try ${k + 1}`).toBe(200);
      expect([403, 409], `try ${k + 1}`).toContain(statuses[1]);
      expect(await count(`SELECT COUNT(*) AS n FROM users WHERE role = 'manager' AND active = TRUE`)).toBe(1);
    }
    await srv.db.sequelize.query(`UPDATE users SET role = 'manager', active = TRUE WHERE id = ?`, { replacements: [me] });
    await manager.login(DEMO.manager);
    // one token before requests are sent at once (each fetching its own would replace the other's cookie)
    await manager.refreshCsrf();
  });
});

describe('trips sent twice at once', () => {
  const HEADER = 'vehicle,route,driver_email,start,end,distance_km,mean_speed_kmh,payload_kg';
  const send = (csv: string, name = 'trips.csv') => {
    const form = new FormData();
    form.set('file', new Blob([csv], { type: 'text/csv' }), name);
    return manager.raw('POST', '/api/trips/import', { form });
  };
  let vehicleId: number;
  let routeId: number;
  beforeAll(async () => {
    vehicleId = (await manager.get<{ items: { id: number }[] }>('/api/vehicles?q=CV-110')).body.items[0].id;
    routeId = (await manager.get<{ items: { id: number }[] }>('/api/routes?q=Tanner')).body.items[0].id;
  });

  it('when the same trip is submitted twice at once, then one is stored and the other refused as an overlap', async () => {
    const trip = { vehicleId, routeId, startedAt: '2026-11-30T09:00:00Z', endedAt: '2026-11-30T09:30:00Z', distanceKm: 14, meanSpeedKmh: 30 };
    const before = await count('SELECT COUNT(*) AS n FROM trips');
    const res = await Promise.all([manager.json('POST', '/api/trips', trip), manager.json('POST', '/api/trips', trip)]);
    expect(res.map((r) => r.status).sort()).toEqual([201, 400]);
    expect(JSON.stringify(res.find((r) => r.status === 400)!.body)).toContain('overlaps trip #');
    expect(await count('SELECT COUNT(*) AS n FROM trips')).toBe(before + 1);
  });

  it('when one trip ends as the next starts, then both are stored (back to back is not an overlap); a minute more overlaps', async () => {
    const at = (h: string) => `2026-11-30T${h}:00Z`;
    const first = await manager.json('POST', '/api/trips', { vehicleId, routeId, startedAt: at('10:00'), endedAt: at('10:30'), distanceKm: 14, meanSpeedKmh: 30 });
    expect(first.status).toBe(201);
    const next = await manager.json('POST', '/api/trips', { vehicleId, routeId, startedAt: at('10:30'), endedAt: at('11:00'), distanceKm: 14, meanSpeedKmh: 30 });
    expect(next.status).toBe(201);
    const over = await manager.json('POST', '/api/trips', { vehicleId, routeId, startedAt: at('10:59'), endedAt: at('11:20'), distanceKm: 10, meanSpeedKmh: 30 });
    expect(over.status).toBe(400);
    // the same in one file: back-to-back rows pass, an overlapping row is named
    const csv = [HEADER, 'CV-111,Tanner Way town loop,,2026-11-30T06:00:00Z,2026-11-30T06:30:00Z,14,30,', 'CV-111,Tanner Way town loop,,2026-11-30T06:30:00Z,2026-11-30T07:00:00Z,14,30,'].join('\n');
    const form = new FormData();
    form.set('file', new Blob([csv], { type: 'text/csv' }), 'b2b.csv');
    const preview = (await (await manager.raw('POST', '/api/trips/import?preview=true', { form })).json()) as { bad: number };
    expect(preview.bad).toBe(0);
  });

  it('when one file is imported three times at once, then it is stored once and the repeats are recognised as the same file', async () => {
    const csv = [HEADER, 'CV-102,Northgate retail park,,2026-11-30T07:00:00Z,2026-11-30T07:45:00Z,18,40,', 'CV-103,Northgate retail park,,2026-11-30T07:00:00Z,2026-11-30T07:45:00Z,18,40,'].join('\n');
    const before = { trips: await count('SELECT COUNT(*) AS n FROM trips'), imports: await count('SELECT COUNT(*) AS n FROM trip_imports') };
    const res = await Promise.all([send(csv), send(csv), send(csv)]);
    const statuses = res.map((r) => r.status).sort();
    expect(statuses[0]).toBe(201);
    expect(statuses.slice(1).every((s) => s === 409 || s === 400)).toBe(true);
    expect(await count('SELECT COUNT(*) AS n FROM trips')).toBe(before.trips + 2);
    expect(await count('SELECT COUNT(*) AS n FROM trip_imports')).toBe(before.imports + 1);
    // sent again later, under another name: recognised, not reported as overlaps row by row
    const again = await send(csv, 'renamed.csv');
    expect(again.status).toBe(409);
    expect(((await again.json()) as { error: { message: string } }).error.message).toMatch(/already imported \(import #\d+/);
  });

  it('when the trips insert fails after the import row is written, then the import row is rolled back too', async () => {
    // a planted failure on one trip's insert, after TripImport.create in the same transaction
    // (a trigger is written in each database's own language: PostgreSQL's runs a function)
    const pg = srv.db.dialect === 'postgres';
    if (pg) {
      await srv.db.sequelize.query(`CREATE FUNCTION planted_failure() RETURNS trigger LANGUAGE plpgsql AS $$ BEGIN RAISE EXCEPTION 'planted failure'; END $$`);
      await srv.db.sequelize.query(`CREATE TRIGGER planted_failure BEFORE INSERT ON trips FOR EACH ROW WHEN (NEW.distance_km = 17.25) EXECUTE FUNCTION planted_failure()`);
    } else {
      await srv.db.sequelize.query(`CREATE TRIGGER planted_failure BEFORE INSERT ON trips WHEN NEW.distance_km = 17.25 BEGIN SELECT RAISE(ABORT, 'planted failure'); END`);
    }
    try {
      const before = { trips: await count('SELECT COUNT(*) AS n FROM trips'), imports: await count('SELECT COUNT(*) AS n FROM trip_imports') };
      const csv = [HEADER, 'CV-104,Northgate retail park,,2026-11-30T05:00:00Z,2026-11-30T05:45:00Z,17.25,40,'].join('\n');
      const res = await send(csv, 'fails.csv');
      expect(res.status).toBeGreaterThanOrEqual(400);
      expect(await count('SELECT COUNT(*) AS n FROM trips')).toBe(before.trips);
      expect(await count('SELECT COUNT(*) AS n FROM trip_imports')).toBe(before.imports);
    } finally {
      await srv.db.sequelize.query(pg ? 'DROP TRIGGER planted_failure ON trips' : 'DROP TRIGGER planted_failure');
      if (pg) await srv.db.sequelize.query('DROP FUNCTION planted_failure()');
    }
  });
});
