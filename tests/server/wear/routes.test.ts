/**
 * The vehicle wear view (GET /vehicles/:id/wear) and the wear reads for other areas, on the small
 * hand-written fleet of tests/support/wear-fleet.ts after the nightly phases: the route is
 * mounted on a bare router with the signed-in user set by the test (no app booted), and every
 * figure it answers is worked out here from the stored rows.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import express from 'express';
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import type { Db } from '../../../server/db';
import { loadConfig } from '../../../server/config';
import { createLogger } from '../../../server/logger';
import { errorHandler } from '../../../server/errors';
import { registerWearRoutes } from '../../../server/wear/routes';
import { wearReadRepository } from '../../../server/wear/read-repository';
import { inspectionService } from '../../../server/inspections/service';
import { CAUTION_TEXT } from '../../../server/mail/templates';
import { predictAll, processTrips, recomputeWear, type PhaseContext } from '../../../server/wear/service';
import { priorLifeResolver } from '../../../server/workshop/life';
import type { SessionUser } from '../../../server/http/access';
import type { LifeResolver } from '../../../server/wear/wear';
import { AS_OF, BEFORE, insert, NOW, PROFILE, STAMP, TZ, wearFleetTemplate } from '../../support/wear-fleet';

let template: Awaited<ReturnType<typeof wearFleetTemplate>>;
let run: Awaited<ReturnType<typeof template.fresh>>;
let db: Db;
let server: import('node:http').Server;
let base: string;
let user: SessionUser | null;
const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: '/tmp/unused', LOG_LEVEL: 'error', INSPECTION_THRESHOLD: '0.75', DAMPER_CALENDAR_YEARS: '5' });

const rows = <T extends object>(sql: string, replacements: unknown[] = []) => db.sequelize.query<T>(sql, { replacements: replacements as never, type: QueryTypes.SELECT });
const as = (role: SessionUser['role'], id = 1) => {
  user = { id, name: 'T', email: 't@test', role, active: true, mustChangePassword: false };
};

/** The fleet after one nightly run (duty, wear and predictions), written once per file run. */
let afterNightly: string;

beforeAll(async () => {
  template = await wearFleetTemplate();
  const n = await template.fresh();
  await nightlyOn(n.db, n.dir);
  await n.db.sequelize.query('PRAGMA wal_checkpoint(TRUNCATE)');
  await n.db.close();
  afterNightly = path.join(os.tmpdir(), `reboundry-wear-routes-${process.pid}-${Date.now()}.sqlite`);
  fs.copyFileSync(n.file, afterNightly);
  fs.rmSync(n.dir, { recursive: true, force: true });
}, 60_000);
afterAll(() => fs.rmSync(afterNightly, { force: true }));

