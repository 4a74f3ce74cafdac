/**
 * The wear area's storage and phases on a small fleet written by hand into a migrated temporary
 * SQLite file (no app booted): what the duty, wear and prediction phases store is checked
 * against the pure functions computed here from the same inputs (duty.ts computeVehicleDuty,
 * wear.ts accumulateDays and predict), so the SQL and the reading of the rows are checked on
 * their own (fleet: tests/support/wear-fleet.ts). Everything a check rests on is computed inside its test.
 */
import { afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import type { Db } from '../../../server/db';
import { dailyDutyByHand } from '../../support/duty-days';
import { AS_OF, AXLES, BEFORE, FRONT, insert, NOW, PROFILE, REAR, STAMP, TRIPS, TZ, wearFleetTemplate } from '../../support/wear-fleet';
import { computeVehicleDuty, DutyCache, dutyRow, TRIP_DUTY_COLUMNS, type DamperSpan, type TripInput } from '../../../server/wear/duty';
import type { DatedRoute } from '../../../server/wear/roughness-as-of';
import { predictAll, processTrips, recomputeWear, type PhaseContext } from '../../../server/wear/service';
import { repredictVehicle } from '../../../server/wear/repredict';
import { sqlDate, wearDayFromDb, wearRepository, type WearDayDb } from '../../../server/wear/repository';
import { accumulateDays, estimatedDamping, predict, type LifeBasis, type LifeResolver } from '../../../server/wear/wear';
import { priorLifeResolver } from '../../../server/workshop/life';
import { gdForClass } from '../../../server/physics/iso8608';

let template: Awaited<ReturnType<typeof wearFleetTemplate>>;
let run: Awaited<ReturnType<typeof template.fresh>>;
let dir: string;
let db: Db;

const rows = <T extends object>(sql: string, replacements: unknown[] = []) => db.sequelize.query<T>(sql, { replacements: replacements as never, type: QueryTypes.SELECT });

beforeAll(async () => {
  template = await wearFleetTemplate();
}, 60_000);

beforeEach(async () => {
  run = await template.fresh();
  ({ db, dir } = run);
});
afterEach(() => run.done());

function context(over: Partial<PhaseContext> = {}): PhaseContext {
  return {
    sequelize: db.sequelize,
    now: NOW,
    asOf: AS_OF,
    before: BEFORE,
    timeZone: TZ,
    dataDir: dir,
    batchTrips: 2,
    thresholdFraction: 0.8,
    loadProfile: async (_dir, id) => {
      if (id === 1) return PROFILE;
      throw new Error(`no file for survey ${id}`);
    },
    progress: () => {},
    errors: [],
    counts: {},
    ...over,
  };
}

/** Route 1 as it stood on each day, written out by hand from the observations above. */
function route1(): DatedRoute {
  const seg = (id: number, startM: number, endM: number, speedKmh: number | null, gdN0: number | null, profile: null | 'survey 1') => ({
    id, startM, endM, speedKmh, gdN0, profile: profile ? { surveyId: 1, ...PROFILE } : null,
  });
  const unrated = seg(13, 1400, 2000, null, null, null);
  return {
    id: 1,
    lengthM: 2000,
    segments: [seg(11, 0, 700, null, gdForClass('B'), null), seg(12, 700, 1400, 30, gdForClass('C'), null), unrated],
    later: [
      { from: '2026-11-12', segments: [seg(11, 0, 700, null, gdForClass('B'), 'survey 1'), seg(12, 700, 1400, 30, gdForClass('C'), null), unrated] },
      { from: '2026-11-20', segments: [seg(11, 0, 700, null, gdForClass('B'), 'survey 1'), seg(12, 700, 1400, 30, gdForClass('E'), null), unrated] },
      // survey 2's file cannot be read: the closed form of its class
      { from: '2026-11-27', segments: [seg(11, 0, 700, null, gdForClass('B'), null), seg(12, 700, 1400, 30, gdForClass('E'), null), unrated] },
    ],
  };
}

/** Vehicle 1's and 2's trips as the duty takes them: local day in Berlin, duration from the times. */
function tripsOf(vehicleId: number): TripInput[] {
  return TRIPS.filter((t) => t[1] === vehicleId && new Date(t[2]) < BEFORE).map(([id, , s, e, km, kmh, payload]) => ({
    id, routeId: 1, driverId: null, tripDate: new Date(new Date(s).getTime() + 3_600_000).toISOString().slice(0, 10),
    durationS: (new Date(e).getTime() - new Date(s).getTime()) / 1000, distanceKm: km, meanSpeedKmh: kmh, payloadKg: payload,
  }));
}

const DAMPERS_1: DamperSpan[] = [
  { id: 100, position: 'FL', axleIndex: 0, installedAt: '2026-03-01', removedAt: '2026-09-01' },
  { id: 101, position: 'FL', axleIndex: 0, installedAt: '2026-09-01', removedAt: null },
  { id: 102, position: 'FR', axleIndex: 0, installedAt: '2026-09-01', removedAt: null },
  { id: 103, position: 'RL', axleIndex: 1, installedAt: '2026-09-01', removedAt: null },
  { id: 104, position: 'RR', axleIndex: 1, installedAt: '2026-11-12', removedAt: null },
];
const DAMPERS_2: DamperSpan[] = [
  { id: 201, position: 'FL', axleIndex: 0, installedAt: '2026-06-01', removedAt: null },
  { id: 202, position: 'FR', axleIndex: 0, installedAt: '2026-06-01', removedAt: null },
];

const close = (x: number, y: number, rel = 1e-9) => Math.abs(x - y) <= rel * Math.max(Math.abs(x), Math.abs(y), 1e-300);

describe('the duty phase stores what the pure duty computes', () => {
  it('when the trips before the run\'s day are processed, then every stored duty row equals computeVehicleDuty on the roads as they stood on each trip\'s day, and the damper marks and trip marks follow', async () => {
    const ctx = context();
    await processTrips(ctx);
    const routes = new Map([[1, route1()]]);
    const expected = [
      ...computeVehicleDuty({ vehicleId: 1, axles: AXLES, dampers: DAMPERS_1, trips: tripsOf(1) }, routes, new DutyCache()).duties,
      ...computeVehicleDuty({ vehicleId: 2, axles: AXLES, dampers: DAMPERS_2, trips: tripsOf(2) }, routes, new DutyCache()).duties,
    ];
    // trip 2 started 23:30 UTC on 10 November: 11 November in Berlin
    expect(tripsOf(1).map((t) => t.tripDate)).toEqual(['2026-11-10', '2026-11-11', '2026-11-15', '2026-11-28']);
    expect(expected.filter((d) => d.profiledSegments > 0).map((d) => d.tripId)).toEqual([3, 3, 3, 3, 5, 5, 5, 5]);
    const stored = await rows<Record<string, unknown>>(`SELECT ${TRIP_DUTY_COLUMNS.join(', ')} FROM trip_duties ORDER BY trip_id, axle_index, position`);
    expect(stored.map((r) => TRIP_DUTY_COLUMNS.map((c) => r[c]))).toEqual(expected.map(dutyRow));
    // trips of the vehicle without axles, and after the run's day, are left for later
    expect(await rows(`SELECT id FROM trips WHERE processed_at IS NULL ORDER BY id`)).toEqual([{ id: 6 }, { id: 7 }]);
    expect(await rows(`SELECT DISTINCT processed_at AS p FROM trips WHERE processed_at IS NOT NULL`)).toEqual([{ p: STAMP }]);
    // each damper is marked from the first day it was driven; the removed one and the others not
    expect(await rows(`SELECT id, wear_dirty_from AS d FROM dampers ORDER BY id`)).toEqual([
      { id: 100, d: null }, { id: 101, d: '2026-11-10' }, { id: 102, d: '2026-11-10' }, { id: 103, d: '2026-11-10' }, { id: 104, d: '2026-11-15' },
      { id: 201, d: '2026-11-12' }, { id: 202, d: '2026-11-12' },
    ]);
    // 5 trips in batches of 2 trips of whole vehicles: vehicle 1 (4), vehicles 2 and 3 (1 + 1)
    expect(ctx.counts).toMatchObject({ batches: 2, trips: 5, dutyRecords: 20, segments: 15, tripErrors: 0 });
    expect(ctx.counts.closedFormSolves).toBeGreaterThan(0);
    expect(ctx.counts.profileSimulations).toBeGreaterThan(0);
    expect(ctx.errors).toEqual([
      { item: 'survey 2', message: 'profile not readable, its segments use the closed form: no file for survey 2' },
      { item: 'vehicle 3', message: 'its suspension spec has no axles; trips left unprocessed' },
    ]);
  });

  it('when the duty phase is run again, then it reads no trips and writes nothing; when a batch fails, then its trips stay unprocessed', async () => {
    const progress: [string, number, number][] = [];
    await processTrips(context({ progress: (p, d, t) => void progress.push([p, d, t]) }));
    // vehicle 1's 4 trips, then vehicles 2 and 3 (1 + 1, the trip of vehicle 3 read and left)
    expect(progress).toEqual([['duty', 0, 6], ['duty', 4, 6], ['duty', 6, 6]]);
    const before = await rows(`SELECT COUNT(*) AS n FROM trip_duties`);
    const again = context();
    await processTrips(again);
    expect(await rows(`SELECT COUNT(*) AS n FROM trip_duties`)).toEqual(before);
    expect(again.counts.dutyRecords ?? 0).toBe(0);

    // a fresh copy: the job fails after its first batch
    await db.sequelize.query(`DELETE FROM trip_duties`);
    await db.sequelize.query(`UPDATE trips SET processed_at = NULL`);
    await db.sequelize.query(`UPDATE dampers SET wear_dirty_from = NULL`);
    const failing = context({ failAfterBatches: 1 });
    await expect(processTrips(failing)).rejects.toThrow('injected failure after 1 batch(es)');
    expect(await rows(`SELECT id FROM trips WHERE processed_at IS NULL ORDER BY id`)).toEqual([{ id: 5 }, { id: 6 }, { id: 7 }]);
    expect(failing.counts.batches).toBe(1);
  });

  it('when the run is cancelled before it starts writing, then nothing is stored', async () => {
    const abort = new AbortController();
    abort.abort();
    await expect(processTrips(context({ signal: abort.signal }))).rejects.toThrow('The run was cancelled.');
    expect(await rows(`SELECT COUNT(*) AS n FROM trip_duties`)).toEqual([{ n: 0 }]);
  });
});

const SUM_KEYS = ['distanceKm', 'energyJ', 'springDamage', 'wearKm', 'cumKm', 'cumEnergyJ', 'cumWearKm', 'cumSpringDamage'] as const;

async function expectWearDays(damperId: number, vehicleId: number, b: number, start: { cumKm: number; cumEnergyJ: number; cumWearKm: number; cumSpringDamage: number } | null, fromDay = '') {
  const stored = (await rows<WearDayDb>(`SELECT * FROM damper_wear_days WHERE damper_id = ? ORDER BY day`, [damperId])).map((r) => wearDayFromDb(r, 1e5, 1000));
  const prev = start ? { ...start, damperId, vehicleId, day: '', distanceKm: 0, energyJ: 0, springDamage: 0, wearKm: 0, lifeWearKm: 1e5, lifeUsedFraction: 0, dampingNsPerM: 1000 } : null;
  const js = accumulateDays({ damperId, vehicleId }, prev, (await dailyDutyByHand(db.sequelize, damperId, b)).filter((d) => d.day >= fromDay), 1e5, 1000);
  const got = stored.filter((d) => d.day >= fromDay);
  expect(got.map((d) => d.day), `damper ${damperId}`).toEqual(js.map((d) => d.day));
  got.forEach((d, i) => {
    for (const k of SUM_KEYS) expect(close(d[k], js[i][k]), `damper ${damperId} ${d.day} ${k}: ${d[k]} vs ${js[i][k]}`).toBe(true);
    expect(d.vehicleId).toBe(vehicleId);
  });
  return js;
}

describe('the wear phase stores what accumulateDays gives', () => {
  it('when the wear is recomputed, then each damper\'s days are the sums of its duty at its spec\'s road sensitivity, its totals are those of its last day, and its untracked distance is the odometer less the trips on record', async () => {
    await processTrips(context());
    const ctx = context();
    const progress: [string, number, number][] = [];
    ctx.progress = (p, d, t) => void progress.push([p, d, t]);
    ctx.damperChunk = 2;
    await recomputeWear(ctx);
    const b = priorLifeResolver()({ damperId: 0, specId: 1, axleIndex: 0, ratedDamperLifeKm: 90000 }).b;
    expect(b).toBeGreaterThan(0);
    expect(b).not.toBe(1);
    for (const [id, v] of [[101, 1], [102, 1], [103, 1], [104, 1], [201, 2], [202, 2]]) {
      const js = await expectWearDays(id, v, b, null);
      const last = js[js.length - 1];
      const [tot] = await rows<{ energy_j: number; fatigue_damage: number; wear_exponent: number; wear_dirty_from: string | null; wear_updated_at: string }>(
        `SELECT energy_j, fatigue_damage, wear_exponent, wear_dirty_from, wear_updated_at FROM dampers WHERE id = ?`,
        [id],
      );
      expect(close(tot.energy_j, last.cumEnergyJ) && close(tot.fatigue_damage, last.cumSpringDamage), `damper ${id} totals`).toBe(true);
      expect(tot).toMatchObject({ wear_exponent: b, wear_dirty_from: null, wear_updated_at: STAMP });
    }
    expect((await expectWearDays(101, 1, b, null)).map((d) => d.day)).toEqual(['2026-11-10', '2026-11-11', '2026-11-15', '2026-11-28']);
    // untracked: odometer (or at removal) − at fitting − trips since fitting before the run's end
    // 101–103: 30 000 − 25 000 − 4 × 2.4 (trip 7 is after); 104: 30 000 − 29 990 − 2 × 2.4;
    // 100: removed at 25 000, fitted at 10 000, no trips on record in its time; 201/202: 12 000 − 9 000 − 2.4
    const untracked = await rows<{ id: number; opening_km: number }>(`SELECT id, opening_km FROM dampers ORDER BY id`);
    const want = new Map([[100, 15000], [101, 5000 - 9.6], [102, 5000 - 9.6], [103, 5000 - 9.6], [104, 10 - 4.8], [201, 3000 - 2.4], [202, 3000 - 2.4]]);
    for (const u of untracked) expect(u.opening_km, `damper ${u.id}`).toBeCloseTo(want.get(u.id)!, 9);
    // seven dampers: the six driven and the removed one (no estimate yet), in chunks of two; one
    // duty record read per wear day (one trip a day)
    expect(ctx.counts).toEqual({ dampersUpdated: 7, wearDays: 4 + 4 + 4 + 2 + 1 + 1, wearDutyRowsRead: 4 + 4 + 4 + 2 + 1 + 1 });
    expect(progress).toEqual([['wear', 0, 7], ['wear', 2, 7], ['wear', 4, 7], ['wear', 6, 7], ['wear', 7, 7]]);
  });

  it('when new trips come after a stored history, then the days before them are kept and the sums carry on from the last day kept', async () => {
    await processTrips(context());
    await recomputeWear(context());
    const keptBefore = await rows<WearDayDb>(`SELECT * FROM damper_wear_days WHERE damper_id = 101 AND day < '2026-11-28' ORDER BY day`);
    // a late trip of 24 November comes in, and the trip of 1 December is now in the run
    await insert(db.sequelize, 'trips', ['id', 'vehicle_id', 'route_id', 'driver_id', 'started_at', 'ended_at', 'distance_km', 'mean_speed_kmh', 'payload_kg', 'created_at', 'updated_at'], [
      [8, 1, 1, null, sqlDate(new Date('2026-11-24T10:00:00Z')), sqlDate(new Date('2026-11-24T10:04:00Z')), 2.4, 36, 0, STAMP, STAMP],
    ]);
    const later = context({ before: new Date('2026-12-01T23:00:00Z'), asOf: '2026-12-01' });
    await processTrips(later);
    expect(await rows(`SELECT wear_dirty_from AS d FROM dampers WHERE id = 101`)).toEqual([{ d: '2026-11-24' }]);
    const wearCtx = context({ before: new Date('2026-12-01T23:00:00Z'), asOf: '2026-12-01' });
    await recomputeWear(wearCtx);
    const b = priorLifeResolver()({ damperId: 0, specId: 1, axleIndex: 0, ratedDamperLifeKm: 90000 }).b;
    const kept = keptBefore[keptBefore.length - 1];
    expect(await rows<WearDayDb>(`SELECT * FROM damper_wear_days WHERE damper_id = 101 AND day < '2026-11-28' AND day < '2026-11-24' ORDER BY day`)).toEqual(keptBefore);
    const js = await expectWearDays(101, 1, b, { cumKm: kept.cum_km, cumEnergyJ: kept.cum_energy_j, cumWearKm: kept.cum_wear_km, cumSpringDamage: kept.cum_spring_damage }, '2026-11-24');
    expect(js.map((d) => d.day)).toEqual(['2026-11-24', '2026-11-28', '2026-12-01']);
    // only the dampers the new trips touched are recomputed (four of vehicle 1), from their duty since the late trip
    expect(wearCtx.counts).toEqual({ dampersUpdated: 4, wearDays: 12, wearDutyRowsRead: 12 });
    // and their untracked distance is revised: two more trips on record
    expect((await rows<{ opening_km: number }>(`SELECT opening_km FROM dampers WHERE id = 101`))[0].opening_km).toBeCloseTo(5000 - 6 * 2.4, 9);
  });

  it('when the spec\'s road sensitivity changes, then every damper of the spec is summed again from its fitting day with the new one', async () => {
    await processTrips(context());
    await recomputeWear(context());
    const life: LifeBasis = { b: 1.7, medianWearKm: 1e5, p10WearKm: 5e4, p90WearKm: 1.5e5, source: 'test', note: '' };
    const ctx = context({ lifeResolver: () => life });
    await recomputeWear(ctx);
    for (const [id, v] of [[101, 1], [102, 1], [103, 1], [104, 1], [201, 2], [202, 2]]) await expectWearDays(id, v, 1.7, null);
    expect(await rows(`SELECT DISTINCT wear_exponent AS b FROM dampers WHERE id != 100`)).toEqual([{ b: 1.7 }]);
    expect(ctx.counts.dampersUpdated).toBe(7);
    // the same b again: nothing to do
    const same = context({ lifeResolver: () => ({ ...life, b: 1.7 + 1e-12 }) });
    await recomputeWear(same);
    expect(same.counts.dampersUpdated ?? 0).toBe(0);
  });
});

describe('the prediction phase stores what predict gives from the stored history', () => {
  /** A short life, so that the levels are reached on record (the trips add some 10 wear km). */
  const shortLife: LifeResolver = ({ damperId, ratedDamperLifeKm }) => ({
    b: 1, medianWearKm: damperId % 2 ? 5 + ratedDamperLifeKm / 1e5 : 5e4, p10WearKm: 3, p90WearKm: 40, source: `short ${damperId}`, note: 'test',
  });

  async function expectPredictions(ids: number[], resolve: LifeResolver, over: { thresholdFraction: number; calendarYears?: number; scheduleQuantile?: number; asOf?: string }) {
    const asOf = over.asOf ?? AS_OF;
    const ctxRows = await rows<{ id: number; vehicle_id: number; installed_at: string; spec_id: number; axle_index: number; opening_km: number | null; damping: number; rated: number }>(
      `SELECT d.id, d.vehicle_id, d.installed_at, v.spec_id, d.axle_index, d.opening_km, a.damping_ns_per_m AS damping, a.rated_damper_life_km AS rated
       FROM dampers d JOIN vehicles v ON v.id = d.vehicle_id JOIN spec_axles a ON a.spec_id = v.spec_id AND a.axle_index = d.axle_index WHERE d.id IN (${ids.join(',')}) ORDER BY d.id`,
    );
    expect(ctxRows.map((r) => r.id)).toEqual(ids);
    for (const c of ctxRows) {
      const history = (await rows<WearDayDb>(`SELECT * FROM damper_wear_days WHERE damper_id = ? ORDER BY day`, [c.id])).map((r) => wearDayFromDb(r, 1e5, c.damping));
      const life = resolve({ damperId: c.id, specId: c.spec_id, axleIndex: c.axle_index, ratedDamperLifeKm: c.rated });
      const p = predict(history, {
        asOf, installedAt: c.installed_at, life, thresholdFraction: over.thresholdFraction, nominalDampingNsPerM: c.damping, untrackedKm: c.opening_km ?? 0,
        calendarYears: over.calendarYears, scheduleQuantile: over.scheduleQuantile,
      });
      const [s] = await rows<Record<string, unknown>>(`SELECT * FROM damper_predictions WHERE damper_id = ?`, [c.id]);
      expect(s, `damper ${c.id}`).toBeDefined();
      expect({ ...s, basis: JSON.parse(s.basis as string) }).toMatchObject({
        damper_id: c.id, vehicle_id: c.vehicle_id, as_of: p.asOf, window_days: p.windowDays, life_wear_km: life.medianWearKm, life_p10_wear_km: life.p10WearKm,
        life_p90_wear_km: life.p90WearKm, road_sensitivity: life.b, life_source: life.source, threshold_fraction: p.thresholdFraction, schedule_quantile: p.scheduleQuantile,
        threshold_date: p.thresholdDate, end_of_life_date: p.endOfLifeDate, end_of_life_p10_date: p.endOfLifeP10Date, end_of_life_p90_date: p.endOfLifeP90Date,
        governed_by: p.governedBy, spring_threshold_date: p.springThresholdDate, opening_km: p.opening.km, basis: p.basis,
      });
      for (const [col, v] of Object.entries({
        window_km: p.windowKm, window_wear_km: p.windowWearKm, wear_km_per_day: p.wearKmPerDay, km_per_day: p.kmPerDay, wear_km: p.wearKm, life_used_fraction: p.lifeUsedFraction,
        distance_life_used: p.distanceLifeUsed, calendar_life_used: p.calendarLifeUsed, opening_share: p.openingShare, opening_share_low: p.openingShareLow,
        opening_share_high: p.openingShareHigh, damping_ns_per_m: p.dampingNsPerM, spring_damage: p.springDamage, spring_rate_per_day: p.springRatePerDay,
      })) expect(close(s[col] as number, v as number, 1e-12), `damper ${c.id} ${col}: ${String(s[col])} vs ${v}`).toBe(true);
      const [d] = await rows<{ wear_km: number; life_used_fraction: number; damping_ns_per_m: number; opening_basis: string }>(
        `SELECT wear_km, life_used_fraction, damping_ns_per_m, opening_basis FROM dampers WHERE id = ?`,
        [c.id],
      );
      expect(close(d.wear_km, p.wearKm, 1e-12) && close(d.life_used_fraction, p.lifeUsedFraction, 1e-12) && close(d.damping_ns_per_m, p.dampingNsPerM, 1e-12), `damper ${c.id} totals`).toBe(true);
      expect(d.opening_basis).toBe(p.opening.basis);
    }
  }

  it('when every fitted damper is predicted, then each stored prediction and each damper\'s totals equal predict on its stored history; removed dampers and retired vehicles get none', async () => {
    await processTrips(context());
    await recomputeWear(context());
    // predictions of vehicle 2 while it was in service, and a stale one of the removed damper: dropped
    await db.sequelize.query(`UPDATE vehicles SET status = 'in_service' WHERE id = 2`);
    await predictAll(context());
    await db.sequelize.query(`UPDATE vehicles SET status = 'retired' WHERE id = 2`);
    await db.sequelize.query(`CREATE TEMP TABLE stale AS SELECT * FROM damper_predictions WHERE damper_id = 101`);
    await db.sequelize.query(`UPDATE stale SET damper_id = 100`);
    await db.sequelize.query(`INSERT INTO damper_predictions SELECT * FROM stale`);
    expect((await rows<{ id: number }>(`SELECT damper_id AS id FROM damper_predictions ORDER BY damper_id`)).map((r) => r.id)).toEqual([100, 101, 102, 103, 104, 201, 202]);
    const ctx = context({ lifeResolver: shortLife, thresholdFraction: 0.5, calendarYears: 5, scheduleQuantile: 0.1, damperChunk: 3 });
    const progress: number[] = [];
    ctx.progress = (_p, d) => void progress.push(d);
    await predictAll(ctx);
    expect((await rows<{ id: number }>(`SELECT damper_id AS id FROM damper_predictions ORDER BY damper_id`)).map((r) => r.id)).toEqual([101, 102, 103, 104]);
    await expectPredictions([101, 102, 103, 104], shortLife, { thresholdFraction: 0.5, calendarYears: 5, scheduleQuantile: 0.1 });
    // some levels were reached on record, some not
    const dates = await rows<{ id: number; t: string | null; e: string | null }>(`SELECT damper_id AS id, threshold_date AS t, end_of_life_date AS e FROM damper_predictions ORDER BY damper_id`);
    expect(dates.filter((d) => d.e !== null && d.e <= AS_OF).map((d) => d.id)).toEqual([101, 103]);
    expect(ctx.counts).toEqual({ predictions: 4 });
    expect(progress).toEqual([3, 4]);
    expect(ctx.errors).toEqual([]);
  });

  it('when a life cannot be resolved for a damper, then that damper is reported and the others are predicted', async () => {
    await processTrips(context());
    await recomputeWear(context());
    const resolve: LifeResolver = (i) => {
      if (i.damperId === 102) throw new Error('no life model');
      return priorLifeResolver()(i);
    };
    const ctx = context({ lifeResolver: resolve });
    await predictAll(ctx);
    expect(ctx.errors).toEqual([{ item: 'damper 102', message: 'no life model' }]);
    await expectPredictions([101, 103, 104], resolve, { thresholdFraction: 0.8 });
    expect(await rows(`SELECT damper_id AS id FROM damper_predictions WHERE damper_id = 102`)).toEqual([]);
  });

  it('when one vehicle is predicted again, then only its dampers are, as of the day of `now` in the time zone, with the life given', async () => {
    await processTrips(context());
    await recomputeWear(context());
    const life: LifeResolver = ({ damperId }) => ({ b: 1, medianWearKm: 8 + damperId / 100, p10WearKm: 4, p90WearKm: 20, source: 'lane', note: '' });
    // 23:30 UTC on 29 November is 30 November in Berlin
    const r = await repredictVehicle(db.sequelize, 1, { now: new Date('2026-11-29T23:30:00Z'), timeZone: TZ, thresholdFraction: 0.6, lifeResolver: life });
    expect(r).toEqual({ predictions: 4, errors: [] });
    await expectPredictions([101, 102, 103, 104], life, { thresholdFraction: 0.6 });
    expect(await rows(`SELECT COUNT(*) AS n FROM damper_predictions`)).toEqual([{ n: 4 }]);
    const none = await repredictVehicle(db.sequelize, 3, { now: NOW, asOf: '2026-11-20', timeZone: TZ, thresholdFraction: 0.6, lifeResolver: life });
    expect(none).toEqual({ predictions: 0, errors: [] });
  });

  it('when the workshop settings are given instead of a life, then the vehicle is predicted on the prior life with the calendar limit and quantile of the settings', async () => {
    await processTrips(context());
    await recomputeWear(context());
    const workshop = { life: { prior: undefined, calendarYears: 4, scheduleQuantile: 0.1 } } as never;
    const r = await repredictVehicle(db.sequelize, 1, { now: NOW, asOf: AS_OF, timeZone: TZ, thresholdFraction: 0.7, workshop });
    expect(r.predictions).toBe(4);
    await expectPredictions([101, 102, 103, 104], priorLifeResolver(), { thresholdFraction: 0.7, calendarYears: 4, scheduleQuantile: 0.1 });
    const none = await repredictVehicle(db.sequelize, 1, { now: NOW, asOf: AS_OF, timeZone: TZ, thresholdFraction: 0.7 });
    expect(none.predictions).toBe(4);
    await expectPredictions([101, 102, 103, 104], priorLifeResolver(), { thresholdFraction: 0.7 });
  });
});

describe('the repository\'s reads', () => {
  it('when a stored wear day is read against a life, then life used counts the opening wear and damping fades by it (computed)', () => {
    const r: WearDayDb = { damper_id: 1, day: '2026-11-01', vehicle_id: 2, distance_km: 10, energy_j: 5, spring_damage: 0.1, wear_km: 12, cum_km: 100, cum_energy_j: 50, cum_wear_km: 300, cum_spring_damage: 0.2 };
    const d = wearDayFromDb(r, 1000, 3000, 200);
    // (300 + 200) / 1000 = 0.5 → 3000 × (1 − 0.4 × 0.5) = 2400
    expect(d).toEqual({
      damperId: 1, vehicleId: 2, day: '2026-11-01', distanceKm: 10, energyJ: 5, springDamage: 0.1, wearKm: 12, cumKm: 100, cumEnergyJ: 50, cumWearKm: 300, cumSpringDamage: 0.2,
      lifeWearKm: 1000, lifeUsedFraction: 0.5, dampingNsPerM: estimatedDamping(3000, 0.5),
    });
    expect(estimatedDamping(3000, 0.5)).toBeCloseTo(2400, 9);
    expect(wearDayFromDb(r, 1000, 3000).lifeUsedFraction).toBe(0.3);
  });

  it('when the spec axles are asked twice of one repository, then they are read once; empty id lists read nothing', async () => {
    const repo = wearRepository(db.sequelize);
    const a = await repo.damperContext([101, 201, 999]);
    expect(a).toEqual([
      { id: 101, vehicleId: 1, specId: 1, axleIndex: 0, installedAt: '2026-09-01', corner: FRONT, ratedDamperLifeKm: 90000, untrackedKm: null },
      { id: 201, vehicleId: 2, specId: 1, axleIndex: 0, installedAt: '2026-06-01', corner: FRONT, ratedDamperLifeKm: 90000, untrackedKm: null },
    ]);
    await db.sequelize.query(`DELETE FROM spec_axles`);
    expect((await repo.damperContext([103])).map((c) => c.corner)).toEqual([REAR]);
    expect(await wearRepository(db.sequelize).damperContext([103])).toEqual([]);
    expect(await repo.recordedTotals([], AS_OF)).toEqual(new Map());
    expect(await repo.wearSummaries([], 0.8, AS_OF)).toEqual(new Map());
    expect(await repo.installedDamperIds(0, 10, [])).toEqual([]);
    expect(await repo.installedDamperIds(101, 2)).toEqual([102, 103]);
    expect(await repo.installedDamperIds(0, 10, [1, 2])).toEqual([101, 102, 103, 104]);
    expect(await repo.planUnprocessed(BEFORE)).toEqual([{ vehicleId: 1, trips: 4 }, { vehicleId: 2, trips: 1 }, { vehicleId: 3, trips: 1 }]);
  });
});
