// The trip rules called directly against the demo fleet's database (server/trips/service.ts): the
// row-by-row report of a trip file, the all-or-nothing import with its repeat and overlap checks
// inside the writing transaction, and one trip entered by hand. The routes around them are tested
// through the API in tests/server/trips.test.ts and tests/server/races.test.ts.
import { createHash } from 'node:crypto';
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import { AppError } from '../../../server/errors';
import { TripImport } from '../../../server/db/models';
import { tripsRepository } from '../../../server/trips/repository';
import { MAX_TRIP_ROWS, tripsService } from '../../../server/trips/service';
import { startTestServer, TEST_NOW, type TestServer } from '../../support/server';

let srv: TestServer;
let sq: Sequelize;
/** The demo's first trip of CV-101 (driven by driver@reboundry.test, 2026-10-01 05:43–08:45:02.6 UTC). */
let first: { id: number; vehicle_id: number; driver_id: number; started_at: string; ended_at: string };
/** A driver whose account is deactivated, and their name. */
const DEACTIVATED = 'marta.sokol@reboundry.test';

const HEADER = 'vehicle,route,driver_email,start,end,distance_km,mean_speed_kmh,payload_kg';
const file = (...rows: string[]) => [HEADER, ...rows].join('\n');
/** Hours after 2025-01-01 of the next row's default start: each row of the file its own hour. */
let hour = 0;
/**
 * One row of a trip file; the defaults are a plain 40-minute trip of CV-118 in an hour of its own
 * between 2025-01 and 2026-06 (the demo's trips start on 2026-10-01; the imports below write September 2026).
 */
const row = (o: Partial<Record<'vehicle' | 'route' | 'driver' | 'start' | 'end' | 'km' | 'kmh' | 'kg', string>> = {}) => {
  const start = Date.UTC(2025, 0, 1) + hour++ * 3_600_000;
  const iso = (t: number) => new Date(t).toISOString().replace('.000Z', 'Z');
  return [o.vehicle ?? 'CV-118', o.route ?? 'Tanner Way town loop', o.driver ?? '', o.start ?? iso(start), o.end ?? iso(start + 40 * 60_000), o.km ?? '14', o.kmh ?? '30', o.kg ?? ''].join(',');
};

/** Each row's problems, by row number. */
async function problemsOf(text: string) {
  const { rows } = await tripsService.checkCsv(text, TEST_NOW);
  return Object.fromEntries(rows.map((r) => [r.row, r.problems]));
}

async function refusal(p: Promise<unknown>): Promise<AppError> {
  const e = await p.then(
    () => null,
    (err: unknown) => err,
  );
  expect(e).toBeInstanceOf(AppError);
  return e as AppError;
}

async function counts() {
  const [r] = await sq.query<{ trips: number; imports: number }>('SELECT (SELECT COUNT(*) FROM trips) AS trips, (SELECT COUNT(*) FROM trip_imports) AS imports', { type: QueryTypes.SELECT });
  return r;
}

const sha = (text: string) => createHash('sha256').update(text).digest('hex');

beforeAll(async () => {
  srv = await startTestServer();
  sq = srv.db.sequelize;
  await sq.query('UPDATE users SET active = 0 WHERE email = ?', { replacements: [DEACTIVATED] });
  [first] = await sq.query<typeof first>('SELECT id, vehicle_id, driver_id, started_at, ended_at FROM trips WHERE vehicle_id = 1 ORDER BY started_at LIMIT 1', { type: QueryTypes.SELECT });
}, 120_000);

afterAll(async () => {
  await srv?.stop();
});

afterEach(() => {
  vi.restoreAllMocks();
});

