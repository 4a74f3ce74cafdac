// Trip storage on the demo fleet's database (server/trips/repository.ts), with trips planted in
// March 2024, January 2027 and 2023 where the demo has none (its trips run from 2026-10-01 to
// 2026-11-29): the lookups, overlaps at their edges, the import by file hash, the insert in slices
// with its check inside the transaction, the list's filters, day edges, sorts and paging, and the
// recent payloads of a spec. The rules using them are in tests/server/trips/service.test.ts and
// tests/server/trips/file-report.test.ts.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes, Transaction, type Sequelize } from 'sequelize';
import { tripsRepository, type TripInput } from '../../../server/trips/repository';
import { startTestServer, type TestServer } from '../../support/server';

let srv: TestServer;
let sq: Sequelize;
type VehicleRow = { id: number; fleet_number: string; spec_id: number };
/** Two demo vehicles of different specs, `v1` first by fleet number. */
let v1: VehicleRow;
let v2: VehicleRow;
/** Two demo routes, `r1` first by name. */
let r1: { id: number; name: string };
let r2: { id: number; name: string };
let driver: { id: number; name: string };
/** The March 2024 trips, by name. */
const t: Record<'t1' | 't2' | 't3' | 't4', number> = { t1: 0, t2: 0, t3: 0, t4: 0 };

const select = <T extends object>(q: string, replacements: unknown[] = []) => sq.query<T>(q, { replacements, type: QueryTypes.SELECT });
const at = (iso: string) => new Date(iso);
const trip = (o: Partial<TripInput> & Pick<TripInput, 'startedAt' | 'endedAt'>): TripInput => ({ vehicleId: v1.id, routeId: r1.id, driverId: null, distanceKm: 10, meanSpeedKmh: 20, payloadKg: null, ...o });

beforeAll(async () => {
  srv = await startTestServer();
  sq = srv.db.sequelize;
  const vs = await select<VehicleRow>('SELECT id, fleet_number, spec_id FROM vehicles ORDER BY fleet_number');
  v1 = vs[0];
  v2 = vs.filter((v) => v.spec_id !== v1.spec_id).at(-1)!;
  const rs = await select<{ id: number; name: string }>('SELECT id, name FROM routes ORDER BY name');
  [r1, r2] = [rs[0], rs.at(-1)!];
  [driver] = await select<{ id: number; name: string }>(`SELECT id, name FROM users WHERE role = 'driver' ORDER BY id LIMIT 1`);
  const { ids } = await tripsRepository.insert(
    [
      trip({ vehicleId: v2.id, routeId: r1.id, driverId: driver.id, startedAt: at('2024-03-01T08:00:00Z'), endedAt: at('2024-03-01T09:00:00Z'), distanceKm: 30, meanSpeedKmh: 30, payloadKg: 500 }),
      trip({ vehicleId: v1.id, routeId: r2.id, startedAt: at('2024-03-02T08:00:00Z'), endedAt: at('2024-03-02T08:30:00Z'), distanceKm: 10, meanSpeedKmh: 20 }),
      trip({ vehicleId: v1.id, routeId: r1.id, driverId: driver.id, startedAt: at('2024-03-03T23:30:00Z'), endedAt: at('2024-03-03T23:59:00Z'), distanceKm: 5, meanSpeedKmh: 10.5, payloadKg: 0 }),
      trip({ vehicleId: v2.id, routeId: r2.id, startedAt: at('2024-03-04T00:00:00Z'), endedAt: at('2024-03-04T01:00:00Z'), distanceKm: 50, meanSpeedKmh: 50, payloadKg: 1000 }),
    ],
    null,
  );
  [t.t1, t.t2, t.t3, t.t4] = ids;
  await sq.query('UPDATE trips SET processed_at = ? WHERE id = ?', { replacements: ['2024-03-05 00:00:00.000 +00:00', t.t4] });
});
afterAll(() => srv?.stop());

