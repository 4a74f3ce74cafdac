import path from 'node:path';
import type { Config } from './config';
import { dbLocation, migrate, openDb, type Db } from './db';
import { isEmpty, seedDemo } from './demo/seed';
import type { DemoOptions } from './demo/seed-context';
import type { Logger } from './logger';

/**
 * Opens the database (DATABASE_URL, else the SQLite file under DATA_DIR), applies migrations and seeds the demo fleet when asked
 * (`onSeeded` is called when this start seeded it; `demo` may ask for a smaller demo fleet).
 */
export async function prepareDatabase(config: Config, log: Logger, now = new Date(), hooks: { onSeeded?: () => void; demo?: DemoOptions } = {}): Promise<Db> {
  const db = await openDb(dbLocation(config));
  const applied = await migrate(db);
  if (applied.length) log.info(`applied ${applied.length} migration(s): ${applied.map((m) => m.name).join(', ')}`);
  if (config.seedDemo && (await isEmpty())) {
    log.info('empty database: seeding the demo fleet (Brackenford Parcel & Freight)');
    await seedDemo(db, now, config.dataDir, hooks.demo);
    hooks.onSeeded?.();
  }
  return db;
}

export const defaultWebDir = path.resolve('dist/web');
