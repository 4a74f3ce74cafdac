// The row-by-row report of a trip file (server/trips/service.ts, checkCsv), called directly against
// the demo fleet's database. The import that stores a file is in service.test.ts; the routes
// around them are tested through the API in tests/server/trips.test.ts and tests/server/races.test.ts.
import { describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { MAX_TRIP_ROWS, tripsService } from '../../../server/trips/service';
import { TEST_NOW } from '../../support/server';
import { DEACTIVATED, HEADER, file, problemsOf, refusal, row, tripRulesFixture } from './trip-file';

const { sq, first } = tripRulesFixture();

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
    const [second] = await sq.query<{ id: number; started_at: string; ended_at: string }>("SELECT id, started_at, ended_at FROM trips WHERE vehicle_id = 1 AND started_at >= ? AND started_at < ?", { replacements: ['2026-10-02 00:00:00.000 +00:00', '2026-10-03 00:00:00.000 +00:00'], type: QueryTypes.SELECT });
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
      'SELECT id, started_at, ended_at FROM trips WHERE driver_id = 4 AND vehicle_id != 18 AND started_at >= ? AND started_at < ?',
      { replacements: ['2026-10-01 14:00:00.000 +00:00', '2026-10-01 15:00:00.000 +00:00'], type: QueryTypes.SELECT },
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