describe('lookups', () => {
  it('when the lookups are read, then every vehicle, route and user comes with the fields the import checks', async () => {
    const l = await tripsRepository.lookups();
    const byId = <T extends { id: number }>(xs: T[]) => [...xs].sort((a, b) => a.id - b.id);
    // camelCase aliases quoted: PostgreSQL folds an unquoted one to lower case
    expect(byId(l.vehicles)).toEqual((await select<{ id: number; fleetNumber: string; status: string }>('SELECT id, fleet_number AS "fleetNumber", status FROM vehicles ORDER BY id')));
    expect(byId(l.routes)).toEqual(await select<{ id: number; name: string; lengthM: number }>('SELECT id, name, length_m AS "lengthM" FROM routes ORDER BY id'));
    const users = await select<{ id: number; email: string; name: string; role: string; active: number }>('SELECT id, email, name, role, active FROM users ORDER BY id');
    expect(byId(l.users)).toEqual(users.map((u) => ({ ...u, active: u.active === 1 })));
    expect(l.users.some((u) => !u.active)).toBe(false);
  });
});

describe('overlapping', () => {
  it('when a window touches a trip only at its start or end, then it does not overlap; a minute inside does', async () => {
    const ov = (from: string, to: string) => tripsRepository.overlapping([v1.id], [], at(from), at(to)).then((rows) => rows.map((r) => r.id));
    expect(await ov('2024-03-02T08:30:00Z', '2024-03-02T09:00:00Z')).toEqual([]);
    expect(await ov('2024-03-02T07:30:00Z', '2024-03-02T08:00:00Z')).toEqual([]);
    expect(await ov('2024-03-02T08:29:00Z', '2024-03-02T08:31:00Z')).toEqual([t.t2]);
    expect(await ov('2024-03-02T07:59:00Z', '2024-03-02T08:01:00Z')).toEqual([t.t2]);
  });

  it('when trips are asked for by vehicle, by driver or both, then each matches its own; with neither there are none', async () => {
    const from = at('2024-03-01T00:00:00Z');
    const to = at('2024-03-05T00:00:00Z');
    const ids = (rows: { id: number }[]) => rows.map((r) => r.id).sort((a, b) => a - b);
    expect(ids(await tripsRepository.overlapping([v1.id], [], from, to))).toEqual([t.t2, t.t3]);
    expect(ids(await tripsRepository.overlapping([], [driver.id], from, to))).toEqual([t.t1, t.t3]);
    expect(ids(await tripsRepository.overlapping([v1.id], [driver.id], from, to))).toEqual([t.t1, t.t2, t.t3]);
    expect(ids(await tripsRepository.overlapping([v1.id, v2.id], [], from, to))).toEqual([t.t1, t.t2, t.t3, t.t4]);
    expect(await tripsRepository.overlapping([], [], at('2000-01-01T00:00:00Z'), at('2100-01-01T00:00:00Z'))).toEqual([]);
    const [two] = await tripsRepository.overlapping([v1.id], [], at('2024-03-02T08:10:00Z'), at('2024-03-02T08:20:00Z'));
    expect(two).toEqual({ id: t.t2, vehicleId: v1.id, driverId: null, startedAt: at('2024-03-02T08:00:00Z'), endedAt: at('2024-03-02T08:30:00Z') });
  });
});