describe('the report of a trip file', () => {
  it('when every row is right, then each row is ok with the trip as read (names as stored, times in ISO, an empty payload or driver as null)', async () => {
    const text = file(
      row({ vehicle: 'cv-118', route: 'tanner way town loop', driver: 'DRIVER@reboundry.test', start: '2026-09-01T06:00:00Z', end: '2026-09-01T06:40:00Z', kg: '420' }),
      row({ vehicle: 'LV-101', route: 'Northgate retail park', start: '2026-09-01T07:00:00+01:00', end: '2026-09-01T07:45:00+01:00', km: '18.5', kmh: '40' }),
    );
    const { rows, candidates } = await tripsService.checkCsv(text, TEST_NOW);
    expect(rows).toEqual([
      {
        row: 2,
        ok: true,
        problems: [],
        trip: { fleetNumber: 'CV-118', routeName: 'Tanner Way town loop', driverEmail: 'DRIVER@reboundry.test', startedAt: '2026-09-01T06:00:00.000Z', endedAt: '2026-09-01T06:40:00.000Z', distanceKm: 14, meanSpeedKmh: 30, payloadKg: 420 },
      },
      {
        row: 3,
        ok: true,
        problems: [],
        trip: { fleetNumber: 'LV-101', routeName: 'Northgate retail park', driverEmail: null, startedAt: '2026-09-01T06:00:00.000Z', endedAt: '2026-09-01T06:45:00.000Z', distanceKm: 18.5, meanSpeedKmh: 40, payloadKg: null },
      },
    ]);
    expect(candidates.map((c) => [c.row, c.vehicleId, c.routeId, c.driverId])).toEqual([
      [2, 18, 1, 4],
      [3, 19, 4, null],
    ]);
  });

  it('when the header is in capitals and the columns in another order without payload_kg, then the rows are read by name', async () => {
    const text = ['MEAN_SPEED_KMH,Distance_km,END,start,driver_email,route,vehicle', '30,14,2026-09-01T06:40:00Z,2026-09-01T06:00:00Z,,Tanner Way town loop,CV-118'].join('\n');
    const { rows } = await tripsService.checkCsv(text, TEST_NOW);
    expect(rows[0]).toMatchObject({ ok: true, problems: [], trip: { fleetNumber: 'CV-118', distanceKm: 14, meanSpeedKmh: 30, payloadKg: null } });
  });

  it('when the vehicle, route or driver is empty, unknown, retired, not a driver or deactivated, then each row says which', async () => {
    const p = await problemsOf(
      file(
        row({ vehicle: '' }),
        row({ vehicle: 'XX-999' }),
        row({ vehicle: 'rt-107' }),
        row({ route: '' }),
        row({ route: 'Nowhere Road' }),
        row({ driver: 'nobody@example.test' }),
        row({ driver: 'manager@reboundry.test' }),
        row({ driver: DEACTIVATED }),
      ),
    );
    expect(p).toEqual({
      2: ['vehicle is empty'],
      3: ['unknown vehicle "XX-999"'],
      4: ['vehicle RT-107 is retired'],
      5: ['route is empty'],
      6: ['unknown route "Nowhere Road"'],
      7: ['unknown driver "nobody@example.test"'],
      8: ['unknown driver "manager@reboundry.test"'],
      9: [`driver ${DEACTIVATED} is deactivated`],
    });
  });

  it('when a row has fewer cells than the header, then it says so and the missing cells are read as empty', async () => {
    const p = await problemsOf(file('CV-118,Tanner Way town loop,,2026-09-01T06:00:00Z,2026-09-01T06:40:00Z,14'));
    expect(p[2]).toEqual(['has 6 columns; the header has 8', 'mean_speed_kmh "" is not a number in km/h']);
  });

  it('when the times are not real ISO 8601 date-times, then the row names each and no speed or overlap check is made', async () => {
    const p = await problemsOf(file(row({ start: '2026-09-31T06:00:00Z' }), row({ end: 'tomorrow' }), row({ start: '', end: '' })));
    expect(p).toEqual({
      2: ['start "2026-09-31T06:00:00Z" is not a real ISO 8601 date-time (e.g. 2026-11-02T07:30:00Z)'],
      3: ['end "tomorrow" is not a real ISO 8601 date-time'],
      4: ['start "" is not a real ISO 8601 date-time (e.g. 2026-11-02T07:30:00Z)', 'end "" is not a real ISO 8601 date-time'],
    });
  });

  it('when numbers are written in plain decimals, then they are read; anything else is not a number', async () => {
    const p = await problemsOf(
      file(
        row({ km: '12.50', kmh: '+30', kg: '.5' }),
        row({ km: '123', kmh: '200.', kg: '1200', start: '2026-09-01T03:00:00Z', end: '2026-09-01T06:40:00Z' }),
        row({ km: '12abc' }),
        row({ km: 'abc12' }),
        row({ km: '1e1' }),
        row({ km: '' }),
        row({ kmh: '3 0' }),
        row({ kg: 'heavy' }),
        row({ km: '.' }),
      ),
    );
    expect(p).toEqual({
      2: [],
      3: ['impossible speed: mean_speed_kmh 200 km/h is outside 1–130 km/h'],
      4: ['distance_km "12abc" is not a number in km'],
      5: ['distance_km "abc12" is not a number in km'],
      6: ['distance_km "1e1" is not a number in km'],
      7: ['distance_km "" is not a number in km'],
      8: ['mean_speed_kmh "3 0" is not a number in km/h'],
      9: ['payload_kg "heavy" is not a number in kg'],
      10: ['distance_km "." is not a number in km'],
    });
  });

  it('when numbers lie on their limits, then they are taken; just outside, then the row names the limits', async () => {
    // 0.1 km in 40 min and 2000 km in 24 h are believable; the mean speeds are set to fit
    const day = { start: '2026-09-02T00:00:00Z', end: '2026-09-03T00:00:00Z' };
    const p = await problemsOf(
      file(
        row({ km: '0.1', kmh: '1', kg: '0' }),
        row({ ...day, vehicle: 'LV-101', km: '2000', kmh: '90', kg: '40000' }),
        row({ km: '0.09' }),
        row({ ...day, vehicle: 'LV-104', km: '2000.5', kmh: '90' }),
        row({ km: '-5' }),
        row({ kmh: '0.9' }),
        row({ kmh: '130.1' }),
        row({ kg: '-1' }),
        row({ kg: '40000.5' }),
      ),
    );
    expect(p).toEqual({
      2: [],
      3: [],
      4: ['distance_km 0.09 km is outside 0.1–2000 km'],
      5: ['distance_km 2000.5 km is outside 0.1–2000 km'],
      6: ['distance_km -5 km is outside 0.1–2000 km'],
      7: ['impossible speed: mean_speed_kmh 0.9 km/h is outside 1–130 km/h'],
      8: ['impossible speed: mean_speed_kmh 130.1 km/h is outside 1–130 km/h'],
      9: ['payload_kg -1 kg is outside 0–40000 kg'],
      10: ['payload_kg 40000.5 kg is outside 0–40000 kg'],
    });
  });

  it('when a trip ends at or before its start, or lasts over 24 h, then the row says so; exactly 24 h is taken', async () => {
    const p = await problemsOf(
      file(
        row({ start: '2026-09-01T06:00:00Z', end: '2026-09-01T06:00:00Z' }),
        row({ start: '2026-09-01T06:00:00Z', end: '2026-09-01T05:00:00Z' }),
        row({ vehicle: 'LV-101', start: '2026-09-01T00:00:00Z', end: '2026-09-02T00:00:00Z', km: '100', kmh: '5' }),
        row({ vehicle: 'LV-104', start: '2026-09-01T00:00:00Z', end: '2026-09-02T01:30:00Z', km: '100', kmh: '5' }),
      ),
    );
    expect(p).toEqual({
      2: ['end must be after start'],
      3: ['end must be after start'],
      4: [],
      5: ['the trip lasts 25 h 30 min; at most 24 h'],
    });
  });

  it('when a trip starts after now, then it is in the future; starting right now is not', async () => {
    const now = TEST_NOW.toISOString();
    const p = await problemsOf(
      file(row({ start: now, end: '2026-11-30T12:40:00Z' }), row({ vehicle: 'LV-101', start: '2026-11-30T12:00:01Z', end: '2026-11-30T12:40:00Z' })),
    );
    expect(p).toEqual({ 2: [], 3: ['start is in the future'] });
  });

  it('when the distance needs more than 130 km/h, or more than the mean speed allows (5 % leeway), then the speed is impossible; on the limits it is not', async () => {
    const oneHour = { start: '2026-09-01T06:00:00Z', end: '2026-09-01T07:00:00Z' };
    const p = await problemsOf(
      file(
        row({ ...oneHour, vehicle: 'CV-118', km: '130', kmh: '130' }),
        row({ ...oneHour, vehicle: 'LV-101', km: '131', kmh: '130' }),
        row({ ...oneHour, vehicle: 'LV-104', km: '100', kmh: '95' }),
        row({ ...oneHour, vehicle: 'LV-110', km: '100', kmh: '94.9' }),
        row({ ...oneHour, vehicle: 'CV-101', km: '100', kmh: 'fast' }),
        row({ ...oneHour, vehicle: 'CV-102', start: '2026-09-01T06:00:00Z', end: '2026-09-01T06:00:00Z', km: '100', kmh: '95' }),
      ),
    );
    expect(p).toEqual({
      2: [],
      3: ['impossible speed: 131 km in 1 h 0 min is 131 km/h (over 130 km/h)'],
      4: [],
      5: ['impossible speed: a mean speed of 94.9 km/h cannot cover 100 km in 1 h 0 min (needs at least 100.0 km/h)'],
      6: ['mean_speed_kmh "fast" is not a number in km/h'],
      7: ['end must be after start'],
    });
  });

  it('when rows of one vehicle overlap in the file, then each later row names the earlier ones in row order; back to back is not an overlap', async () => {
    const at = (start: string, end: string, vehicle = 'CV-118') => row({ vehicle, start: `2026-09-01T${start}:00Z`, end: `2026-09-01T${end}:00Z`, km: '5', kmh: '40' });
    const p = await problemsOf(
      file(
        at('08:00', '09:00'), // 2
        at('07:30', '08:10'), // 3: starts first, overlaps 2
        at('08:05', '08:30'), // 4: overlaps 2 and 3
        at('09:00', '09:40'), // 5: starts as 2 ends
        at('08:20', '08:20'), // 6: no length, inside 2
        at('08:00', '09:00', 'LV-101'), // 7: another vehicle
      ),
    );
    expect(p).toEqual({
      2: [],
      3: ['overlaps row 2 (same vehicle)'],
      4: ['overlaps row 2 (same vehicle)', 'overlaps row 3 (same vehicle)'],
      5: [],
      6: ['end must be after start'],
      7: [],
    });
  });

  it('when rows of one driver overlap on other vehicles, then the later row says so once (same vehicle wins); rows without a driver or a known vehicle are compared fairly', async () => {
    const at = (vehicle: string, driver: string, start: string, end: string) => row({ vehicle, driver, start: `2026-09-01T${start}:00Z`, end: `2026-09-01T${end}:00Z`, km: '5', kmh: '40' });
    const p = await problemsOf(
      file(
        at('CV-118', 'driver@reboundry.test', '08:00', '09:00'), // 2
        at('LV-101', 'driver@reboundry.test', '08:30', '09:30'), // 3: same driver, other vehicle
        at('CV-118', 'driver@reboundry.test', '08:45', '08:55'), // 4: same vehicle and driver as 2
        at('LV-104', '', '08:00', '09:00'), // 5, 6: no driver, other vehicles
        at('LV-110', '', '08:00', '09:00'),
        at('XX-1', 'sade.ojo@reboundry.test', '10:00', '11:00'), // 7, 8: unknown vehicles, one driver
        at('XX-2', 'sade.ojo@reboundry.test', '10:30', '11:30'),
        at('RT-107', '', '12:00', '13:00'), // 9, 10: the retired vehicle twice
        at('RT-107', '', '12:30', '13:30'),
      ),
    );
    expect(p).toEqual({
      2: [],
      3: ['overlaps row 2 (same driver)'],
      4: ['overlaps row 2 (same vehicle)', 'overlaps row 3 (same driver)'],
      5: [],
      6: [],
      7: ['unknown vehicle "XX-1"'],
      8: ['unknown vehicle "XX-2"', 'overlaps row 7 (same driver)'],
      9: ['vehicle RT-107 is retired'],
      10: ['vehicle RT-107 is retired'],
    });
  });

  it('when rows overlap stored trips of their vehicle or driver, then they name the trip and its times; touching it or another vehicle and driver is no overlap', async () => {
    const s = new Date(first.started_at.replace(' +00:00', 'Z').replace(' ', 'T'));
    const e = new Date(first.ended_at.replace(' +00:00', 'Z').replace(' ', 'T'));
    const iso = (d: Date) => d.toISOString();
    const plus = (d: Date, min: number) => new Date(d.getTime() + min * 60_000);
    const span = (o: Parameters<typeof row>[0]) => row({ km: '10', kmh: '25', ...o });
    const p = await problemsOf(
      file(
        span({ vehicle: 'CV-101', start: iso(plus(s, 30)), end: iso(plus(s, 60)) }), // 2: same vehicle
        span({ vehicle: 'CV-118', driver: 'driver@reboundry.test', start: iso(plus(e, -30)), end: iso(plus(e, 30)) }), // 3: same driver
        span({ vehicle: 'CV-101', start: iso(plus(s, -30)), end: iso(s) }), // 4: ends as it starts
        span({ vehicle: 'CV-101', start: iso(e), end: iso(plus(e, 30)) }), // 5: starts as it ends
        span({ vehicle: 'LV-101', driver: 'sade.ojo@reboundry.test', start: iso(plus(s, 30)), end: iso(plus(s, 60)) }), // 6: neither
        span({ vehicle: 'XX-1', driver: 'driver@reboundry.test', start: iso(plus(s, -120)), end: iso(plus(e, 120)) }), // 7: unknown vehicle, same driver
        // 8: a second stored trip of CV-101 the next day, so the file spans both
        span({ vehicle: 'CV-101', start: '2026-10-02T06:00:00Z', end: '2026-10-02T06:30:00Z', km: '5' }),
      ),
    );
    const [second] = await sq.query<{ id: number; started_at: string; ended_at: string }>("SELECT id, started_at, ended_at FROM trips WHERE vehicle_id = 1 AND started_at LIKE '2026-10-02%'", { type: QueryTypes.SELECT });
    const span1 = `${first.started_at.slice(0, 16)}–${first.ended_at.slice(0, 16)} UTC`;
    expect(p).toEqual({
      2: [`overlaps trip #${first.id} of the same vehicle (${span1})`],
      3: [`overlaps trip #${first.id} of the same driver (${span1})`],
      4: [],
      5: [],
      6: [],
      // stored overlaps first, then the rows of the file
      7: ['unknown vehicle "XX-1"', `overlaps trip #${first.id} of the same driver (${span1})`, 'overlaps row 3 (same driver)'],
      8: [`overlaps trip #${second.id} of the same vehicle (${second.started_at.slice(0, 16)}–${second.ended_at.slice(0, 16)} UTC)`],
    });
  });

  it("when a row's driver drove another vehicle at the time and no other row names that vehicle, then the stored trip is still found by the driver", async () => {
    const [other] = await sq.query<{ id: number; started_at: string; ended_at: string }>(
      "SELECT id, started_at, ended_at FROM trips WHERE driver_id = 4 AND vehicle_id != 18 AND started_at LIKE '2026-10-01 14%'",
      { type: QueryTypes.SELECT },
    );
    const p = await problemsOf(file(row({ vehicle: 'CV-118', driver: 'driver@reboundry.test', start: '2026-10-01T15:00:00Z', end: '2026-10-01T16:00:00Z', km: '10', kmh: '25' })));
    expect(p).toEqual({ 2: [`overlaps trip #${other.id} of the same driver (${other.started_at.slice(0, 16)}–${other.ended_at.slice(0, 16)} UTC)`] });
  });

  it('when the file is not CSV, then it is refused naming the line', async () => {
    const e = await refusal(tripsService.checkCsv(file(row(), 'CV-118,"Tanner Way,,,,,,'), TEST_NOW));
    expect([e.status, e.message]).toEqual([400, 'The trip file is not valid CSV.']);
    expect(e.fields).toEqual({ 'row 3': 'a quoted cell is never closed (a " without its closing ")' });
  });

  it('when the header misses or adds columns, then it is refused naming them and the expected header', async () => {
    const expected = `expected: ${HEADER}`;
    const both = await refusal(tripsService.checkCsv(['# trips', 'vehicle,route,start,end,distance_km,mean_speed_kmh,odometer', row()].join('\n'), TEST_NOW));
    expect([both.status, both.message]).toEqual([400, "The trip file's header is not right (row 2)."]);
    expect(both.fields).toEqual({ 'row 2': `missing column(s): driver_email; unknown column(s): odometer; ${expected}` });
    const missing = await refusal(tripsService.checkCsv('vehicle,route\nCV-118,Tanner Way town loop', TEST_NOW));
    expect(missing.fields).toEqual({ 'row 1': `missing column(s): driver_email, start, end, distance_km, mean_speed_kmh; ${expected}` });
    const unknown = await refusal(tripsService.checkCsv(`${HEADER},notes\n${row()}`, TEST_NOW));
    expect(unknown.fields).toEqual({ 'row 1': `unknown column(s): notes; ${expected}` });
  });

  it('when the file is empty or has only the header, then it is refused saying so', async () => {
    const empty = await refusal(tripsService.checkCsv('\n\n', TEST_NOW));
    expect([empty.status, empty.message, empty.fields]).toEqual([400, 'The trip file is empty.', { file: `needs the header ${HEADER} and one row per trip` }]);
    const header = await refusal(tripsService.checkCsv(`\n${HEADER}\n`, TEST_NOW));
    expect([header.status, header.message, header.fields]).toEqual([400, 'The trip file has no trips.', { file: 'has a header (row 2) but no rows' }]);
  });

  it(`when a file has ${MAX_TRIP_ROWS} trips, then it is read; one more is refused at that row`, async () => {
    const line = row({ vehicle: 'XX-1' });
    const full = file(...Array.from({ length: MAX_TRIP_ROWS }, () => line));
    expect((await tripsService.checkCsv(full, TEST_NOW)).rows).toHaveLength(MAX_TRIP_ROWS);
    const e = await refusal(tripsService.checkCsv(`${full}\n${line}`, TEST_NOW));
    expect([e.status, e.message, e.fields]).toEqual([400, `The file has more than ${MAX_TRIP_ROWS} trips.`, { [`row ${MAX_TRIP_ROWS + 2}`]: `more than ${MAX_TRIP_ROWS} trips in one file; split it` }]);
  });
});

