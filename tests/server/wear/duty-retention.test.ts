import { describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { startTestServer, type TestServer } from '../../support/server';
import { diffTables, diffTablesNear, dump, NIGHTLY_TEST_ENV, type Dump } from '../../support/nightly';
import { run } from '../../../jobs/nightly';
import { backtest } from '../../../server/workshop/life';
import { wearReadRepository } from '../../../server/wear/read-repository';
import { foldOldDuty } from '../../../server/wear/service';
import { retentionStart } from '../../../server/wear/duty-summary';
import { migrator } from '../../../server/db';

/**
 * Per-trip duty past the retention window is folded into the daily summary. The same history
 * run with the shortest window allowed (61 days) and with an unbounded one: on the night the
 * fold first moves rows, every table is the same, row for row and bit for bit, apart from the
 * rows moved; on the next night, which reads the summary (a removal for wear refits the life
 * model, so the wear is summed again from each damper's fitting), the life models and severity
 * totals are still bit for bit the same and the wear sums agree to 1e-12 (the summary's series
 * for Σ km·s^b, sums added in another order). The fold is idempotent, and a fold killed midway
 * leaves whole days folded and ends the same when run again. Migration 0019, run on a database
 * with duty, fills the severity totals the nights keep.
 */

const WINDOW = 61;
const UNBOUNDED = 36500;
// 30 days after the demo's day: the demo's first 30 days of trips are past the 61-day window
const NIGHT_A = new Date('2026-12-30T12:00:00Z');
const NIGHT_B = new Date('2026-12-31T12:00:00Z');
const DAY_A = '2026-12-30';
const DAY_B = '2026-12-31';
const SUMMARY_TABLES = ['trip_duties', 'trip_duty_days', 'damper_route_totals'];

type Row = Record<string, unknown>;
const rows = (s: TestServer, sql: string) => s.db.sequelize.query<Row>(sql, { type: QueryTypes.SELECT });
const without = (d: Dump, tables: string[]) => Object.fromEntries(Object.entries(d).filter(([t]) => !tables.includes(t)));
const kept = (d: Dump, from: string) => (d.trip_duties as Row[]).filter((r) => String(r.trip_date) >= from);

interface History {
  nightA: Record<string, number>;
  nightB: Record<string, number>;
  dumpA: Dump;
  dumpB: Dump;
  backtests: unknown[];
  byRoute: unknown[];
}

/** A trip like the vehicle's first one, on another day. */
async function lateTrip(s: TestServer, vehicleId: number, day: string) {
  const [t] = await rows(s, `SELECT vehicle_id, route_id, driver_id, distance_km, mean_speed_kmh, payload_kg FROM trips WHERE vehicle_id = ${vehicleId} ORDER BY id LIMIT 1`);
  await s.db.sequelize.query(
    `INSERT INTO trips (vehicle_id, route_id, driver_id, started_at, ended_at, distance_km, mean_speed_kmh, payload_kg, created_at, updated_at)
     VALUES (?, ?, ?, ?, ?, ?, ?, ?, '2026-12-30 20:00:00.000 +00:00', '2026-12-30 20:00:00.000 +00:00')`,
    { replacements: [t.vehicle_id, t.route_id, t.driver_id, `${day} 03:00:00.000 +00:00`, `${day} 04:00:00.000 +00:00`, t.distance_km, t.mean_speed_kmh, t.payload_kg] },
  );
}

/**
 * Night A on the demo fleet (all its trips unprocessed) with a window of `days`; then a damper
 * removed for wear with a new one in its place, and two trips recorded late: one inside the
 * window, one on a day already folded; night B a day later. With `crashFold`, night A is first
 * killed after folding three days and run again.
 */
async function twoNights(s: TestServer, crashFold: boolean, after?: (s: TestServer) => Promise<void>): Promise<History> {
  const deps = { db: s.db, config: s.config, log: s.log, mailer: s.mailer, trigger: 'test' as const };
  if (crashFold) {
    const killed = await run({ ...deps, now: NIGHT_A, failAfterFoldDays: 3 });
    expect(killed.status).toBe('failed');
    expect(killed.counts.dutyDaysFolded).toBe(3);
  }
  const nightA = await run({ ...deps, now: NIGHT_A });
  expect(nightA.status, JSON.stringify(nightA.errors)).toBe('succeeded');
  const dumpA = await dump(s.db);
  const [d] = await rows(s, `SELECT d.id, d.vehicle_id, d.position, d.axle_index, v.odometer_km FROM dampers d JOIN vehicles v ON v.id = d.vehicle_id
    WHERE d.removed_at IS NULL AND d.energy_j > 0 AND v.status = 'in_service' ORDER BY d.id LIMIT 1`);
  await s.db.sequelize.query(`UPDATE dampers SET removed_at = ?, removed_odometer_km = ?, removal_reason = 'leaking' WHERE id = ?`, { replacements: [DAY_B, d.odometer_km, d.id] });
  await s.db.sequelize.query(
    `INSERT INTO dampers (vehicle_id, position, axle_index, installed_at, installed_odometer_km, energy_j, fatigue_damage, life_used_fraction, created_at, updated_at)
     VALUES (?, ?, ?, ?, ?, 0, 0, 0, '2026-12-30 20:00:00.000 +00:00', '2026-12-30 20:00:00.000 +00:00')`,
    { replacements: [d.vehicle_id, d.position, d.axle_index, DAY_B, d.odometer_km] },
  );
  await lateTrip(s, Number(d.vehicle_id), '2026-11-21');
  await lateTrip(s, Number(d.vehicle_id), '2026-10-20');
  const nightB = await run({ ...deps, now: NIGHT_B });
  expect(nightB.status, JSON.stringify(nightB.errors)).toBe('succeeded');
  const specs = await rows(s, `SELECT id FROM suspension_specs ORDER BY id`);
  const fitted = await rows(s, `SELECT vehicle_id, id FROM dampers WHERE removed_at IS NULL ORDER BY vehicle_id, id`);
  const byVehicle = new Map<number, number[]>();
  for (const f of fitted) byVehicle.set(Number(f.vehicle_id), [...(byVehicle.get(Number(f.vehicle_id)) ?? []), Number(f.id)]);
  const read = wearReadRepository(s.db.sequelize);
  const out: History = {
    nightA: nightA.counts,
    nightB: nightB.counts,
    dumpA,
    dumpB: await dump(s.db),
    backtests: await Promise.all(specs.map((sp) => backtest(Number(sp.id), s.config.workshop.life, DAY_B))),
    byRoute: await Promise.all([...byVehicle.values()].map((ids) => read.dutyByRoute(ids))),
  };
  await after?.(s);
  return out;
}

/** The summary rows added up by their keys (a day folded in two runs has two rows that add up), and the route totals. */
const summary = async (s: TestServer) => ({
  days: await rows(
    s,
    `SELECT damper_id, vehicle_id, position, axle_index, day, severity_bin, SUM(records) AS records, SUM(distance_km) AS km, SUM(energy_j) AS e, SUM(spring_damage) AS f,
       SUM(km_dev1) AS d1, SUM(km_dev2) AS d2, SUM(km_dev4) AS d4, SUM(km_dev7) AS d7
     FROM trip_duty_days GROUP BY damper_id, vehicle_id, position, axle_index, day, severity_bin ORDER BY vehicle_id, position, damper_id, day, severity_bin`,
  ),
  routes: await rows(s, `SELECT * FROM damper_route_totals ORDER BY damper_id, route_id`),
});

describe('per-trip duty retention', () => {
  it('when the same history runs with a 61-day window and an unbounded one, then the folding night leaves the same tables bit for bit apart from the rows moved, the next night the same life models and wear to 1e-12; folding again changes nothing; a fold killed midway and run again ends the same', async () => {
    let short!: History;
    let shortSummary: Awaited<ReturnType<typeof summary>> = { days: [], routes: [] };
    const S = await startTestServer({ fleet: 'small', env: { ...NIGHTLY_TEST_ENV, TRIP_DUTY_RETENTION_DAYS: String(WINDOW) } });
    try {
      expect(S.config.tripDutyRetentionDays).toBe(WINDOW);
      short = await twoNights(S, true, async (s) => {
        shortSummary = await summary(s);
        // idempotent: with nothing older than the window a fold changes nothing
        const before = await dump(s.db);
        const counts: Record<string, number> = {};
        await foldOldDuty({ sequelize: s.db.sequelize, asOf: DAY_B, tripDutyRetentionDays: WINDOW, counts });
        expect(counts.dutyRowsFolded ?? 0).toBe(0);
        expect(diffTables(await dump(s.db), before)).toEqual([]);
      });
    } finally {
      await S.stop();
    }
    // the window was applied: the crashed run's three days and the rest of the month past it on
    // night A; on night B the late trip's day (folded before) and the day that left the window, if driven
    expect(short.nightA.dutyDaysFolded).toBeGreaterThanOrEqual(15);
    expect(short.nightB.dutyDaysFolded).toBeGreaterThanOrEqual(1);
    expect((short.dumpB.trip_duties as Row[]).every((r) => String(r.trip_date) >= retentionStart(DAY_B, WINDOW))).toBe(true);
    expect((short.dumpB.trip_duty_days as Row[]).length).toBeGreaterThan(0);

    const U = await startTestServer({ fleet: 'small', env: { ...NIGHTLY_TEST_ENV, TRIP_DUTY_RETENTION_DAYS: String(UNBOUNDED) } });
    try {
      const unbounded = await twoNights(U, false, async (s) => {
        // migration 0019 on a database with duty fills the severity totals the nights kept
        const bins = (await dump(s.db)).damper_severity_bins;
        await migrator(s.db).down({ to: '0019-duty-day-summary' });
        await migrator(s.db).up();
        expect(diffTablesNear({ bins: (await dump(s.db)).damper_severity_bins }, { bins }, 1e-12)).toEqual([]);
        // the same history folded in one go, in transactions of 40 rows (a day in several),
        // killed after 5 days and run again: the same per-trip rows left and the same summary as
        // the short window's nights
        const ctx = { sequelize: s.db.sequelize, asOf: DAY_B, tripDutyRetentionDays: WINDOW, batchTrips: 10, counts: {} as Record<string, number> };
        await expect(foldOldDuty({ ...ctx, failAfterFoldDays: 5 })).rejects.toThrow(/after folding 5 day/);
        await foldOldDuty(ctx);
        const after = await dump(s.db);
        expect(diffTables({ trip_duties: after.trip_duties }, { trip_duties: short.dumpB.trip_duties })).toEqual([]);
        const got = await summary(s);
        expect(diffTablesNear(got, shortSummary, 1e-12)).toEqual([]);
        expect(got.routes.length).toBeGreaterThan(0);
      });
      expect(unbounded.nightA.dutyDaysFolded ?? 0).toBe(0);
      expect(unbounded.nightB.dutyDaysFolded ?? 0).toBe(0);

      // night A: the fold is the night's last step, so every table is as without it, bit for
      // bit, but for the per-trip rows it moved into the summary
      expect(diffTables(without(short.dumpA, SUMMARY_TABLES), without(unbounded.dumpA, SUMMARY_TABLES))).toEqual([]);
      expect(short.dumpA.trip_duties).toEqual(kept(unbounded.dumpA, retentionStart(DAY_A, WINDOW)));
      const [tripRows, summaryRecords] = [(unbounded.dumpA.trip_duties as Row[]).length, (short.dumpA.trip_duty_days as Row[]).reduce((s, r) => s + Number(r.records), 0)];
      expect(summaryRecords).toBe(tripRows - (short.dumpA.trip_duties as Row[]).length);
      expect(summaryRecords).toBeGreaterThan(0);

      // night B reads the summary: the severity totals and life models bit for bit, the rest to 1e-12
      for (const t of ['damper_severity_bins', 'life_models', 'driver_exposure_days']) expect(diffTables({ [t]: short.dumpB[t] }, { [t]: unbounded.dumpB[t] }), t).toEqual([]);
      expect(diffTablesNear(without(short.dumpB, SUMMARY_TABLES), without(unbounded.dumpB, SUMMARY_TABLES), 1e-12)).toEqual([]);
      expect(short.dumpB.trip_duties).toEqual(kept(unbounded.dumpB, retentionStart(DAY_B, WINDOW)));
      expect(short.nightB.dampersUpdated).toBe(unbounded.nightB.dampersUpdated);
      expect(short.nightB.wearDays).toBe(unbounded.nightB.wearDays);
      // the removal moved a fitted b, so that spec's wear was summed again from fitting, through the summary
      expect(diffTables({ m: short.dumpA.life_models }, { m: short.dumpB.life_models })).not.toEqual([]);
      expect(short.backtests).toEqual(unbounded.backtests);
      expect((short.backtests as { points: unknown[] }[]).some((b) => b.points.length > 0)).toBe(true);
      expect(diffTablesNear({ byRoute: short.byRoute }, { byRoute: unbounded.byRoute }, 1e-12)).toEqual([]);
    } finally {
      await U.stop();
    }
  }, 900_000);
});