/** Serves the wear route on a copy of the fleet as it stands before any run, or after one. */
async function serve(state: 'fresh' | 'after nightly' = 'fresh') {
  run = await template.fresh(state === 'fresh' ? undefined : afterNightly);
  db = run.db;
  const app = express();
  app.use((req, _res, next) => {
    if (user) req.user = user;
    next();
  });
  const r = express.Router();
  registerWearRoutes(r, { sequelize: db.sequelize, config });
  app.use('/api', r);
  app.use(errorHandler(createLogger('error'), false));
  server = app.listen(0);
  await new Promise<void>((res) => server.once('listening', () => res()));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api`;
}
beforeEach(() => {
  user = null;
});
afterEach(async () => {
  await new Promise<void>((res) => server.close(() => res()));
  await run.done();
});

const get = async (p: string) => {
  const r = await fetch(base + p);
  return { status: r.status, body: (await r.json()) as Record<string, unknown> & { dampers: Record<string, unknown>[]; dutyByRoute: Record<string, unknown>[] } };
};

/** Damper 101 and 103 on a short life (their levels reached on record), the others on the prior. */
const mixedLife: LifeResolver = (i) =>
  i.damperId === 101 || i.damperId === 103 ? { b: 1, medianWearKm: 6, p10WearKm: 3, p90WearKm: 30, source: 'short', note: '' } : priorLifeResolver()(i);

async function nightlyOn(target: Db, dataDir: string) {
  const ctx = (): PhaseContext => ({
    sequelize: target.sequelize, now: NOW, asOf: AS_OF, before: BEFORE, timeZone: TZ, dataDir, batchTrips: 10, thresholdFraction: 0.75,
    lifeResolver: mixedLife, loadProfile: async (_d, id) => (id === 1 ? PROFILE : Promise.reject(new Error('gone'))), progress: () => {}, errors: [], counts: {},
  });
  await processTrips(ctx());
  await recomputeWear(ctx());
  await predictAll(ctx());
}

describe('the vehicle wear view', () => {
  it('when a vehicle has no duty yet, then its fitted dampers are listed at nominal damping with no prediction, history or route duty', async () => {
    await serve();
    as('manager');
    const r = await get('/vehicles/1/wear');
    expect(r.status).toBe(200);
    expect(r.body).toMatchObject({ vehicleId: 1, thresholdFraction: 0.75, windowDays: 30, caution: CAUTION_TEXT, dutyByRoute: [], nextInspection: await inspectionService(db.sequelize).nextForVehicle(1) });
    // the words of the view, with the settings filled in (calendar limit 5 years, window 30 days)
    expect(r.body.assumptions).toEqual([
      'Life used = wear km / median life in wear km. Wear km is each trip\'s distance weighted by its road severity (rod sliding distance per km, with a heat factor on very rough fast stretches) against the road the rated km is stated on (ISO 8608 class B at 80 km/h): severity 1 there, about 2 on class C, 4 on class D.',
      "The median life comes from the spec's life model: fitted to the fleet's own removals, starting from the trade's prior (the rated km on class B; 1.5× shorter per ISO class step, as makers' severe-service schedules commonly halve intervals). End-of-life dates come with a P10–P90 range from the fitted scatter.",
      'A damper is also at end of life 5 years after fitting, whatever its distance (common practice: 5–7 years).',
      'Present damping is estimated as a linear fade from the nominal value to 60 % at end of life (an assumption until a test-lane result is recorded).',
      "Dates are a straight-line projection of the last 30 days' wear.",
      'Distance a damper ran before the trips on record is charged as opening wear at the rated road\'s rate, unless its own record is at least as long, then at its own recorded rate; the share is shown with its range and revised as the records grow.',
      'Spring fatigue uses an assumed S–N curve (not the spring maker\'s).',
    ]);
    expect(r.body.dampers.map((d) => [d.id, d.position, d.axleIndex])).toEqual([[101, 'FL', 0], [102, 'FR', 0], [103, 'RL', 1], [104, 'RR', 1]]);
    expect(r.body.dampers[0]).toEqual({
      id: 101, position: 'FL', axleIndex: 0, partNumber: null, installedAt: '2026-09-01', energyJ: 0, springDamage: 0, lifeUsedFraction: 0,
      nominalDampingNsPerM: 2800, dampingNsPerM: 2800, ratedDamperLifeKm: 90000, opening: null, lastDutyDay: null, prediction: null, path: [], history: [],
    });
  });

  it('when the nightly phases have run, then each damper\'s prediction, path, history and opening and the duty per route follow from the stored rows (computed)', async () => {
    await serve('after nightly');
    as('mechanic');
    const r = await get('/vehicles/1/wear');
    expect(r.status).toBe(200);
    const preds = await rows<Record<string, number | string | null>>(`SELECT * FROM damper_predictions WHERE vehicle_id = 1 ORDER BY damper_id`);
    expect(preds.map((p) => p.damper_id)).toEqual([101, 102, 103, 104]);
    const dampers = await rows<{ id: number; life_used_fraction: number; damping_ns_per_m: number; energy_j: number; fatigue_damage: number; opening_basis: string }>(`SELECT * FROM dampers WHERE vehicle_id = 1 AND removed_at IS NULL ORDER BY id`);
    let passed = 0;
    let ahead = 0;
    for (const [k, p] of preds.entries()) {
      const got = r.body.dampers[k] as Record<string, never>;
      const d = dampers[k];
      const L = p.life_wear_km as number;
      const perKm = (p.window_wear_km as number) / (p.window_km as number);
      const nominal = k < 2 ? 2800 : 3300;
      expect(got).toMatchObject({ id: p.damper_id, energyJ: d.energy_j, springDamage: d.fatigue_damage, lifeUsedFraction: d.life_used_fraction, dampingNsPerM: d.damping_ns_per_m, nominalDampingNsPerM: nominal });
      expect(got.prediction).toMatchObject({
        asOf: AS_OF, windowDays: p.window_days, windowKm: p.window_km, windowWearKm: p.window_wear_km, kmPerDay: p.km_per_day, wearKmPerDay: p.wear_km_per_day, lifeWearKm: L,
        lifeP10WearKm: p.life_p10_wear_km, lifeP90WearKm: p.life_p90_wear_km, roadSensitivity: p.road_sensitivity, lifeSource: p.life_source, distanceLifeUsed: p.distance_life_used,
        calendarLifeUsed: p.calendar_life_used, thresholdFraction: 0.75, scheduleQuantile: p.schedule_quantile, thresholdDate: p.threshold_date, endOfLifeDate: p.end_of_life_date,
        endOfLifeP10Date: p.end_of_life_p10_date, endOfLifeP90Date: p.end_of_life_p90_date, governedBy: p.governed_by, springRatePerDay: p.spring_rate_per_day,
        springThresholdDate: p.spring_threshold_date, basis: JSON.parse(p.basis as string),
      });
      const pr = got.prediction as Record<string, number>;
      // severity = window wear km per window km; median life in km at that mix = L / severity
      expect(pr.severity).toBeCloseTo(perKm, 12);
      expect(pr.severity).not.toBe(1);
      expect(pr.lifeKm).toBeCloseTo(L / perKm, 9);
      expect(got.opening).toEqual({ km: p.opening_km, share: p.opening_share, shareLow: p.opening_share_low, shareHigh: p.opening_share_high, basis: d.opening_basis });
      // the path: today, then the threshold and end of life while they are ahead
      const path = [{ day: AS_OF, lifeUsedFraction: d.life_used_fraction }];
      if ((p.threshold_date as string) > AS_OF) path.push({ day: p.threshold_date as string, lifeUsedFraction: 0.75 });
      if ((p.end_of_life_date as string) > AS_OF) path.push({ day: p.end_of_life_date as string, lifeUsedFraction: 1 });
      expect(got.path).toEqual(path);
      if (path.length === 1) passed++;
      if (path.length === 3) ahead++;
      // the history: life used counts the opening wear (its share of the life), damping fades to 60 % of nominal
      const hist = await rows<{ day: string; distance_km: number; wear_km: number; cum_wear_km: number; cum_spring_damage: number }>(`SELECT * FROM damper_wear_days WHERE damper_id = ? ORDER BY day`, [p.damper_id]);
      expect(hist.length).toBeGreaterThan(0);
      expect(got.lastDutyDay).toBe(hist[hist.length - 1].day);
      const h = got.history as Record<string, number>[];
      expect(h.map((x) => x.day)).toEqual(hist.map((x) => x.day));
      hist.forEach((x, i) => {
        const u = (x.cum_wear_km + (p.opening_share as number) * L) / L;
        expect(h[i].lifeUsedFraction).toBeCloseTo(u, 12);
        expect(h[i].dampingNsPerM).toBeCloseTo(nominal * (1 - 0.4 * Math.min(1, u)), 9);
        expect(h[i].severity).toBeCloseTo(x.wear_km / x.distance_km, 12);
        expect(h[i]).toMatchObject({ distanceKm: x.distance_km, wearKm: x.wear_km, springDamage: x.cum_spring_damage });
      });
    }
    // the short-life dampers passed both levels (a path of today alone), the others have both ahead
    expect([passed, ahead]).toEqual([2, 2]);
    // duty per route and axle, summed here from the duty rows: km once per trip, severity distance-weighted
    const duty = await rows<{ trip_id: number; axle_index: number; distance_km: number; severity: number; energy_j: number; spring_damage: number; rms_weighted_accel: number }>(
      `SELECT * FROM trip_duties WHERE damper_id IN (101, 102, 103, 104)`,
    );
    const byAxle = [0, 1].map((axle) => {
      const ds = duty.filter((x) => x.axle_index === axle);
      const trips = new Map(ds.map((x) => [x.trip_id, x.distance_km]));
      const km = [...trips.values()].reduce((s, x) => s + x, 0);
      const dist = ds.reduce((s, x) => s + x.distance_km, 0);
      return {
        axle, trips: trips.size, km, energy: ds.reduce((s, x) => s + x.energy_j, 0), spring: ds.reduce((s, x) => s + x.spring_damage, 0),
        severity: ds.reduce((s, x) => s + x.distance_km * x.severity, 0) / dist, accel: ds.reduce((s, x) => s + x.rms_weighted_accel, 0) / ds.length,
      };
    }).sort((a, b) => b.energy - a.energy);
    const total = byAxle[0].energy + byAxle[1].energy;
    expect(r.body.dutyByRoute).toHaveLength(2);
    byAxle.forEach((x, i) => {
      const got = r.body.dutyByRoute[i] as Record<string, number>;
      expect(got).toMatchObject({ routeId: 1, routeName: 'Ring', axleIndex: x.axle, trips: x.trips });
      expect(got.km).toBeCloseTo(x.km, 9);
      expect(got.energyJ).toBeCloseTo(x.energy, 6);
      // per km of one corner: the axle's two corners share the energy
      expect(got.energyJPerKm).toBeCloseTo(x.energy / x.km / 2, 6);
      expect(got.sharePct).toBeCloseTo((x.energy / total) * 100, 9);
      expect(got.severity).toBeCloseTo(x.severity, 12);
      expect(got.springDamage).toBeCloseTo(x.spring, 15);
      expect(got.avgWeightedAccel).toBeCloseTo(x.accel, 12);
    });
    // each trip once per axle, though damper 104 (fitted 12 November) has two of the rear axle's four
    expect(byAxle.map((x) => [x.trips, x.km])).toEqual([[4, 9.6], [4, 9.6]]);
    expect(duty.filter((x) => x.axle_index === 1)).toHaveLength(6);
  });

  it('when wear days are stored but no prediction yet, then the history has no life used and nominal damping; a prediction with no window distance has no severity and its life in km is the wear-km life', async () => {
    await serve();
    const ctx = (): PhaseContext => ({
      sequelize: db.sequelize, now: NOW, asOf: AS_OF, before: BEFORE, timeZone: TZ, dataDir: run.dir, batchTrips: 10, thresholdFraction: 0.75,
      loadProfile: async () => PROFILE, progress: () => {}, errors: [], counts: {},
    });
    await processTrips(ctx());
    await recomputeWear(ctx());
    as('manager');
    const before = await get('/vehicles/1/wear');
    const fl = before.body.dampers[0] as Record<string, never>;
    expect(fl).toMatchObject({ prediction: null, path: [], opening: null, lastDutyDay: '2026-11-28', dampingNsPerM: 2800 });
    expect((fl.history as Record<string, number>[]).map((h) => [h.lifeUsedFraction, h.dampingNsPerM])).toEqual([[0, 2800], [0, 2800], [0, 2800], [0, 2800]]);
    await predictAll(ctx());
    await db.sequelize.query(`UPDATE damper_predictions SET window_km = 0, basis = '' WHERE damper_id = 101`);
    await db.sequelize.query(`UPDATE damper_wear_days SET distance_km = 0 WHERE damper_id = 101 AND day = '2026-11-10'`);
    await db.sequelize.query(`UPDATE dampers SET opening_basis = NULL WHERE id = 101`);
    const after = await get('/vehicles/1/wear');
    const p = (after.body.dampers[0] as Record<string, Record<string, unknown>>).prediction;
    const [row] = await rows<{ life_wear_km: number; opening_share: number; opening_share_low: number; opening_share_high: number; opening_km: number }>(`SELECT * FROM damper_predictions WHERE damper_id = 101`);
    expect(p).toMatchObject({ severity: null, lifeKm: row.life_wear_km, basis: null });
    expect((after.body.dampers[0] as Record<string, unknown>).opening).toEqual({ km: row.opening_km, share: row.opening_share, shareLow: row.opening_share_low, shareHigh: row.opening_share_high, basis: '' });
    expect(((after.body.dampers[0] as Record<string, Record<string, unknown>[]>).history[0]).severity).toBeNull();
  });

  it('when the duty rows have no energy or distance, then the route shares and the energy per km are 0, not a division by zero', async () => {
    await serve('after nightly');
    await db.sequelize.query(`UPDATE trip_duties SET energy_j = 0, distance_km = 0`);
    as('manager');
    const r = await get('/vehicles/1/wear');
    expect(r.body.dutyByRoute.map((x) => [x.km, x.energyJ, x.energyJPerKm, x.sharePct])).toEqual([[0, 0, 0, 0], [0, 0, 0, 0]]);
  });

  it('when a driver asks, then only the vehicle assigned to them is shown; an unknown vehicle or a bad id is refused', async () => {
    await serve();
    await insert(db.sequelize, 'users', ['id', 'name', 'email', 'role', 'password_hash', 'active', 'created_at', 'updated_at'], [[7, 'Dee', 'dee@test', 'driver', 'x', 1, STAMP, STAMP]]);
    await db.sequelize.query(`UPDATE vehicles SET driver_id = 7 WHERE id = 1`);
    as('driver', 7);
    expect((await get('/vehicles/1/wear')).status).toBe(200);
    const other = await get('/vehicles/2/wear');
    expect(other.status).toBe(403);
    expect(other.body).toEqual({ error: { code: 'forbidden', message: 'Drivers can see only the vehicle assigned to them.' } });
    as('manager');
    const missing = await get('/vehicles/99/wear');
    expect(missing.status).toBe(404);
    expect(JSON.stringify(missing.body)).toContain('Vehicle');
    expect((await get('/vehicles/x/wear')).status).toBe(400);
    user = null;
    expect((await get('/vehicles/1/wear')).status).toBe(401);
  });
});

describe('the wear reads for other areas', () => {
  it('when the front-axle duty of trips is asked, then each trip gives its front-left weighted acceleration, duration, driver and day; no trips, no rows', async () => {
    await serve('after nightly');
    const repo = wearReadRepository(db.sequelize);
    const fl = await rows<{ trip_id: number; rms_weighted_accel: number; duration_s: number; driver_id: number | null; trip_date: string }>(`SELECT * FROM trip_duties WHERE position = 'FL' ORDER BY trip_id`);
    expect(fl.map((x) => x.trip_id)).toEqual([1, 2, 3, 4, 5]);
    const got = await repo.frontAxleByTrip([1, 3, 5, 6]);
    expect([...got.keys()].sort()).toEqual([1, 3, 5]);
    for (const x of fl.filter((t) => [1, 3, 5].includes(t.trip_id))) {
      expect(got.get(x.trip_id)).toEqual({ rmsWeightedAccel: x.rms_weighted_accel, durationS: x.duration_s, driverId: x.driver_id, tripDate: x.trip_date });
    }
    expect(got.get(3)!.durationS).toBe(120);
    expect(await repo.frontAxleByTrip([])).toEqual(new Map());
    expect(await repo.history([])).toEqual([]);
    expect(await repo.dutyByRoute([])).toEqual([]);
    expect(await repo.vehicle(1)).toEqual({ id: 1, fleet_number: 'V-1', driver_id: null, spec_id: 1 });
    expect(await repo.vehicle(99)).toBeNull();
  });
});
