// The trip rules that store, called directly against the demo fleet's database (server/trips/service.ts):
// the all-or-nothing import with its repeat and overlap checks inside the writing transaction, and one
// trip entered by hand. The row-by-row report of a file is in file-report.test.ts; the routes around
// them are tested through the API in tests/server/trips.test.ts and tests/server/races.test.ts.
import { createHash } from 'node:crypto';
import { describe, expect, it, vi } from 'vitest';
import { QueryTypes } from 'sequelize';
import { TripImport } from '../../../server/db/models';
import { tripsRepository } from '../../../server/trips/repository';
import { tripsService } from '../../../server/trips/service';
import { TEST_NOW } from '../../support/server';
import { DEACTIVATED, file, refusal, row, tripRulesFixture } from './trip-file';

const { sq, counts } = tripRulesFixture();
const sha = (text: string) => createHash('sha256').update(text).digest('hex');

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
