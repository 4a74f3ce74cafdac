import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { migrate, MIGRATIONS, openDb, type Db } from '../../../server/db';
import { defaultTestDatabase, emptyPostgresDatabase } from '../../support/server';

/**
 * Migrations run one process at a time, so app instances started together on one new database
 * both start (SQLite here, PostgreSQL in the pg project).
 */

const cleanups: (() => Promise<void> | void)[] = [];
afterEach(async () => {
  for (const c of cleanups.splice(0).reverse()) await c();
});

/** A new empty database, opened twice, as two app instances would open it. */
async function twoOpenings(): Promise<{ a: Db; b: Db; file: string | null }> {
  let location: string;
  if (defaultTestDatabase() === 'postgres') {
    const pg = (await emptyPostgresDatabase())!;
    cleanups.push(() => pg.drop());
    location = pg.url;
  } else {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'reboundry-migrate-'));
    cleanups.push(() => fs.rmSync(dir, { recursive: true, force: true }));
    location = path.join(dir, 'reboundry.sqlite');
  }
  const a = await openDb(location);
  const b = await openDb(location);
  cleanups.push(() => a.close(), () => b.close());
  return { a, b, file: a.file };
}

const applied = async (db: Db) =>
  (await db.sequelize.query<{ name: string }>('SELECT name FROM schema_migrations ORDER BY name', { type: QueryTypes.SELECT })).map((r) => r.name);

describe('migrations from several processes at once', () => {
  it('when two openings of one new database migrate at the same moment, then both succeed and each migration is applied once', async () => {
    const { a, b } = await twoOpenings();
    const [ra, rb] = await Promise.all([migrate(a), migrate(b)]);
    // one of them applied every migration, the other found none pending
    expect([ra.length, rb.length].sort((x, y) => x - y)).toEqual([0, MIGRATIONS.length]);
    expect(await applied(a)).toEqual(MIGRATIONS.map((m) => m.name).sort());
  });

  it.skipIf(defaultTestDatabase() === 'postgres')('when the SQLite lock file names a process that has died, then the migration takes the lock over and removes it after', async () => {
    const { a, file } = await twoOpenings();
    const gone = spawnSync(process.execPath, ['-e', '']).pid!;
    fs.writeFileSync(`${file}.migrating`, String(gone));
    expect((await migrate(a)).length).toBe(MIGRATIONS.length);
    expect(fs.existsSync(`${file}.migrating`)).toBe(false);
  });

  it.skipIf(defaultTestDatabase() === 'postgres')('when the SQLite lock file names a running process, then the migration waits until it is gone', async () => {
    const { a, file } = await twoOpenings();
    fs.writeFileSync(`${file}.migrating`, String(process.pid));
    let done = false;
    const run = migrate(a).then((r) => ((done = true), r));
    await new Promise((r) => setTimeout(r, 400));
    expect(done).toBe(false);
    fs.rmSync(`${file}.migrating`);
    expect((await run).length).toBe(MIGRATIONS.length);
  });
});