describe('importing a trip file', () => {
  it('when every row is right, then each trip is stored with the import row (name, who, when, hash, count)', async () => {
    const text = file(
      row({ vehicle: 'CV-118', driver: 'driver@reboundry.test', start: '2026-09-10T06:00:00Z', end: '2026-09-10T06:40:00Z', kg: '420' }),
      row({ vehicle: 'LV-101', route: 'Northgate retail park', start: '2026-09-10T07:00:00Z', end: '2026-09-10T07:45:00Z', km: '18.5', kmh: '40' }),
    );
    const before = await counts();
    const out = await tripsService.importCsv(text, 'september.csv', 1, TEST_NOW);
    expect(out.imported).toBe(2);
    expect(out.rows.map((r) => r.ok)).toEqual([true, true]);
    expect(await counts()).toEqual({ trips: before.trips + 2, imports: before.imports + 1 });
    const [imp] = await sq.query('SELECT original_name, row_count, imported_by_id, imported_at, file_sha256 FROM trip_imports WHERE id = ?', { replacements: [out.importId], type: QueryTypes.SELECT });
    expect(imp).toEqual({ original_name: 'september.csv', row_count: 2, imported_by_id: 1, imported_at: '2026-11-30 12:00:00.000 +00:00', file_sha256: sha(text) });
    const trips = await sq.query('SELECT vehicle_id, route_id, driver_id, started_at, ended_at, distance_km, mean_speed_kmh, payload_kg FROM trips WHERE import_id = ? ORDER BY id', { replacements: [out.importId], type: QueryTypes.SELECT });
    expect(trips).toEqual([
      { vehicle_id: 18, route_id: 1, driver_id: 4, started_at: '2026-09-10 06:00:00.000 +00:00', ended_at: '2026-09-10 06:40:00.000 +00:00', distance_km: 14, mean_speed_kmh: 30, payload_kg: 420 },
      { vehicle_id: 19, route_id: 4, driver_id: null, started_at: '2026-09-10 07:00:00.000 +00:00', ended_at: '2026-09-10 07:45:00.000 +00:00', distance_km: 18.5, mean_speed_kmh: 40, payload_kg: null },
    ]);
  });

  it('when the same file comes again, then it is refused naming the earlier import and nothing is stored', async () => {
    const text = file(row({ start: '2026-09-11T06:00:00Z', end: '2026-09-11T06:40:00Z' }));
    const { importId } = await tripsService.importCsv(text, '', 1, TEST_NOW);
    const [imp] = await sq.query<{ original_name: string }>('SELECT original_name FROM trip_imports WHERE id = ?', { replacements: [importId], type: QueryTypes.SELECT });
    expect(imp.original_name).toBe('trips.csv');
    const before = await counts();
    const e = await refusal(tripsService.importCsv(text, 'again.csv', 1, TEST_NOW));
    expect([e.status, e.code, e.message, e.fields]).toEqual([
      409,
      'conflict',
      `This file was already imported (import #${importId} of 2026-11-30, 1 trips); nothing was imported again.`,
      { file: `is the same file as import #${importId}` },
    ]);
    expect(await counts()).toEqual(before);
  });

  it('when a file name is longer than 255 characters, then the first 255 are kept', async () => {
    const name = `${'n'.repeat(260)}.csv`;
    const { importId } = await tripsService.importCsv(file(row({ start: '2026-09-12T06:00:00Z', end: '2026-09-12T06:40:00Z' })), name, 1, TEST_NOW);
    const [imp] = await sq.query<{ original_name: string }>('SELECT original_name FROM trip_imports WHERE id = ?', { replacements: [importId], type: QueryTypes.SELECT });
    expect(imp.original_name).toBe(name.slice(0, 255));
  });

  it('when some rows have problems, then nothing is stored and the refusal names each bad row with its problems', async () => {
    const text = file(
      row({ start: '2026-09-13T06:00:00Z', end: '2026-09-13T06:40:00Z' }),
      row({ vehicle: 'XX-1', route: 'Nowhere', start: '2026-09-13T06:00:00Z', end: '2026-09-13T06:40:00Z' }),
      row({ vehicle: 'LV-101', start: '2026-09-13T06:00:00Z', end: '2026-09-13T06:40:00Z', km: 'x' }),
    );
    const before = await counts();
    const e = await refusal(tripsService.importCsv(text, 'bad.csv', 1, TEST_NOW));
    expect([e.status, e.code, e.message]).toEqual([400, 'import_rejected', '2 of 3 rows have problems, so nothing was imported. Fix them and import the file again.']);
    expect(e.fields).toEqual({ 'row 3': 'unknown vehicle "XX-1"; unknown route "Nowhere"', 'row 4': 'distance_km "x" is not a number in km' });
    expect(await counts()).toEqual(before);
  });

  it('when more than 200 rows have problems, then the refusal counts them all and names the first 200', async () => {
    const e = await refusal(tripsService.importCsv(file(...Array.from({ length: 201 }, () => row({ vehicle: 'XX-1' }))), 'bad.csv', 1, TEST_NOW));
    expect(e.message).toBe('201 of 201 rows have problems, so nothing was imported. Fix them and import the file again.');
    expect(Object.keys(e.fields!)).toHaveLength(200);
    expect(e.fields!['row 201']).toBe('unknown vehicle "XX-1"');
    expect(e.fields!['row 202']).toBeUndefined();
  });

  it('when a trip overlapping a row is stored between the check and the write, then the writing transaction refuses the file naming that row only', async () => {
    const text = file(row({ start: '2026-09-14T06:00:00Z', end: '2026-09-14T06:40:00Z' }), row({ vehicle: 'LV-101', start: '2026-09-14T06:00:00Z', end: '2026-09-14T06:40:00Z' }));
    const insert = tripsRepository.insert;
    let meanwhile = 0;
    vi.spyOn(tripsRepository, 'insert').mockImplementationOnce(async (trips, meta, check) => {
      [meanwhile] = (await insert([{ vehicleId: 18, routeId: 1, driverId: null, startedAt: new Date('2026-09-14T06:30:00Z'), endedAt: new Date('2026-09-14T07:00:00Z'), distanceKm: 10, meanSpeedKmh: 30, payloadKg: null }], null)).ids;
      return insert(trips, meta, check);
    });
    const before = await counts();
    const e = await refusal(tripsService.importCsv(text, 'race.csv', 1, TEST_NOW));
    expect([e.status, e.code, e.message]).toEqual([400, 'import_rejected', 'Trips were stored meanwhile that overlap rows of this file, so nothing was imported. Check the rows named and import again.']);
    expect(e.fields).toEqual({ 'row 2': `overlaps trip #${meanwhile} of the same vehicle (2026-09-14 06:30–2026-09-14 07:00 UTC)` });
    expect(await counts()).toEqual({ trips: before.trips + 1, imports: before.imports });
  });

  it('when the same file is imported between the check and the write, then the writing transaction refuses it as a repeat', async () => {
    const text = file(row({ start: '2026-09-15T06:00:00Z', end: '2026-09-15T06:40:00Z' }));
    const insert = tripsRepository.insert;
    let other = 0;
    vi.spyOn(tripsRepository, 'insert').mockImplementationOnce(async (trips, meta, check) => {
      other = (await TripImport.create({ originalName: 'other.csv', rowCount: 7, importedById: 1, importedAt: new Date('2026-11-29T10:00:00Z'), fileSha256: sha(text) })).id;
      return insert(trips, meta, check);
    });
    const before = await counts();
    const e = await refusal(tripsService.importCsv(text, 'race.csv', 1, TEST_NOW));
    expect([e.status, e.message]).toEqual([409, `This file was already imported (import #${other} of 2026-11-29, 7 trips); nothing was imported again.`]);
    expect(await counts()).toEqual({ trips: before.trips, imports: before.imports + 1 });
  });
});

