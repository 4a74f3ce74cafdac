/**
 * A small fleet written by hand into a migrated temporary SQLite file, for the wear area's
 * storage and route tests (no app booted): spec 1 (two axles), spec 2 (no axles); route 1 with
 * three segments (B, surveyed on 12 November and again on 27 November; C then E from 20
 * November; unrated), route 2 never driven. Vehicle 1 (spec 1, dampers fitted 1 September at
 * 25 000 km, the front-left one before it removed that day, the rear-right one fitted 12
 * November, odometer 30 000 km), vehicle 2 (spec 1, retired), vehicle 3 (spec 2).
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Sequelize } from 'sequelize';
import { migrate, openDb, type Db } from '../../server/db';
import type { AxleInput } from '../../server/wear/duty';
import { sqlDate } from '../../server/wear/repository';
import { gdForClass, synthesizeProfile } from '../../server/physics/iso8608';

export const TZ = 'Europe/Berlin';
export const NOW = new Date('2026-11-30T12:00:00Z');
export const AS_OF = '2026-11-30';
/** Trips that started before this instant (the start of 1 December in Berlin) are processed. */
export const BEFORE = new Date('2026-11-30T23:00:00Z');
export const STAMP = sqlDate(NOW);

export const FRONT = { sprungMassKg: 450, unsprungMassKg: 45, springRateNPerM: 38000, dampingNsPerM: 2800, tireRateNPerM: 260000 };
export const REAR = { sprungMassKg: 520, unsprungMassKg: 76, springRateNPerM: 56000, dampingNsPerM: 3300, tireRateNPerM: 320000 };
export const AXLES: AxleInput[] = [
  { axleIndex: 0, corner: FRONT, ratedDamperLifeKm: 90000 },
  { axleIndex: 1, corner: REAR, ratedDamperLifeKm: 80000 },
];
/** The measured profile of survey 1 (segment 11 from 12 November on), class B. */
export const PROFILE = { dxM: 0.25, startM: 0, elevationsM: synthesizeProfile({ gdN0: gdForClass('B'), lengthM: 700, dxM: 0.25, seed: 3 }) };

export async function insert(sequelize: Sequelize, table: string, cols: string[], rows: unknown[][]) {
  if (!rows.length) return;
  await sequelize.query(`INSERT INTO ${table} (${cols.join(',')}) VALUES ${rows.map(() => `(${cols.map(() => '?').join(',')})`).join(',')}`, { replacements: rows.flat() as never });
}

/** The trips: id, vehicle, start and end (UTC), km, km/h, payload [kg]. */
export const TRIPS: [number, number, string, string, number, number, number | null][] = [
  // id, vehicle, start (UTC), end (UTC), km, km/h, payload
  [1, 1, '2026-11-10T08:00:00Z', '2026-11-10T08:03:00Z', 2.4, 48, 300],
  [2, 1, '2026-11-10T23:30:00Z', '2026-11-10T23:33:36Z', 2.4, 40, null],
  [3, 1, '2026-11-15T09:00:00Z', '2026-11-15T09:02:00Z', 2.4, 72, 800],
  [4, 1, '2026-11-28T09:00:00Z', '2026-11-28T09:03:00Z', 2.4, 48, 0],
  [5, 2, '2026-11-12T09:00:00Z', '2026-11-12T09:03:00Z', 2.4, 48, 100],
  [6, 3, '2026-11-12T09:00:00Z', '2026-11-12T09:03:00Z', 2.4, 48, 100],
  // after the run's day (1 December in Berlin): left for the next run
  [7, 1, '2026-11-30T23:10:00Z', '2026-11-30T23:13:00Z', 2.4, 48, 0],
];

