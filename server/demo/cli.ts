import 'dotenv/config';
import { parseArgs } from 'node:util';
import { loadConfig } from '../config';
import { dbLocation, migrate, openDb } from '../db/index';
import { clearAll, isEmpty, seedDemo } from './seed';

/** `npm run seed [-- --reset]`: seeds the demo fleet into an empty database, or rebuilds it. */
async function main() {
  const { values } = parseArgs({ options: { reset: { type: 'boolean', default: false } } });
  const config = loadConfig();
  const db = await openDb(dbLocation(config));
  await migrate(db);
  if (!values.reset && !(await isEmpty())) {
    console.error('The database already holds data; run `npm run seed -- --reset` to wipe it and reseed the demo fleet.');
    process.exitCode = 1;
  } else {
    if (values.reset) await clearAll(db, config.dataDir);
    await seedDemo(db, new Date(), config.dataDir);
    console.log(`Demo fleet seeded into ${db.file ?? 'the PostgreSQL database'}`);
  }
  await db.close();
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
