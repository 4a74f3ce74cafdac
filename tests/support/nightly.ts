/**
 * Helpers of the nightly-job tests: a table-by-table dump of a database, the difference of two
 * dumps, and the reference every crash-safety and threading test compares against — the demo
 * fleet after one clean nightly run on the default settings, computed once per version of the
 * code and shared by the test files (each file runs in its own worker, in parallel).
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import type { Db } from '../../server/db';
import { selectRows } from '../../server/db/raw';
import { beforeAll } from 'vitest';
import { buildOnce, codeHash, defaultTestDatabase, fleetSuffix, fleetTag, lateBound, NIGHTLY_TEST_ENV, startTestServer, type TestDatabase, type TestFleet } from './server';

/** Tables and columns that legitimately differ between two databases holding the same state. */
const SKIP_TABLES = new Set(['sessions', 'sign_in_counts', 'sign_in_delays', 'job_runs', 'job_locks', 'caught_mail', 'schema_migrations', 'sqlite_sequence']);
const SKIP_COLUMNS = new Set(['created_at', 'updated_at', 'password_hash', 'file_path', 'message_id', 'job_run_id', 'created_by_run_id']);

export type Dump = Record<string, unknown[]>;

/** A table's primary key columns, in key order. */
async function primaryKey(db: Db, table: string): Promise<string[]> {
  const rows =
    db.dialect === 'postgres'
      ? await selectRows<{ name: string }>(
          db.sequelize,
          `SELECT a.attname AS name FROM pg_index i JOIN pg_attribute a ON a.attrelid = i.indrelid AND a.attnum = ANY (i.indkey)
           WHERE i.indrelid = ?::regclass AND i.indisprimary ORDER BY array_position(i.indkey, a.attnum)`,
          [table],
        )
      : await selectRows<{ name: string }>(db.sequelize, `SELECT name FROM pragma_table_info(?) WHERE pk > 0 ORDER BY pk`, [table]);
  return rows.map((r) => r.name);
}

/**
 * Every table's rows in primary-key order, each row's columns by name, values in SQLite's forms
 * (db/raw.ts reads PostgreSQL's that way; booleans as 0 and 1), so a dump of either database
 * compares with one of the other.
 */
export async function dump(db: Db): Promise<Dump> {
  const tables =
    db.dialect === 'postgres'
      ? await selectRows<{ name: string }>(db.sequelize, `SELECT tablename AS name FROM pg_tables WHERE schemaname = current_schema() ORDER BY tablename`)
      : await selectRows<{ name: string }>(db.sequelize, `SELECT name FROM sqlite_master WHERE type = 'table' ORDER BY name`);
  const out: Dump = {};
  for (const { name } of tables) {
    if (SKIP_TABLES.has(name)) continue;
    const key = await primaryKey(db, name);
    const rows = await selectRows<Record<string, unknown>>(db.sequelize, `SELECT * FROM "${name}" ORDER BY ${key.length ? key.map((k) => `"${k}"`).join(', ') : db.dialect === 'postgres' ? 'ctid' : 'rowid'}`);
    out[name] = rows.map((r) =>
      Object.fromEntries(
        Object.entries(r)
          .filter(([k]) => !SKIP_COLUMNS.has(k))
          .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))
          .map(([k, v]) => [k, typeof v === 'boolean' ? Number(v) : v]),
      ),
    );
  }
  return out;
}

export function diffTables(a: Dump, b: Dump): string[] {
  const problems: string[] = [];
  for (const t of new Set([...Object.keys(a), ...Object.keys(b)])) {
    const x = JSON.stringify(a[t] ?? null);
    const y = JSON.stringify(b[t] ?? null);
    if (x !== y) {
      const rowsA = a[t] ?? [];
      const rowsB = b[t] ?? [];
      const i = rowsA.findIndex((r, k) => JSON.stringify(r) !== JSON.stringify(rowsB[k]));
      problems.push(`${t}: ${rowsA.length} vs ${rowsB.length} rows; first difference at row ${i}: ${JSON.stringify(rowsA[i])} vs ${JSON.stringify(rowsB[i])}`);
    }
  }
  return problems;
}

const STAMP = /^\d{4}-\d\d-\d\d[ T]\d\d:\d\d:\d\d(\.\d+)?( ?[+-]\d\d:\d\d|Z)$/;

