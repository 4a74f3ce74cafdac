/**
 * Generates a synthetic fleet for the nightly-job benchmark into a fresh data folder:
 * 10 000 vehicles (40 000 dampers) of four specs at two depots, 400 routes of 25 segments
 * (ISO 8608 classes A–E; 5 % of routes carry a measured profile; each segment's roughness history,
 * with a change in the middle of the trips on every 10th route), and 30 000 unprocessed trips
 * over the last 30 days. Each vehicle has a done inspection 0–12 months ago. Deterministic
 * (seeded).
 *
 *     npx tsx tests/bench/nightly/generate-fleet.ts <dataDir> [vehicles] [trips]
 */
import fs from 'node:fs';
import path from 'node:path';
import { dbFile, migrate, openDb } from '../../../server/db';
import { sqlDate } from '../../../server/wear/repository';
import { gdForClass, seededRandom, synthesizeProfile, type IsoClass } from '../../../server/physics/iso8608';
import { formatProfileCsv, storeProfileFile } from '../../../server/roads/profile-store';

export interface FleetSize {
  vehicles: number;
  trips: number;
  routes: number;
  segmentsPerRoute: number;
}

export const BENCH_FLEET: FleetSize = { vehicles: 10_000, trips: 30_000, routes: 400, segmentsPerRoute: 25 };
export const BENCH_NOW = new Date('2026-11-30T12:00:00Z');

const SPECS = [
  { name: 'Courier van', axles: [[430, 46, 32000, 2400, 260000], [360, 55, 38000, 2500, 270000]], payload: 750 },
  { name: 'Long-body van', axles: [[600, 58, 45000, 3200, 300000], [520, 76, 56000, 3300, 320000]], payload: 1250 },
  { name: 'City bus', axles: [[1900, 380, 300000, 14000, 1500000], [2600, 600, 280000, 18000, 1700000]], payload: 3000 },
  { name: 'Rigid truck', axles: [[2400, 450, 600000, 28000, 1600000], [2100, 650, 260000, 20000, 1800000]], payload: 8000 },
];
const CLASSES: IsoClass[] = ['A', 'B', 'B', 'C', 'C', 'D', 'E'];

async function insert(db: Awaited<ReturnType<typeof openDb>>, table: string, cols: string[], rows: unknown[][], t: unknown) {
  const per = Math.floor(30000 / cols.length);
  for (let i = 0; i < rows.length; i += per) {
    const part = rows.slice(i, i + per);
    await db.sequelize.query(`INSERT INTO ${table} (${cols.join(',')}) VALUES ${part.map(() => `(${cols.map(() => '?').join(',')})`).join(',')}`, {
      replacements: part.flat() as never,
      transaction: t as never,
    });
  }
}

