import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { loadConfig } from '../../server/config';
import { createLogger } from '../../server/logger';
import { dbFile, openDb, type Db } from '../../server/db';
import { createMailer } from '../../server/mail/mailer';
import { selectRows } from '../../server/db/raw';
import { run } from '../../jobs/nightly';
import { plusDays } from '../../server/lib/days';
import { generateFleet } from '../bench/nightly/generate-fleet';

/**
 * What one night costs, counted as work done, once the history is longer than the per-trip
 * window: the same after 100 days of trips as after a year. A small synthetic fleet (the
 * benchmark's generator: dampers fitted at commissioning, more than 400 days ago, and no
 * removals, so the life model stays the prior and its road sensitivity b does not move) with one
 * trip per vehicle and day, each with a driver, and the shortest window allowed (61 days). The
 * history is processed by one night; then each vehicle drives one more day and the next night
 * is measured: trips simulated, rows written (per-trip duty, severity totals, wear days, summary
 * rows, exposure days) and rows read from the duty history (the life refit's severity totals,
 * the wear phase's per-trip and summary rows, the exposure step's front-axle rows), rows moved by
 * the fold. After a month the window is not yet full: the exposure step reads and writes the 30
 * days there are instead of 61, and no day leaves the window; the rest is the same, but for the
 * refit's severity totals, one per damper and band driven in (bounded by dampers × bands).
 *
 * A night on which a spec's fitted b moves sums that spec's wear again from each damper's
 * fitting, which does grow with the history (docs/methods.md, "Per-trip duty retention").
 */

const VEHICLES = 12;
const WINDOW = 61;
const DAY = '2026-11-30';
const TONIGHT = plusDays(DAY, 1);
const STAMP = '2026-11-30 12:00:00.000 +00:00';

/** The counts that measure a night's work. */
const WORK = [
  'trips',
  'dutyRecords',
  'segments',
  'closedFormSolves',
  'profileSimulations',
  'severityBinsWritten',
  'lifeBandRows',
  'dampersUpdated',
  'wearDays',
  'wearDutyRowsRead',
  'predictions',
  'exposureDutyRows',
  'exposureDays',
  'dutyRowsFolded',
  'dutySummaryRowsWritten',
  'dutyDaysFolded',
] as const;
/** The counts that grow until the history fills the window. */
const UNTIL_FULL = new Set(['exposureDutyRows', 'exposureDays', 'dutyRowsFolded', 'dutySummaryRowsWritten', 'dutyDaysFolded']);

const dirs: string[] = [];
afterAll(() => {
  for (const d of dirs) fs.rmSync(d, { recursive: true, force: true });
});

async function addTrips(db: Db, days: string[]) {
  const values: unknown[] = [];
  for (const day of days)
    for (let v = 1; v <= VEHICLES; v++) values.push(v, 1 + (v % 5), 100 + v, `${day} 08:00:00.000 +00:00`, `${day} 08:01:00.000 +00:00`, 0.5, 30 + v, 50 * v, STAMP, STAMP);
  for (let i = 0; i < values.length; i += 10 * 500) {
    const part = values.slice(i, i + 10 * 500);
    await db.sequelize.query(
      `INSERT INTO trips (vehicle_id, route_id, driver_id, started_at, ended_at, distance_km, mean_speed_kmh, payload_kg, created_at, updated_at) VALUES ${Array.from({ length: part.length / 10 }, () => '(?,?,?,?,?,?,?,?,?,?)').join(',')}`,
      { replacements: part as never },
    );
  }
}