/** Where two values differ (a path into them), numbers within `relTol` of each other counting as equal. */
function nearDifference(x: unknown, y: unknown, relTol: number, at: string): string | null {
  if (typeof x === 'number' && typeof y === 'number') {
    return x === y || Math.abs(x - y) <= relTol * Math.max(Math.abs(x), Math.abs(y)) ? null : `${at}: ${x} vs ${y}`;
  }
  if (typeof x === 'string' && typeof y === 'string') {
    if (x === y) return null;
    // one instant written in two forms (ISO text in SQLite, a timestamp in PostgreSQL)
    if (STAMP.test(x) && STAMP.test(y)) return Date.parse(x.replace(' ', 'T').replace(' ', '')) === Date.parse(y.replace(' ', 'T').replace(' ', '')) ? null : `${at}: ${x} vs ${y}`;
    // JSON texts (bases, models) compare by their values
    if (/^[[{]/.test(x) && /^[[{]/.test(y)) {
      try {
        return nearDifference(JSON.parse(x), JSON.parse(y), relTol, at);
      } catch {
        // not JSON: compared as text below
      }
    }
    // numbers written into texts (reasons): each number within the tolerance, the words the same
    const nums = /-?\d+(?:\.\d+)?(?:e[+-]?\d+)?/gi;
    const [nx, ny] = [x.match(nums) ?? [], y.match(nums) ?? []];
    if (x.replace(nums, '#') === y.replace(nums, '#') && nx.length === ny.length && nx.every((n, i) => nearDifference(Number(n), Number(ny[i]), relTol, at) === null)) return null;
    return `${at}: ${JSON.stringify(x)} vs ${JSON.stringify(y)}`;
  }
  if (x && y && typeof x === 'object' && typeof y === 'object') {
    const keys = new Set([...Object.keys(x), ...Object.keys(y)]);
    for (const k of keys) {
      const d = nearDifference((x as Record<string, unknown>)[k], (y as Record<string, unknown>)[k], relTol, `${at}.${k}`);
      if (d) return d;
    }
    return null;
  }
  return Object.is(x, y) ? null : `${at}: ${JSON.stringify(x)} vs ${JSON.stringify(y)}`;
}

/**
 * {@link diffTables} with floating-point values equal within `relTol` (relative), also inside JSON
 * texts and the numbers of worded texts, and instants equal in either text form: for dumps of
 * two databases whose SUM adds doubles differently (SQLite's with compensation, PostgreSQL's
 * plainly), so sums differ in the last bits.
 */
export function diffTablesNear(a: Dump, b: Dump, relTol: number): string[] {
  const problems: string[] = [];
  for (const t of new Set([...Object.keys(a), ...Object.keys(b)])) {
    const rowsA = a[t] ?? [];
    const rowsB = b[t] ?? [];
    if (rowsA.length !== rowsB.length) {
      problems.push(`${t}: ${rowsA.length} vs ${rowsB.length} rows`);
      continue;
    }
    for (let i = 0; i < rowsA.length; i++) {
      const d = nearDifference(rowsA[i], rowsB[i], relTol, `${t}[${i}]`);
      if (d) {
        problems.push(d);
        break;
      }
    }
  }
  return problems;
}

export const count = async (db: Db, sql: string) => Number((await db.sequelize.query<{ n: number }>(sql, { type: QueryTypes.SELECT }))[0].n);

export interface CleanRun {
  dump: Dump;
  counts: Record<string, number>;
}

export { NIGHTLY_TEST_ENV };

/**
 * The tables of the demo fleet (or its small cut) after one clean nightly run (default settings,
 * {@link NIGHTLY_TEST_ENV}): those of the nightly template ({@link startTestServer}'s
 * `afterNightly`), dumped once per version of the code, on the test run's database (PostgreSQL in
 * the `pg` project) or the one asked for; the first file to ask dumps it while holding a lock,
 * the others wait.
 */
export async function cleanRun(database: TestDatabase = defaultTestDatabase(), fleet: TestFleet = 'demo'): Promise<CleanRun> {
  const hash = codeHash(['server', 'jobs'], JSON.stringify(NIGHTLY_TEST_ENV) + fleetTag(fleet));
  const dir = await buildOnce(path.join(os.tmpdir(), `reboundry-nightly-reference-${hash}${fleetSuffix(fleet)}${database === 'postgres' ? '-postgres' : ''}`), async (work) => {
    const srv = await startTestServer({ afterNightly: true, database, fleet });
    try {
      const out: CleanRun = { dump: await dump(srv.db), counts: srv.nightlyCounts! };
      fs.writeFileSync(path.join(work, 'reference.json'), JSON.stringify(out));
    } finally {
      await srv.stop();
    }
  });
  return JSON.parse(fs.readFileSync(path.join(dir, 'reference.json'), 'utf8')) as CleanRun;
}

/** The {@link cleanRun} of a fleet that a test file compares against, read before its tests (waiting, if need be, for the file that dumps it). */
export function cleanRunForFile(fleet: TestFleet = 'demo'): CleanRun {
  let ref: CleanRun | undefined;
  beforeAll(async () => {
    ref = await cleanRun(defaultTestDatabase(), fleet);
  }, 240_000);
  return lateBound(() => ref, 'the clean run');
}
