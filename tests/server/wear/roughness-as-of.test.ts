import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { roughnessOnDay, routeVersions, segmentsOnDay, type SegmentBase } from '../../../server/wear/roughness-as-of';
import { computeVehicleDuty, DutyCache, type RouteInput, type TripInput } from '../../../server/wear/duty';
import { localDay, sqlDate, wearRepository } from '../../../server/wear/repository';
import { gdForClass } from '../../../server/physics/iso8608';
import { roadsService } from '../../../server/roads/service';
import { run } from '../../../jobs/nightly';
import { sqlFor } from '../../../server/db/dialect';
import { startTestServer, TEST_NOW, type TestServer } from '../../support/server';
import type { ObservationValue } from '../../../server/roads/current-roughness';

const gd = (c: string) => gdForClass(c);
const obs = (id: number, source: ObservationValue['source'], observedOn: string, cls: string, surveyId: number | null = null): ObservationValue => ({ id, source, observedOn, gdN0: gd(cls), iri: null, isoClass: cls, surveyId });

describe('the roughness in force on a day (docs/methods.md, "Roughness as of the trip\'s day")', () => {
  const history = [obs(1, 'stated', '2026-01-10', 'B'), obs(2, 'survey', '2026-06-01', 'D', 7), obs(3, 'driver_report', '2026-07-01', 'F')];

  it('when the day is between observations, then the newest one dated on or before it holds', () => {
    expect(roughnessOnDay(history, '2026-03-01')).toMatchObject({ isoClass: 'B', source: 'stated', assumedFromLater: false });
    // on the survey's own day the survey holds, with its profile
    expect(roughnessOnDay(history, '2026-06-01')).toMatchObject({ isoClass: 'D', source: 'survey', surveyId: 7 });
  });

  it('when a report follows the survey, then from its day on it is blended in by the current-value rule (computed: ln Gd = (ln 1024 + 0.5 ln 16384)/1.5 → Gd = 2580e-6, class E)', () => {
    const v = roughnessOnDay(history, '2026-08-01')!;
    expect(v.gdN0).toBeCloseTo(Math.exp((Math.log(gd('D')) + 0.5 * Math.log(gd('F'))) / 1.5), 12);
    expect(v.gdN0! / 1e-6).toBeCloseTo(2580.3, 0);
    expect(v).toMatchObject({ isoClass: 'E', source: 'driver_report', blendedReports: 1 });
  });

  it('when the day is before every observation, then the earliest one is taken and marked as an assumption', () => {
    expect(roughnessOnDay(history, '2025-12-31')).toMatchObject({ isoClass: 'B', assumedFromLater: true });
    // two observations on the first day: the rule picks among them (a survey beats a hand-set value)
    expect(roughnessOnDay([obs(5, 'survey', '2026-02-01', 'C', 3), obs(4, 'stated', '2026-02-01', 'A'), obs(6, 'stated', '2026-03-01', 'E')], '2026-01-01')).toMatchObject({ isoClass: 'C', surveyId: 3 });
    expect(roughnessOnDay([], '2026-01-01')).toBeNull();
  });

  it('when a route has later observations, then it gets one version per day that changes something, and a trip day picks the last version begun', () => {
    const segs: SegmentBase[] = [0, 1, 2].map((i) => ({ id: i + 1, startM: i * 100, endM: (i + 1) * 100, speedKmh: null, gdN0: gd('H'), surveyId: null }));
    const hist = new Map<number, ObservationValue[]>([
      [1, [obs(1, 'stated', '2026-01-01', 'B'), obs(4, 'stated', '2026-05-01', 'D')]],
      [2, [obs(2, 'stated', '2026-01-01', 'B'), obs(5, 'stated', '2026-05-01', 'B')]], // same value again: no change
      [3, [obs(3, 'stated', '2026-03-01', 'C')]],
    ]);
    const v = routeVersions(segs, hist, '2026-02-01', '2026-12-31');
    // segment 3 has nothing by 1 Feb: its earliest (class C, from 1 March) is assumed
    expect(v.segments.map((s) => s.gdN0)).toEqual([gd('B'), gd('B'), gd('C')]);
    // 1 March changes nothing for segment 3 (already assumed C); 1 May changes segment 1 only
    expect(v.later.map((x) => x.from)).toEqual(['2026-05-01']);
    expect(v.later[0].segments[0].gdN0).toBe(gd('D'));
    expect(v.later[0].segments[1]).toBe(v.segments[1]);
    const route = { id: 1, lengthM: 300, ...v };
    expect(segmentsOnDay(route, '2026-04-30')[0].gdN0).toBe(gd('B'));
    expect(segmentsOnDay(route, '2026-05-01')[0].gdN0).toBe(gd('D'));
    // a segment with no observations keeps its stored value
    expect(routeVersions(segs, new Map(), '2026-01-01', '2026-12-31').segments[0].gdN0).toBe(gd('H'));
  });
});