/** The measured night's work counts after `historyDays` days of trips, and the per-trip rows left. */
async function nightAfter(historyDays: number, retentionDays = WINDOW) {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'reboundry-retention-cost-'));
  dirs.push(dir);
  await generateFleet(dir, { vehicles: VEHICLES, trips: 0, routes: 5, segmentsPerRoute: 5 });
  const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: dir, FAKE_SMTP_PORT: '0', LOG_LEVEL: 'error', SEED_DEMO: 'false', NIGHTLY_WORKERS: '0', TRIP_DUTY_RETENTION_DAYS: String(retentionDays) });
  const log = createLogger('error');
  const db = await openDb(dbFile(dir));
  const { mailer } = await createMailer(config, log);
  try {
    const drivers = Array.from({ length: VEHICLES }, (_, i) => [100 + i + 1, `Driver ${i + 1}`, `driver${i + 1}@bench.test`]);
    await db.sequelize.query(
      `INSERT INTO users (id, name, email, role, password_hash, active, created_at, updated_at) VALUES ${drivers.map(() => `(?, ?, ?, 'driver', 'x', 1, '${STAMP}', '${STAMP}')`).join(',')}`,
      { replacements: drivers.flat() as never },
    );
    await addTrips(db, Array.from({ length: historyDays }, (_, i) => plusDays(DAY, -i)));
    const deps = { db, config, log, mailer, trigger: 'test' as const };
    const history = await run({ ...deps, now: new Date(`${DAY}T12:00:00Z`) });
    expect(history.status, JSON.stringify(history.errors)).toBe('succeeded');
    expect(history.counts.trips).toBe(historyDays * VEHICLES);
    await addTrips(db, [TONIGHT]);
    const night = await run({ ...deps, now: new Date(`${TONIGHT}T12:00:00Z`) });
    expect(night.status, JSON.stringify(night.errors)).toBe('succeeded');
    const [{ n: tripDuties }] = await selectRows<{ n: number }>(db.sequelize, `SELECT COUNT(*) AS n FROM trip_duties`);
    const work = Object.fromEntries(WORK.map((k) => [k, night.counts[k] ?? 0]));
    return { work, tripDuties: Number(tripDuties), lifeModelsFitted: night.counts.lifeModelsFitted };
  } finally {
    await mailer.close();
    await db.close();
  }
}

describe('nightly cost with the per-trip retention', () => {
  it('when one more day is driven after a year of history, then the night does the same work as after 100 days (and as after a month but for the exposure days and the fold, which grow until the 61-day window is full) and keeps the same per-trip rows, where with no window they pile up', async () => {
    const month = await nightAfter(30);
    const quarter = await nightAfter(100);
    const year = await nightAfter(365);
    const unbounded = await nightAfter(365, 36500);
    // the figures, for the record (docs/methods.md quotes them)
    console.log(JSON.stringify({ month, quarter, year, unbounded }));
    expect(year.lifeModelsFitted).toBe(0);
    expect(year.work).toEqual(quarter.work);
    expect(year.tripDuties).toBe(quarter.tripDuties);
    expect(year.tripDuties).toBe(WINDOW * VEHICLES * 4);
    // one trip simulated per vehicle; its four corners' duty written and only those summed into wear
    expect(year.work.trips).toBe(VEHICLES);
    expect(year.work.dutyRecords).toBe(VEHICLES * 4);
    expect(year.work.wearDays).toBe(VEHICLES * 4);
    expect(year.work.wearDutyRowsRead).toBe(VEHICLES * 4);
    // the day that left the window, folded: a day row and a route row per damper
    expect(year.work.exposureDutyRows).toBe(WINDOW * VEHICLES * 2);
    // with no window the night reads the same (no reader of the night goes past the exposure
    // days and the new trips' duty), but the per-trip rows pile up: four per trip
    const { dutyRowsFolded, dutySummaryRowsWritten, dutyDaysFolded } = year.work;
    expect(unbounded.work).toEqual({ ...year.work, dutyRowsFolded: 0, dutySummaryRowsWritten: 0, dutyDaysFolded: 0 });
    expect({ dutyRowsFolded, dutySummaryRowsWritten, dutyDaysFolded }).toEqual({ dutyRowsFolded: VEHICLES * 4, dutySummaryRowsWritten: 2 * VEHICLES * 4, dutyDaysFolded: 1 });
    expect(unbounded.tripDuties).toBe(366 * VEHICLES * 4);
    for (const k of WORK) {
      if (UNTIL_FULL.has(k)) expect(month.work[k], k).toBeLessThan(year.work[k]);
      // one severity total per damper and band it has driven in, whatever the days: the longer
      // histories reach back past 1 October, before which every 4th route was a stated class B
      else if (k === 'lifeBandRows') expect(month.work[k], k).toBeLessThanOrEqual(year.work[k]);
      else expect(month.work[k], k).toBe(year.work[k]);
    }
  }, 600_000);
});
