import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDb, type Db } from '../../../server/db';
import { selectRows } from '../../../server/db/raw';

/** Sequelize opens a new sqlite3 connection for each transaction; each must get the app's settings. */
describe('database connections', () => {
  let db: Db;
  let dir: string;
  beforeAll(async () => {
    dir = fs.mkdtempSync(path.join(os.tmpdir(), 'reboundry-conn-'));
    db = await openDb(path.join(dir, 'conn.sqlite'));
  });
  afterAll(async () => {
    await db.close();
    fs.rmSync(dir, { recursive: true, force: true });
  });

  it('when a transaction runs on its own connection, then it has WAL mode, synchronous NORMAL and foreign keys on, like the shared connection', async () => {
    const settings = async (t?: Parameters<typeof selectRows>[3]) => ({
      journal: (await selectRows<{ journal_mode: string }>(db.sequelize, 'PRAGMA journal_mode', [], t))[0].journal_mode,
      // 1 = NORMAL (2 = FULL, the SQLite default for a new connection)
      synchronous: (await selectRows<{ synchronous: number }>(db.sequelize, 'PRAGMA synchronous', [], t))[0].synchronous,
      foreignKeys: (await selectRows<{ foreign_keys: number }>(db.sequelize, 'PRAGMA foreign_keys', [], t))[0].foreign_keys,
    });
    const expected = { journal: 'wal', synchronous: 1, foreignKeys: 1 };
    expect(await settings()).toEqual(expected);
    for (let i = 0; i < 2; i++) {
      expect(await db.sequelize.transaction(async (t) => settings(t))).toEqual(expected);
    }
  });
});
