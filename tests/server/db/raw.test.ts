import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDb, type Db } from '../../../server/db';
import { fromJsonRows, insertRows, jsonRows, runSql, selectRows } from '../../../server/db/raw';
import { seededRandom } from '../../../server/physics/iso8608';

let db: Db;
let dir: string;

beforeAll(async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'reboundry-raw-'));
  db = await openDb(path.join(dir, 'raw.sqlite'));
});
afterAll(async () => {
  await db.close();
  fs.rmSync(dir, { recursive: true, force: true });
});

/** Sequelize opens a new sqlite3 connection for each transaction; each must get the app's settings. */
describe('database connections', () => {
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

/**
 * The nightly job's bulk writes send rows as one JSON parameter instead of one bound parameter
 * per value. What lands in the table must be exactly what binding each value would have stored:
 * the reference here is sqlite3's own parameter binding, on the same connection.
 */
describe('bulk rows through one JSON parameter', () => {
  beforeAll(async () => {
    await runSql(db.sequelize, 'CREATE TABLE bound (id INTEGER PRIMARY KEY, x REAL, n INTEGER, s TEXT, d DATE, stamp TEXT)');
    await runSql(db.sequelize, 'CREATE TABLE viajson (id INTEGER PRIMARY KEY, x REAL, n INTEGER, s TEXT, d DATE, stamp TEXT)');
  });

  it('when 12 000 rows of random doubles, integers, text and nulls are inserted, then every stored value equals the one sqlite3 binds', async () => {
    const rnd = seededRandom(20261202); // seeded, so a failure can be replayed
    const texts = ['plain', "it's", 'a "quoted" word', 'back\\slash', 'line\nbreak', 'Ølstykke — 5 %', '😀', ''];
    const rows: unknown[][] = [];
    for (let i = 1; i <= 12_000; i++) {
      // doubles over 40 orders of magnitude, both signs, and a few whole numbers held as doubles
      const x = i % 97 === 0 ? Math.round(rnd() * 1e6) : (rnd() < 0.3 ? -1 : 1) * rnd() * 10 ** (rnd() * 40 - 20);
      const n = i % 13 === 0 ? null : Math.floor((rnd() - 0.5) * 2 ** 52);
      const s = i % 11 === 0 ? null : texts[i % texts.length];
      rows.push([i, x, n, s, '2026-11-30']);
    }
    const cols = ['id', 'x', 'n', 's', 'd'];
    await db.sequelize.transaction(async (t) => {
      for (let i = 0; i < rows.length; i += 400) {
        const part = rows.slice(i, i + 400);
        await runSql(db.sequelize, `INSERT INTO bound (${cols.join(',')}, stamp) VALUES ${part.map(() => "(?,?,?,?,?,'now')").join(',')}`, part.flat(), t);
      }
      await insertRows(db.sequelize, 'viajson', cols, rows, t, { fixed: { stamp: 'now' } });
    });
    const read = (table: string) => selectRows<Record<string, unknown>>(db.sequelize, `SELECT id, x, typeof(x) AS tx, n, typeof(n) AS tn, s, d, stamp FROM ${table} ORDER BY id`);
    const [bound, viaJson] = await Promise.all([read('bound'), read('viajson')]);
    expect(viaJson).toHaveLength(rows.length);
    const differing = viaJson.filter((r, i) => ['x', 'tx', 'n', 'tn', 's', 'd', 'stamp'].some((k) => !Object.is(r[k], bound[i][k])));
    expect(differing.slice(0, 5)).toEqual([]);
    // and the doubles are the ones sent, to the last bit
    expect(viaJson.filter((r, i) => !Object.is(r.x, rows[i][1])).length).toBe(0);
  });

  it('when rows replace existing ones, then OR REPLACE keeps one row per key with the new values', async () => {
    await insertRows(db.sequelize, 'viajson', ['id', 'x', 's'], [[1, 0.1, 'new'], [20_000, 1 / 3, 'added']], undefined, { orReplace: true });
    const rows = await selectRows<{ id: number; x: number; s: string }>(db.sequelize, 'SELECT id, x, s FROM viajson WHERE id IN (1, 20000) ORDER BY id');
    expect(rows).toEqual([{ id: 1, x: 0.1, s: 'new' }, { id: 20_000, x: 1 / 3, s: 'added' }]);
  });

  it('when a JSON row set drives an UPDATE … FROM, then each row updates its own key', async () => {
    await runSql(
      db.sequelize,
      `WITH u AS (${fromJsonRows(db.sequelize, ['id integer', 's text'])}) UPDATE viajson SET s = u.s FROM u WHERE viajson.id = u.id`,
      [jsonRows([[2, 'two'], [3, null]])],
    );
    const rows = await selectRows<{ id: number; s: string | null }>(db.sequelize, 'SELECT id, s FROM viajson WHERE id IN (2, 3, 4) ORDER BY id');
    expect(rows.map((r) => r.s)).toEqual(['two', null, (await selectRows<{ s: string | null }>(db.sequelize, 'SELECT s FROM bound WHERE id = 4'))[0].s]);
  });

  it('when a value cannot be stored exactly, then the write is refused with the value named', () => {
    expect(() => jsonRows([[1, Number.NaN]])).toThrow(/not a finite number: NaN/);
    expect(() => jsonRows([[1, Number.POSITIVE_INFINITY]])).toThrow(/not a finite number: Infinity/);
    expect(() => jsonRows([[1, { a: 1 }]])).toThrow(/not a number, text or null: object/);
  });
});