describe('one trip entered by hand', () => {
  const trip = (o: Partial<Parameters<typeof tripsService.createOne>[0]> = {}) => ({
    vehicleId: 18,
    routeId: 1,
    driverId: null,
    startedAt: '2026-09-20T06:00:00Z',
    endedAt: '2026-09-20T06:40:00Z',
    distanceKm: 14,
    meanSpeedKmh: 30,
    payloadKg: null,
    ...o,
  });

  it('when it is right, then it is stored as given and its id returned', async () => {
    const id = await tripsService.createOne(trip({ driverId: 4, payloadKg: 300 }), TEST_NOW);
    const [t] = await sq.query('SELECT vehicle_id, route_id, driver_id, started_at, ended_at, distance_km, mean_speed_kmh, payload_kg, import_id FROM trips WHERE id = ?', { replacements: [id], type: QueryTypes.SELECT });
    expect(t).toEqual({ vehicle_id: 18, route_id: 1, driver_id: 4, started_at: '2026-09-20 06:00:00.000 +00:00', ended_at: '2026-09-20 06:40:00.000 +00:00', distance_km: 14, mean_speed_kmh: 30, payload_kg: 300, import_id: null });
  });

  it('when the vehicle, route, driver or times are not valid, then each field says why and nothing is stored', async () => {
    const before = await counts();
    const [marta] = await sq.query<{ id: number; name: string }>('SELECT id, name FROM users WHERE email = ?', { replacements: [DEACTIVATED], type: QueryTypes.SELECT });
    const all = await refusal(tripsService.createOne(trip({ vehicleId: 999, routeId: 999, driverId: 1, startedAt: 'soon', endedAt: '2026-02-30T06:00:00Z' }), TEST_NOW));
    expect([all.status, all.message, all.fields]).toEqual([
      400,
      'Some values are not valid.',
      {
        vehicleId: 'unknown vehicle id 999',
        routeId: 'unknown route id 999',
        driverId: 'unknown driver id 1',
        startedAt: 'must be a real ISO 8601 date-time (e.g. 2026-11-02T07:30:00Z)',
        endedAt: 'must be a real ISO 8601 date-time (e.g. 2026-11-02T07:30:00Z)',
      },
    ]);
    const retired = await refusal(tripsService.createOne(trip({ vehicleId: 41, driverId: marta.id }), TEST_NOW));
    expect(retired.fields).toEqual({ vehicleId: 'vehicle RT-107 is retired', driverId: `${marta.name}'s account is deactivated` });
    const noDriver = await refusal(tripsService.createOne(trip({ driverId: 999 }), TEST_NOW));
    expect(noDriver.fields).toEqual({ driverId: 'unknown driver id 999' });
    expect(await counts()).toEqual(before);
  });

  it('when the trip breaks a rule, then each problem lands on its field (speed, end, start) and nothing is stored', async () => {
    const before = await counts();
    const fast = await refusal(tripsService.createOne(trip({ distanceKm: 100, startedAt: '2026-09-19T06:00:00Z', endedAt: '2026-09-19T06:40:00Z' }), TEST_NOW));
    expect([fast.status, fast.message, fast.fields]).toEqual([400, 'The trip was not saved.', { meanSpeedKmh: 'impossible speed: 100 km in 0 h 40 min is 150 km/h (over 130 km/h)' }]);
    const backwards = await refusal(tripsService.createOne(trip({ startedAt: '2026-12-01T08:00:00Z', endedAt: '2026-12-01T07:00:00Z' }), TEST_NOW));
    expect(backwards.fields).toEqual({ endedAt: 'end must be after start', startedAt: 'start is in the future' });
    const long = await refusal(tripsService.createOne(trip({ startedAt: '2026-09-17T06:00:00Z', endedAt: '2026-09-18T07:00:00Z', distanceKm: 100, meanSpeedKmh: 5 }), TEST_NOW));
    expect(long.fields).toEqual({ endedAt: 'the trip lasts 25 h 0 min; at most 24 h' });
    expect(await counts()).toEqual(before);
  });

  it('when it overlaps two stored trips, then both are named on the start, in the order they were stored', async () => {
    const a = await tripsService.createOne(trip({ vehicleId: 19, startedAt: '2026-09-21T08:00:00Z', endedAt: '2026-09-21T09:00:00Z' }), TEST_NOW);
    const b = await tripsService.createOne(trip({ vehicleId: 19, startedAt: '2026-09-21T09:00:00Z', endedAt: '2026-09-21T10:00:00Z' }), TEST_NOW);
    const e = await refusal(tripsService.createOne(trip({ vehicleId: 19, startedAt: '2026-09-21T08:30:00Z', endedAt: '2026-09-21T09:30:00Z' }), TEST_NOW));
    expect(e.fields).toEqual({
      startedAt: `overlaps trip #${a} of the same vehicle (2026-09-21 08:00–2026-09-21 09:00 UTC); overlaps trip #${b} of the same vehicle (2026-09-21 09:00–2026-09-21 10:00 UTC)`,
    });
  });

  it('when an overlapping trip is stored between the check and the write, then the writing transaction refuses it on the start', async () => {
    const insert = tripsRepository.insert;
    let meanwhile = 0;
    vi.spyOn(tripsRepository, 'insert').mockImplementationOnce(async (trips, meta, check) => {
      [meanwhile] = (await insert([{ ...trips[0], driverId: null, vehicleId: 22 }], null)).ids;
      return insert(trips, meta, check);
    });
    const before = await counts();
    const e = await refusal(tripsService.createOne(trip({ vehicleId: 22, startedAt: '2026-09-22T06:00:00Z', endedAt: '2026-09-22T06:40:00Z' }), TEST_NOW));
    expect([e.status, e.message, e.fields]).toEqual([400, 'The trip was not saved.', { startedAt: `overlaps trip #${meanwhile} of the same vehicle (2026-09-22 06:00–2026-09-22 06:40 UTC)` }]);
    expect(await counts()).toEqual({ trips: before.trips + 1, imports: before.imports });
  });
});