describe('the nightly duty on the roughness of the trip\'s day (demo fleet)', () => {
  let S: TestServer;
  const q = <T extends object>(sql: string, replacements: unknown[] = []) => S.db.sequelize.query<T>(sql, { replacements, type: QueryTypes.SELECT });
  const nightly = async () => {
    const r = await run({ db: S.db, config: S.config, log: S.log, mailer: S.mailer, now: TEST_NOW, trigger: 'test' });
    expect(r.status, JSON.stringify(r.errors.slice(0, 3))).toBe('succeeded');
    return r;
  };
  const dutyOf = (tripId: number) => q<{ position: string; energy_j: number; spring_damage: number; profiled_segments: number }>(`SELECT position, energy_j, spring_damage, profiled_segments FROM trip_duties WHERE trip_id = ? ORDER BY position`, [tripId]);

  beforeAll(async () => {
    // the demo fleet after one nightly run
    S = await startTestServer({ afterNightly: true });
  }, 240_000);
  afterAll(() => S?.stop());

  it('when a route was surveyed during the trip records, then trips before the survey day use the older stated class and trips from it on the measured profile', async () => {
    const rows = await q<{ route_id: number; surveyed_on: string; before: number; after: number; profiled_before: number; profiled_after: number }>(
      `SELECT t.route_id, s.surveyed_on,
              SUM(CASE WHEN td.trip_date < s.surveyed_on THEN 1 ELSE 0 END) AS before, SUM(CASE WHEN td.trip_date >= s.surveyed_on THEN 1 ELSE 0 END) AS after,
              SUM(CASE WHEN td.trip_date < s.surveyed_on THEN td.profiled_segments ELSE 0 END) AS profiled_before,
              MIN(CASE WHEN td.trip_date >= s.surveyed_on THEN td.profiled_segments END) AS profiled_after
       FROM trip_duties td JOIN trips t ON t.id = td.trip_id JOIN road_surveys s ON s.route_id = t.route_id
       GROUP BY t.route_id, s.id HAVING MIN(td.trip_date) < s.surveyed_on AND MAX(td.trip_date) >= s.surveyed_on`,
    );
    expect(rows.length, 'the demo has a route surveyed inside the trip records').toBeGreaterThan(0);
    for (const r of rows) {
      expect(Number(r.profiled_before), `route ${r.route_id} before ${r.surveyed_on}`).toBe(0);
      expect(Number(r.profiled_after), `route ${r.route_id} from ${r.surveyed_on}`).toBeGreaterThan(0);
    }
  });

  it('when a rougher class is recorded after a trip, then the trip keeps its duty, a rerun of it gives the same duty, and a trip after that day uses the new class', async () => {
    const route = (await q<{ id: number }>(`SELECT id FROM routes WHERE name = 'Tanner Way town loop'`))[0].id;
    const { asText, dayOf } = sqlFor(S.db.sequelize);
    // a trip on the route by a vehicle whose dampers stay the same from the trip to today
    const [trip] = await q<{ id: number; vehicle_id: number; started_at: string; ended_at: string; distance_km: number; mean_speed_kmh: number; payload_kg: number; driver_id: number | null }>(
      `SELECT t.* FROM trips t WHERE t.route_id = ? AND t.started_at < ? AND NOT EXISTS (SELECT 1 FROM dampers d WHERE d.vehicle_id = t.vehicle_id AND ${asText('d.installed_at')} > ${dayOf('t.started_at')})
       ORDER BY t.started_at DESC, t.id LIMIT 1`,
      [route, '2026-11-20'],
    );
    const tripDay = localDay(new Date(trip.started_at), S.config.timeZone);
    const before = await dutyOf(trip.id);
    expect(before.length).toBe(4);
    const changedOn = '2026-11-25';
    expect(tripDay < changedOn).toBe(true);
    const last = (await q<{ n: number }>(`SELECT MAX(seq) AS n FROM route_segments WHERE route_id = ?`, [route]))[0].n;
    const manager = (await q<{ id: number }>(`SELECT id FROM users WHERE role = 'manager' LIMIT 1`))[0].id;
    await roadsService.setRoughness(route, { seqFrom: 0, seqTo: last, isoClass: 'E', observedOn: changedOn, note: 'test: broken up by works traffic' }, manager, '2026-11-30');

    // the night after the change: nothing already computed for the trip moves
    await nightly();
    expect(await dutyOf(trip.id)).toEqual(before);

    // the trip's night rerun from scratch: the same duty (the class in force on its day)
    await S.db.sequelize.query(`DELETE FROM trip_duties WHERE trip_id = ?`, { replacements: [trip.id] });
    await S.db.sequelize.query(`UPDATE trips SET processed_at = NULL WHERE id = ?`, { replacements: [trip.id] });
    await nightly();
    const again = await dutyOf(trip.id);
    expect(again.map((d) => d.energy_j)).toEqual(before.map((d) => d.energy_j));
    expect(again.map((d) => d.spring_damage)).toEqual(before.map((d) => d.spring_damage));

    // the same trip driven on the day of the change: class E on every segment. Expected duty:
    // computeVehicleDuty on a route built here with class E's mean Gd(n0) on each segment.
    const shift = new Date(`${changedOn}T00:00:00Z`).getTime() - new Date(`${tripDay}T00:00:00Z`).getTime();
    const startedAt = new Date(new Date(trip.started_at).getTime() + shift);
    const endedAt = new Date(new Date(trip.ended_at).getTime() + shift);
    await S.db.sequelize.query(
      `INSERT INTO trips (vehicle_id, route_id, driver_id, started_at, ended_at, distance_km, mean_speed_kmh, payload_kg, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
      { replacements: [trip.vehicle_id, route, trip.driver_id, sqlDate(startedAt), sqlDate(endedAt), trip.distance_km, trip.mean_speed_kmh, trip.payload_kg, sqlDate(TEST_NOW), sqlDate(TEST_NOW)] },
    );
    const newId = (await q<{ id: number }>(`SELECT MAX(id) AS id FROM trips`))[0].id;
    await nightly();
    const after = await dutyOf(newId);

    const repo = wearRepository(S.db.sequelize);
    const specId = (await q<{ spec_id: number }>(`SELECT spec_id FROM vehicles WHERE id = ?`, [trip.vehicle_id]))[0].spec_id;
    const axles = (await repo.specAxles()).get(specId)!;
    const dampers = (await repo.dampersOf([trip.vehicle_id])).get(trip.vehicle_id)!;
    const [r] = await q<{ length_m: number }>(`SELECT length_m FROM routes WHERE id = ?`, [route]);
    const segs = await q<{ id: number; start_m: number; end_m: number; speed_kmh: number | null }>(`SELECT id, start_m, end_m, speed_kmh FROM route_segments WHERE route_id = ? ORDER BY seq`, [route]);
    const classE: RouteInput = { id: route, lengthM: r.length_m, segments: segs.map((s) => ({ id: s.id, startM: s.start_m, endM: s.end_m, speedKmh: s.speed_kmh, gdN0: gd('E'), profile: null })) };
    const input: TripInput = {
      id: newId, routeId: route, driverId: trip.driver_id, tripDate: changedOn, durationS: (endedAt.getTime() - startedAt.getTime()) / 1000,
      distanceKm: trip.distance_km, meanSpeedKmh: trip.mean_speed_kmh, payloadKg: trip.payload_kg,
    };
    const expected = computeVehicleDuty({ vehicleId: trip.vehicle_id, axles, dampers, trips: [input] }, new Map([[route, classE]]), new DutyCache()).duties;
    const byPos = new Map(expected.map((d) => [d.position, d.energyJ]));
    for (const d of after) expect(d.energy_j / byPos.get(d.position)!).toBeCloseTo(1, 9);
    // and it is rougher than the trip before the change (class E against A/B)
    expect(after[0].energy_j).toBeGreaterThan(4 * before[0].energy_j);
  }, 240_000);
});