describe('insert and import', () => {
  const count = async (where: string, r: unknown[] = []) => (await select<{ n: number }>(`SELECT COUNT(*) AS n FROM trips WHERE ${where}`, r))[0].n;

  it('when 600 trips are imported (three slices of 250), then all are stored in order under one import row counting them, found by its file hash', async () => {
    const trips = Array.from({ length: 600 }, (_, i) => trip({ startedAt: new Date(Date.UTC(2023, 0, 1) + i * 3_600_000), endedAt: new Date(Date.UTC(2023, 0, 1) + i * 3_600_000 + 1_800_000) }));
    const meta = { originalName: 'january.csv', importedById: driver.id, importedAt: at('2026-11-30T12:00:00Z'), fileSha256: 'f'.repeat(64) };
    let seen: Transaction | undefined;
    const out = await tripsRepository.insert(trips, meta, async (tx) => {
      seen = tx;
    });
    expect(seen).toBeInstanceOf(Transaction);
    expect(out.ids).toHaveLength(600);
    const rows = await select<{ id: number; started_at: string; import_id: number }>('SELECT id, started_at, import_id FROM trips WHERE import_id = ? ORDER BY id', [out.importId]);
    expect(rows.map((r) => r.id)).toEqual(out.ids);
    expect(rows.map((r) => new Date(r.started_at).getTime())).toEqual(trips.map((x) => x.startedAt.getTime()));
    const [imp] = await select<{ original_name: string; row_count: number; imported_by_id: number; file_sha256: string }>('SELECT original_name, row_count, imported_by_id, file_sha256 FROM trip_imports WHERE id = ?', [out.importId]);
    expect(imp).toEqual({ original_name: 'january.csv', row_count: 600, imported_by_id: driver.id, file_sha256: 'f'.repeat(64) });
    const found = await tripsRepository.importByHash('f'.repeat(64));
    expect(found?.id).toBe(out.importId);
    expect(found?.rowCount).toBe(600);
    expect(found?.importedAt.toISOString()).toBe('2026-11-30T12:00:00.000Z');
    expect(await tripsRepository.importByHash('e'.repeat(64))).toBeNull();
  });

  it('when the check refuses, then nothing is stored, neither trips nor the import row', async () => {
    const imports = (await select<{ n: number }>('SELECT COUNT(*) AS n FROM trip_imports'))[0].n;
    const refused = new Error('overlaps');
    const p = tripsRepository.insert([trip({ startedAt: at('2022-05-01T08:00:00Z'), endedAt: at('2022-05-01T09:00:00Z') })], { originalName: 'x.csv', importedById: driver.id, importedAt: at('2026-11-30T12:00:00Z'), fileSha256: 'a'.repeat(64) }, async () => {
      throw refused;
    });
    await expect(p).rejects.toBe(refused);
    expect(await count('started_at >= ? AND started_at < ?', ['2022-05-01 00:00:00.000 +00:00', '2022-05-02 00:00:00.000 +00:00'])).toBe(0);
    expect((await select<{ n: number }>('SELECT COUNT(*) AS n FROM trip_imports'))[0].n).toBe(imports);
  });

  it('when one trip is stored without an import, then it belongs to none', async () => {
    const out = await tripsRepository.insert([trip({ startedAt: at('2022-06-01T08:00:00Z'), endedAt: at('2022-06-01T09:00:00Z') })], null);
    expect(out.importId).toBeNull();
    expect(out.ids).toHaveLength(1);
    expect(await count('id = ? AND import_id IS NULL', [out.ids[0]])).toBe(1);
  });
});

