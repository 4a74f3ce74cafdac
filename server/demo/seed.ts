/**
 * The demo fleet: Brackenford Parcel & Freight, a fictional regional carrier with two depots,
 * three suspension specs, 44 vehicles, 12 routes and 60 days of trips. Every number here is
 * invented for the demo (the suspension parameters sit inside the typical ranges of
 * docs/methods.md "Typical parameters"); deterministic for a given "today". One step a file:
 * people, specs and vehicles (fleet.ts), roads (roads.ts), trips (trips.ts), damper histories
 * (histories.ts), all drawing from one random sequence in this order.
 */
import { startOfDay } from 'date-fns';
import type { Db } from '../db/index';
import path from 'node:path';
import fs from 'node:fs';
import { User } from '../db/models';
import { hashPassword } from '../users/service';
import { seededRandom } from '../physics/iso8608';
import { SURVEY_DIR } from '../roads/profile-store';
import { seedPeople, seedSpecs, seedVehicles } from './fleet';
import type { DemoOptions } from './seed-context';
import { seedRoutes } from './roads';
import { seedTrips } from './trips';
import { seedHistories } from './histories';

export const DEMO_PASSWORD = 'reboundry-demo';

/**
 * Empties every table the migrations made (all but the migration log), for `seed --reset`, and
 * removes the files the app keeps under its data folder (surveys, photos, attachments).
 */
export async function clearAll(db: Db, dataDir: string = path.dirname(db.file ?? '.')) {
  if (db.dialect === 'postgres') {
    const [rows] = await db.sequelize.query(`SELECT tablename AS name FROM pg_tables WHERE schemaname = current_schema() AND tablename <> 'schema_migrations'`);
    // one statement: foreign keys between the tables emptied together do not get in the way
    const names = (rows as { name: string }[]).map(({ name }) => `"${name}"`);
    if (names.length) await db.sequelize.query(`TRUNCATE ${names.join(', ')} RESTART IDENTITY`);
  } else {
    const [rows] = await db.sequelize.query(
      `SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' AND name <> 'schema_migrations'`,
    );
    await db.sequelize.transaction(async (transaction) => {
      // checked at commit, when every table is empty, so the order of the deletes does not matter
      await db.sequelize.query('PRAGMA defer_foreign_keys = ON', { transaction });
      for (const { name } of rows as { name: string }[]) await db.sequelize.query(`DELETE FROM "${name}"`, { transaction });
      await db.sequelize.query(`DELETE FROM sqlite_sequence`, { transaction }).catch(() => undefined);
    });
  }
  // only the app's own folders: DATA_DIR may hold other things
  for (const dir of [SURVEY_DIR, 'attachments', 'ride-photos']) fs.rmSync(path.join(dataDir, dir), { recursive: true, force: true });
}

export async function isEmpty(): Promise<boolean> {
  return (await User.count()) === 0;
}

/**
 * Seeds the demo fleet into an empty, migrated database. `now` fixes "today". Survey profile
 * files go under `dataDir` (default: the database file's folder, i.e. DATA_DIR); `demo` may ask
 * for fewer vehicles.
 */
export async function seedDemo(db: Db, now: Date = new Date(), dataDir: string = path.dirname(db.file ?? '.'), demo: DemoOptions = {}) {
  fs.mkdirSync(path.join(dataDir, SURVEY_DIR), { recursive: true });
  const rand = seededRandom(20261201);
  const today = startOfDay(now);
  const pw = await hashPassword(DEMO_PASSWORD);

  await db.sequelize.transaction(async (transaction) => {
    const ctx = { db, transaction, opts: { transaction }, rand, today, now, dataDir, demo };
    const { depots, drivers } = await seedPeople(ctx, pw);
    const specs = await seedSpecs(ctx);
    const routeRows = await seedRoutes(ctx, depots);
    const vehicles = await seedVehicles(ctx, specs, depots, drivers);
    const trips = await seedTrips(ctx, vehicles, routeRows, drivers);
    await seedHistories(ctx, vehicles, trips);
  });
}
