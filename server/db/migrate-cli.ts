import 'dotenv/config';
import { loadConfig } from '../config';
import { dbLocation, migrate, openDb } from './index';

async function main() {
  const config = loadConfig();
  const db = await openDb(dbLocation(config));
  const applied = await migrate(db);
  console.log(applied.length ? `Applied: ${applied.map((m) => m.name).join(', ')}` : 'Schema is up to date.');
  await db.close();
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
