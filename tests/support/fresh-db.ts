/**
 * An empty, migrated database in a temporary folder, with the models bound to it: for tests of
 * one repository that need the schema but not the demo fleet (and not the app around it).
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { migrate, openDb, type Db } from '../../server/db';

export async function freshDb(): Promise<Db & { dispose(): Promise<void> }> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'reboundry-fresh-'));
  const db = await openDb(path.join(dir, 'reboundry.sqlite'));
  await migrate(db);
  return {
    ...db,
    async dispose() {
      await db.close();
      fs.rmSync(dir, { recursive: true, force: true });
    },
  };
}