export async function generateFleet(dataDir: string, size: FleetSize = BENCH_FLEET) {
  fs.mkdirSync(dataDir, { recursive: true });
  const db = await openDb(dbFile(dataDir));
  await migrate(db);
  const rand = seededRandom(5150);
  const now = sqlDate(BENCH_NOW);
  const day = (d: Date) => d.toISOString().slice(0, 10);
  const DAY = 86_400_000;
  await db.sequelize.transaction(async (t) => {
    await insert(db, 'depots', ['id', 'name', 'lat', 'lon', 'created_at', 'updated_at'], [[1, 'North', 52.6, -1.5, now, now], [2, 'South', 52.4, -1.3, now, now]], t);
    await insert(db, 'users', ['id', 'name', 'email', 'role', 'password_hash', 'active', 'depot_id', 'created_at', 'updated_at'], [
      [1, 'Bench Manager', 'manager@bench.test', 'manager', 'x', 1, null, now, now],
      [2, 'Bench Mechanic N', 'mech.n@bench.test', 'mechanic', 'x', 1, 1, now, now],
      [3, 'Bench Mechanic S', 'mech.s@bench.test', 'mechanic', 'x', 1, 2, now, now],
    ], t);
    await insert(db, 'suspension_specs', ['id', 'name', 'vehicle_class', 'created_at', 'updated_at'], SPECS.map((s, i) => [i + 1, s.name, 'bench', now, now]), t);
    await insert(
      db,
      'spec_axles',
      ['spec_id', 'axle_index', 'label', 'sprung_mass_kg', 'unsprung_mass_kg', 'spring_rate_n_per_m', 'damping_ns_per_m', 'tire_rate_n_per_m', 'rated_damper_life_km', 'created_at', 'updated_at'],
      SPECS.flatMap((s, i) => s.axles.map((a, k) => [i + 1, k, k ? 'rear' : 'front', ...a, 90000, now, now])),
      t,
    );
    const routeRows: unknown[][] = [];
    const segRows: unknown[][] = [];
    const surveyRows: unknown[][] = [];
    const obsRows: unknown[][] = [];
    let segId = 1;
    for (let r = 1; r <= size.routes; r++) {
      const depot = (r % 2) + 1;
      const speed = 30 + Math.floor(rand() * 50);
      const surveyed = r % 20 === 0;
      const classes = Array.from({ length: size.segmentsPerRoute }, () => CLASSES[Math.floor(rand() * CLASSES.length)]);
      let surveyId: number | null = null;
      if (surveyed) {
        surveyId = surveyRows.length + 1;
        const parts = classes.map((c, k) => synthesizeProfile({ gdN0: gdForClass(c), lengthM: 100, dxM: 0.25, seed: r * 100 + k }));
        const elev = new Float64Array(parts.reduce((s, p) => s + p.length, 0) + 1);
        let o = 0;
        let offset = 0;
        for (const p of parts) {
          const shift = offset - p[0];
          for (let i = 0; i < p.length; i++) elev[o++] = p[i] + shift;
          offset = elev[o - 1];
        }
        elev[o] = offset;
        const file = storeProfileFile(dataDir, formatProfileCsv({ dxM: 0.25, startM: 0, elevationsM: elev }, 'bench'));
        surveyRows.push([surveyId, r, file, 'bench.csv', 0.25, 0, (elev.length - 1) * 0.25, elev.length, '2026-10-01', null, 1, now, now, now]);
      }
      routeRows.push([r, `Route ${r}`, depot, JSON.stringify({ type: 'LineString', coordinates: [[-1.5, 52.6], [-1.49, 52.61]] }), size.segmentsPerRoute * 100, speed, 100, now, now]);
      for (let k = 0; k < size.segmentsPerRoute; k++) {
        const c = classes[k];
        // each segment's observation history, as the duty phase reads it (the value in force on
        // the trip's day): the current value, an older stated class on every 4th route, and a
        // class set by hand in the middle of the trips on every 10th route
        obsRows.push([segId, gdForClass(c), c, surveyed ? 'survey' : 'stated', '2026-10-01', surveyId, now, now]);
        if (r % 4 === 0) obsRows.push([segId, gdForClass('B'), 'B', 'stated', '2026-06-01', null, now, now]);
        if (r % 10 === 0) obsRows.push([segId, gdForClass('D'), 'D', 'stated', '2026-11-15', null, now, now]);
        segRows.push([segId++, r, k, k * 100, (k + 1) * 100, '[[-1.5,52.6],[-1.49,52.61]]', null, null, gdForClass(c), c, surveyed ? 'survey' : 'stated', '2026-10-01', surveyId, now, now]);
      }
    }
    await insert(db, 'routes', ['id', 'name', 'depot_id', 'geometry', 'length_m', 'default_speed_kmh', 'segment_length_m', 'created_at', 'updated_at'], routeRows, t);
    if (surveyRows.length) {
      await insert(db, 'road_surveys', ['id', 'route_id', 'file_path', 'original_name', 'dx_m', 'start_m', 'end_m', 'point_count', 'surveyed_on', 'note', 'uploaded_by_id', 'uploaded_at', 'created_at', 'updated_at'], surveyRows, t);
    }
    await insert(db, 'route_segments', ['id', 'route_id', 'seq', 'start_m', 'end_m', 'geometry', 'speed_kmh', 'iri', 'gd_n0', 'iso_class', 'roughness_source', 'roughness_date', 'survey_id', 'created_at', 'updated_at'], segRows, t);
    await insert(db, 'roughness_observations', ['segment_id', 'gd_n0', 'iso_class', 'source', 'observed_on', 'survey_id', 'created_at', 'updated_at'], obsRows, t);

    const vehicles: unknown[][] = [];
    const dampers: unknown[][] = [];
    const inspections: unknown[][] = [];
    const trips: unknown[][] = [];
    for (let v = 1; v <= size.vehicles; v++) {
      const spec = (v % SPECS.length) + 1;
      const depot = (v % 2) + 1;
      const commissioned = day(new Date(BENCH_NOW.getTime() - (400 + Math.floor(rand() * 800)) * DAY));
      const odo = 20000 + Math.floor(rand() * 40000);
      vehicles.push([v, `B-${v}`, `BP${v}`, spec, depot, null, odo, 'in_service', commissioned, now, now]);
      for (const [k, pos] of ['FL', 'FR', 'RL', 'RR'].entries()) dampers.push([v, pos, k < 2 ? 0 : 1, commissioned, 0, 0, 0, 0, now, now]);
      const done = new Date(BENCH_NOW.getTime() - Math.floor(rand() * 365) * DAY);
      inspections.push([v, day(done), 'done', 'bench', sqlDate(done), odo - 5000, now, now]);
    }
    for (let i = 0; i < size.trips; i++) {
      const v = (i % size.vehicles) + 1;
      const route = 1 + ((v * 7 + i) % size.routes);
      const start = new Date(BENCH_NOW.getTime() - (1 + Math.floor(rand() * 29)) * DAY + Math.floor(rand() * 10) * 3_600_000);
      const speed = 25 + rand() * 50;
      const km = (size.segmentsPerRoute * 100) / 1000;
      trips.push([v, route, null, sqlDate(start), sqlDate(new Date(start.getTime() + (km / speed) * 3_600_000)), km, speed, Math.round(rand() * SPECS[(v % SPECS.length)].payload), now, now]);
    }
    await insert(db, 'vehicles', ['id', 'fleet_number', 'plate', 'spec_id', 'depot_id', 'driver_id', 'odometer_km', 'status', 'commissioned_at', 'created_at', 'updated_at'], vehicles, t);
    await insert(db, 'dampers', ['vehicle_id', 'position', 'axle_index', 'installed_at', 'installed_odometer_km', 'energy_j', 'fatigue_damage', 'life_used_fraction', 'created_at', 'updated_at'], dampers, t);
    await insert(db, 'inspections', ['vehicle_id', 'due_date', 'status', 'reason', 'completed_at', 'odometer_km', 'created_at', 'updated_at'], inspections, t);
    await insert(db, 'trips', ['vehicle_id', 'route_id', 'driver_id', 'started_at', 'ended_at', 'distance_km', 'mean_speed_kmh', 'payload_kg', 'created_at', 'updated_at'], trips, t);
  });
  await db.close();
}

if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(import.meta.filename)) {
  const dir = process.argv[2];
  if (!dir) {
    console.error('usage: npx tsx tests/bench/nightly/generate-fleet.ts <dataDir> [vehicles] [trips]');
    process.exit(2);
  }
  const size = { ...BENCH_FLEET, ...(process.argv[3] ? { vehicles: Number(process.argv[3]) } : {}), ...(process.argv[4] ? { trips: Number(process.argv[4]) } : {}) };
  const t0 = Date.now();
  await generateFleet(dir, size);
  console.log(`generated ${size.vehicles} vehicles, ${size.trips} trips, ${size.routes}×${size.segmentsPerRoute} segments in ${((Date.now() - t0) / 1000).toFixed(1)} s → ${dir}`);
}