async function seed(sequelize: Sequelize) {
  await insert(sequelize, 'depots', ['id', 'name', 'lat', 'lon', 'created_at', 'updated_at'], [[1, 'North', 52.6, -1.5, STAMP, STAMP]]);
  await insert(sequelize, 'suspension_specs', ['id', 'name', 'vehicle_class', 'created_at', 'updated_at'], [[1, 'Van', 'van', STAMP, STAMP], [2, 'Empty', 'van', STAMP, STAMP]]);
  await insert(
    sequelize,
    'spec_axles',
    ['spec_id', 'axle_index', 'label', 'sprung_mass_kg', 'unsprung_mass_kg', 'spring_rate_n_per_m', 'damping_ns_per_m', 'tire_rate_n_per_m', 'rated_damper_life_km', 'created_at', 'updated_at'],
    AXLES.map((a) => [1, a.axleIndex, a.axleIndex ? 'rear' : 'front', a.corner.sprungMassKg, a.corner.unsprungMassKg, a.corner.springRateNPerM, a.corner.dampingNsPerM, a.corner.tireRateNPerM, a.ratedDamperLifeKm, STAMP, STAMP]),
  );
  const geo = JSON.stringify({ type: 'LineString', coordinates: [[-1.5, 52.6], [-1.49, 52.61]] });
  await insert(sequelize, 'routes', ['id', 'name', 'depot_id', 'geometry', 'length_m', 'default_speed_kmh', 'segment_length_m', 'created_at', 'updated_at'], [
    [1, 'Ring', 1, geo, 2000, 50, 700, STAMP, STAMP],
    [2, 'Spur', 1, geo, 1000, 50, 1000, STAMP, STAMP],
  ]);
  await insert(sequelize, 'road_surveys', ['id', 'route_id', 'file_path', 'original_name', 'dx_m', 'start_m', 'end_m', 'point_count', 'surveyed_on', 'note', 'uploaded_by_id', 'uploaded_at', 'created_at', 'updated_at'], [
    [1, 1, 'x.csv', 'x.csv', 0.25, 0, 700, PROFILE.elevationsM.length, '2026-11-12', null, null, STAMP, STAMP, STAMP],
    [2, 1, 'gone.csv', 'gone.csv', 0.25, 0, 700, 10, '2026-11-27', null, null, STAMP, STAMP, STAMP],
  ]);
  const segCols = ['id', 'route_id', 'seq', 'start_m', 'end_m', 'geometry', 'speed_kmh', 'iri', 'gd_n0', 'iso_class', 'roughness_source', 'roughness_date', 'survey_id', 'created_at', 'updated_at'];
  const line = '[[-1.5,52.6],[-1.49,52.61]]';
  await insert(sequelize, 'route_segments', segCols, [
    [11, 1, 0, 0, 700, line, null, null, gdForClass('B'), 'B', 'survey', '2026-11-27', 2, STAMP, STAMP],
    [12, 1, 1, 700, 1400, line, 30, null, gdForClass('E'), 'E', 'stated', '2026-11-20', null, STAMP, STAMP],
    [13, 1, 2, 1400, 2000, line, null, null, null, null, null, null, null, STAMP, STAMP],
    [21, 2, 0, 0, 1000, line, null, null, gdForClass('D'), 'D', 'stated', '2026-10-01', null, STAMP, STAMP],
  ]);
  await insert(sequelize, 'roughness_observations', ['segment_id', 'gd_n0', 'iso_class', 'source', 'observed_on', 'survey_id', 'created_at', 'updated_at'], [
    [11, gdForClass('B'), 'B', 'stated', '2026-10-01', null, STAMP, STAMP],
    [11, gdForClass('B'), 'B', 'survey', '2026-11-12', 1, STAMP, STAMP],
    [11, gdForClass('B'), 'B', 'survey', '2026-11-27', 2, STAMP, STAMP],
    [12, gdForClass('C'), 'C', 'stated', '2026-10-01', null, STAMP, STAMP],
    [12, gdForClass('E'), 'E', 'stated', '2026-11-20', null, STAMP, STAMP],
    [21, gdForClass('D'), 'D', 'stated', '2026-10-01', null, STAMP, STAMP],
  ]);
  await insert(sequelize, 'vehicles', ['id', 'fleet_number', 'plate', 'spec_id', 'depot_id', 'driver_id', 'odometer_km', 'status', 'commissioned_at', 'created_at', 'updated_at'], [
    [1, 'V-1', 'P1', 1, 1, null, 30000, 'in_service', '2026-01-01', STAMP, STAMP],
    [2, 'V-2', 'P2', 1, 1, null, 12000, 'retired', '2026-01-01', STAMP, STAMP],
    [3, 'V-3', 'P3', 2, 1, null, 5000, 'in_service', '2026-01-01', STAMP, STAMP],
  ]);
  const dCols = ['id', 'vehicle_id', 'position', 'axle_index', 'installed_at', 'installed_odometer_km', 'removed_at', 'removed_odometer_km', 'energy_j', 'fatigue_damage', 'life_used_fraction', 'created_at', 'updated_at'];
  await insert(sequelize, 'dampers', dCols, [
    [100, 1, 'FL', 0, '2026-03-01', 10000, '2026-09-01', 25000, 0, 0, 0, STAMP, STAMP],
    [101, 1, 'FL', 0, '2026-09-01', 25000, null, null, 0, 0, 0, STAMP, STAMP],
    [102, 1, 'FR', 0, '2026-09-01', 25000, null, null, 0, 0, 0, STAMP, STAMP],
    [103, 1, 'RL', 1, '2026-09-01', 25000, null, null, 0, 0, 0, STAMP, STAMP],
    [104, 1, 'RR', 1, '2026-11-12', 29990, null, null, 0, 0, 0, STAMP, STAMP],
    [201, 2, 'FL', 0, '2026-06-01', 9000, null, null, 0, 0, 0, STAMP, STAMP],
    [202, 2, 'FR', 0, '2026-06-01', 9000, null, null, 0, 0, 0, STAMP, STAMP],
  ]);
  await insert(
    sequelize,
    'trips',
    ['id', 'vehicle_id', 'route_id', 'driver_id', 'started_at', 'ended_at', 'distance_km', 'mean_speed_kmh', 'payload_kg', 'created_at', 'updated_at'],
    TRIPS.map(([id, v, s, e, km, kmh, payload]) => [id, v, 1, null, sqlDate(new Date(s)), sqlDate(new Date(e)), km, kmh, payload, STAMP, STAMP]),
  );
}