describe('list', () => {
  type Q = Parameters<typeof tripsRepository.list>[0];
  const march = { from: '2024-03-01', to: '2024-03-04' };
  const list = (o: Partial<Q> = {}) => tripsRepository.list({ offset: 0, pageSize: 50, sort: { field: 'startedAt', dir: 'ASC' }, ...march, ...o });
  const ids = async (o: Partial<Q> = {}) => (await list(o)).items.map((x) => x.id);

  it('when trips are listed over days, then a day runs from its midnight (UTC) to the next, both days included', async () => {
    expect(await ids()).toEqual([t.t1, t.t2, t.t3, t.t4]);
    expect(await ids({ from: '2024-03-04', to: '2024-03-04' })).toEqual([t.t4]);
    expect(await ids({ from: '2024-03-01', to: '2024-03-03' })).toEqual([t.t1, t.t2, t.t3]);
    expect(await ids({ from: '2024-03-02', to: '2024-03-02' })).toEqual([t.t2]);
    // without a start day, everything up to the end day; without an end day, everything from the start day
    expect((await ids({ from: undefined, to: '2024-03-01', sort: { field: 'startedAt', dir: 'DESC' } }))[0]).toBe(t.t1);
    expect((await list({ from: undefined, to: '2024-03-03' })).items.every((x) => x.startedAt < '2024-03-04')).toBe(true);
    expect((await list({ from: '2024-03-04', to: undefined })).items.some((x) => x.id === t.t1)).toBe(false);
  });

  it('when the list is filtered by vehicle, route or driver, then only their trips remain; with no filter every trip counts', async () => {
    expect(await ids({ vehicleId: v1.id })).toEqual([t.t2, t.t3]);
    expect(await ids({ routeId: r2.id })).toEqual([t.t2, t.t4]);
    expect(await ids({ driverId: driver.id })).toEqual([t.t1, t.t3]);
    expect(await ids({ vehicleId: v2.id, routeId: r2.id })).toEqual([t.t4]);
    const all = await tripsRepository.list({ offset: 0, pageSize: 1, sort: { field: 'startedAt', dir: 'DESC' } });
    expect(all.total).toBe((await select<{ n: number }>('SELECT COUNT(*) AS n FROM trips'))[0].n);
  });

  it('when the list is sorted by a column, by vehicle or by route, either way, then the order follows it and ties go newest id first', async () => {
    expect(await ids({ sort: { field: 'startedAt', dir: 'DESC' } })).toEqual([t.t4, t.t3, t.t2, t.t1]);
    expect(await ids({ sort: { field: 'distanceKm', dir: 'DESC' } })).toEqual([t.t4, t.t1, t.t2, t.t3]);
    expect(await ids({ sort: { field: 'meanSpeedKmh', dir: 'ASC' } })).toEqual([t.t3, t.t2, t.t1, t.t4]);
    // v1 sorts before v2 and r1 before r2; within one vehicle or route the later id first
    expect(await ids({ sort: { field: 'fleetNumber', dir: 'ASC' } })).toEqual([t.t3, t.t2, t.t4, t.t1]);
    expect(await ids({ sort: { field: 'fleetNumber', dir: 'DESC' } })).toEqual([t.t4, t.t1, t.t3, t.t2]);
    expect(await ids({ sort: { field: 'routeName', dir: 'ASC' } })).toEqual([t.t3, t.t1, t.t4, t.t2]);
    expect(await ids({ sort: { field: 'routeName', dir: 'DESC' } })).toEqual([t.t4, t.t2, t.t3, t.t1]);
  });

  it('when a page is asked for, then it holds that slice and the total of all matches', async () => {
    const page = await list({ offset: 1, pageSize: 2 });
    expect(page.items.map((x) => x.id)).toEqual([t.t2, t.t3]);
    expect(page.total).toBe(4);
  });

  it('when trips are listed, then each carries its vehicle, route and driver by name, its times as ISO instants, its figures and whether the night has processed it', async () => {
    const { items } = await list();
    expect(items[0]).toEqual({
      id: t.t1,
      vehicleId: v2.id,
      fleetNumber: v2.fleet_number,
      routeId: r1.id,
      routeName: r1.name,
      driverId: driver.id,
      driverName: driver.name,
      startedAt: '2024-03-01T08:00:00.000Z',
      endedAt: '2024-03-01T09:00:00.000Z',
      distanceKm: 30,
      meanSpeedKmh: 30,
      payloadKg: 500,
      processed: false,
    });
    expect(items[1]).toMatchObject({ id: t.t2, driverId: null, driverName: null, payloadKg: null, routeName: r2.name, fleetNumber: v1.fleet_number });
    expect(items[2]).toMatchObject({ meanSpeedKmh: 10.5, payloadKg: 0 });
    expect(items[3].processed).toBe(true);
  });
});

describe('recent payloads of a spec', () => {
  it("when a spec's vehicles carried payloads, then the latest positive ones come newest first, up to the limit, without empty or zero loads or another spec's", async () => {
    const day = (d: number) => at(`2027-01-0${d}T08:00:00Z`);
    const end = (d: number) => at(`2027-01-0${d}T09:00:00Z`);
    await tripsRepository.insert(
      [
        trip({ vehicleId: v2.id, startedAt: day(1), endedAt: end(1), payloadKg: 100 }),
        trip({ vehicleId: v2.id, startedAt: day(3), endedAt: end(3), payloadKg: 0 }),
        trip({ vehicleId: v2.id, startedAt: day(4), endedAt: end(4), payloadKg: null }),
        trip({ vehicleId: v2.id, startedAt: day(2), endedAt: end(2), payloadKg: 300.5 }),
        trip({ vehicleId: v1.id, startedAt: day(5), endedAt: end(5), payloadKg: 999 }),
      ],
      null,
    );
    expect(await tripsRepository.recentPayloadsKg(v2.spec_id, 2)).toEqual([300.5, 100]);
    expect(await tripsRepository.recentPayloadsKg(v2.spec_id, 1)).toEqual([300.5]);
    expect(await tripsRepository.recentPayloadsKg(v1.spec_id, 1)).toEqual([999]);
  });
});
