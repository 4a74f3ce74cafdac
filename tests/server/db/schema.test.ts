import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { MIGRATIONS, migrator, openDb, type Db } from '../../../server/db';
import { selectRows } from '../../../server/db/raw';

/** Each table and index by name, with the statement SQLite keeps for it (none for its own indexes of UNIQUE and PRIMARY KEY columns). */
async function schema(db: Db): Promise<Map<string, string>> {
  const rows = await selectRows<{ name: string; sql: string | null }>(db.sequelize, 'SELECT name, sql FROM sqlite_master ORDER BY name');
  return new Map(rows.map((r) => [r.name, r.sql === null ? `-- ${r.name} (made by SQLite)` : `${r.sql};`]));
}

/**
 * A shipped migration must go on doing what it did: the databases in the field were built by it.
 * migrated-schema.sql records, migration by migration on an empty database, each table and index
 * it made or changed and each it dropped; a rewrite of a migration's text must leave that file
 * byte for byte as it is. A new migration adds to it on purpose:
 * `npx vitest run --project unit tests/server/db/schema.test.ts -u` writes it anew, and the diff
 * shows what the migration does.
 */
describe('the migrated schema', () => {
  it('when the migrations run one by one on an empty database, then each makes, changes and drops the tables and indexes recorded in migrated-schema.sql', async () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'reboundry-schema-'));
    const db = await openDb(path.join(dir, 'schema.sqlite'));
    const steps: string[] = [];
    try {
      let before = await schema(db);
      for (const { name } of MIGRATIONS) {
        await migrator(db).up({ to: name });
        const after = await schema(db);
        const changed = [...after].filter(([k, sql]) => before.get(k) !== sql).map(([, sql]) => sql);
        const dropped = [...before.keys()].filter((k) => !after.has(k)).map((k) => `-- dropped: ${k}`);
        steps.push([`-- after ${name}`, ...changed, ...dropped].join('\n\n'));
        before = after;
      }
    } finally {
      await db.close();
      fs.rmSync(dir, { recursive: true, force: true });
    }
    await expect(steps.join('\n\n\n') + '\n').toMatchFileSnapshot('./migrated-schema.sql');
  });
});