/** The migrations and this file, hashed: a cached template written from other ones is never used. */
function templateKey(): string {
  const h = crypto.createHash('sha256');
  const dir = path.resolve('server/db/migrations');
  for (const f of fs.readdirSync(dir).sort()) h.update(f).update(fs.readFileSync(path.join(dir, f)));
  h.update(fs.readFileSync(fileURLToPath(import.meta.url)));
  return h.digest('hex').slice(0, 16);
}

/**
 * A migrated database with the fleet, written once while the migrations and this file are
 * unchanged (kept in the temp folder, so a mutation run does not migrate for every mutant);
 * each test gets its own copy.
 */
export async function wearFleetTemplate(): Promise<{ fresh: (from?: string) => Promise<{ db: Db; dir: string; file: string; done: () => Promise<void> }> }> {
  const dir = path.join(os.tmpdir(), `reboundry-wear-fleet-${templateKey()}`);
  if (!fs.existsSync(path.join(dir, 'db.sqlite'))) {
    const work = fs.mkdtempSync(path.join(os.tmpdir(), 'reboundry-wear-fleet-seeding-'));
    const t = await openDb(path.join(work, 'db.sqlite'));
    await migrate(t);
    await seed(t.sequelize);
    await t.sequelize.query('PRAGMA wal_checkpoint(TRUNCATE)');
    await t.close();
    try {
      fs.renameSync(work, dir);
    } catch {
      // another worker put its template in place first
      fs.rmSync(work, { recursive: true, force: true });
    }
  }
  return {
    /** A copy of the template, or of `from` (a database file written from it). */
    fresh: async (from = path.join(dir, 'db.sqlite')) => {
      const run = fs.mkdtempSync(path.join(os.tmpdir(), 'reboundry-wear-fleet-run-'));
      const file = path.join(run, 'db.sqlite');
      fs.copyFileSync(from, file);
      const db = await openDb(file);
      return { db, dir: run, file, done: async () => { await db.close(); fs.rmSync(run, { recursive: true, force: true }); } };
    },
  };
}
