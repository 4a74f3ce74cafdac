import { afterAll, afterEach, beforeAll, expect, vi } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import { AppError } from '../../../server/errors';
import { tripsService } from '../../../server/trips/service';
import { lateBound, startTestServer, TEST_NOW, type TestServer } from '../../support/server';

/** A driver whose account is deactivated, and their name. */
export const DEACTIVATED = 'marta.sokol@reboundry.test';

export const HEADER = 'vehicle,route,driver_email,start,end,distance_km,mean_speed_kmh,payload_kg';
export const file = (...rows: string[]) => [HEADER, ...rows].join('\n');
/** Hours after 2025-01-01 of the next row's default start: each row of the file its own hour. */
let hour = 0;
/**
 * One row of a trip file; the defaults are a plain 40-minute trip of CV-118 in an hour of its own
 * between 2025-01 and 2026-06 (the demo's trips start on 2026-10-01; the imports write September 2026).
 */
export const row = (o: Partial<Record<'vehicle' | 'route' | 'driver' | 'start' | 'end' | 'km' | 'kmh' | 'kg', string>> = {}) => {
  const start = Date.UTC(2025, 0, 1) + hour++ * 3_600_000;
  const iso = (t: number) => new Date(t).toISOString().replace('.000Z', 'Z');
  return [o.vehicle ?? 'CV-118', o.route ?? 'Tanner Way town loop', o.driver ?? '', o.start ?? iso(start), o.end ?? iso(start + 40 * 60_000), o.km ?? '14', o.kmh ?? '30', o.kg ?? ''].join(',');
};

/** Each row's problems, by row number. */
export async function problemsOf(text: string) {
  const { rows } = await tripsService.checkCsv(text, TEST_NOW);
  return Object.fromEntries(rows.map((r) => [r.row, r.problems]));
}

export async function refusal(p: Promise<unknown>): Promise<AppError> {
  const e = await p.then(
    () => null,
    (err: unknown) => err,
  );
  expect(e).toBeInstanceOf(AppError);
  return e as AppError;
}

/** The demo's first trip of CV-101 (driven by driver@reboundry.test, 2026-10-01 05:43–08:45:02.6 UTC). */
type FirstTrip = { id: number; vehicle_id: number; driver_id: number; started_at: string; ended_at: string };

/**
 * The file's own test server for the trip rules called directly, with {@link DEACTIVATED}'s account
 * deactivated: its database (`sq`), the demo's first trip of CV-101 (`first`) and the number of
 * trips and imports stored (`counts`). Mocks are restored after each test.
 */
export function tripRulesFixture() {
  let srv: TestServer | undefined;
  let firstTrip: FirstTrip | undefined;
  beforeAll(async () => {
    srv = await startTestServer();
    const db = srv.db.sequelize;
    await db.query('UPDATE users SET active = FALSE WHERE email = ?', { replacements: [DEACTIVATED] });
    [firstTrip] = await db.query<FirstTrip>('SELECT id, vehicle_id, driver_id, started_at, ended_at FROM trips WHERE vehicle_id = 1 ORDER BY started_at LIMIT 1', { type: QueryTypes.SELECT });
  }, 120_000);
  afterAll(async () => {
    await srv?.stop();
  });
  afterEach(() => {
    vi.restoreAllMocks();
  });
  const sq = lateBound<Sequelize>(() => srv?.db.sequelize, 'the test server');
  const counts = async () => {
    const [r] = await sq.query<{ trips: number; imports: number }>('SELECT (SELECT COUNT(*) FROM trips) AS trips, (SELECT COUNT(*) FROM trip_imports) AS imports', { type: QueryTypes.SELECT });
    return r;
  };
  return { sq, first: lateBound(() => firstTrip, 'the first trip'), counts };
}
