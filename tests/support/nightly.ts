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
import { buildOnce, codeHash, NIGHTLY_TEST_ENV, startTestServer } from './server';

/** Tables and columns that legitimately differ between two databases holding the same state. */
const SKIP_TABLES = new Set(['sessions', 'job_runs', 'job_locks', 'caught_mail', 'schema_migrations', 'sqlite_sequence']);
const SKIP_COLUMNS = new Set(['created_at', 'updated_at', 'password_hash', 'file_path', 'message_id', 'job_run_id', 'created_by_run_id']);

export type Dump = Record<string, unknown[]>;

export async function dump(db: Db): Promise<Dump> {
  const tables = await db.sequelize.query<{ name: string }>(`SELECT name FROM sqlite_master WHERE type = 'table' ORDER BY name`, { type: QueryTypes.SELECT });
  const out: Dump = {};
  for (const { name } of tables) {
    if (SKIP_TABLES.has(name)) continue;
    const rows = await db.sequelize.query<Record<string, unknown>>(`SELECT * FROM "${name}" ORDER BY rowid`, { type: QueryTypes.SELECT });
    out[name] = rows.map((r) => Object.fromEntries(Object.entries(r).filter(([k]) => !SKIP_COLUMNS.has(k))));
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

export const count = async (db: Db, sql: string) => Number((await db.sequelize.query<{ n: number }>(sql, { type: QueryTypes.SELECT }))[0].n);

export interface CleanRun {
  dump: Dump;
  counts: Record<string, number>;
}

export { NIGHTLY_TEST_ENV };

/**
 * The demo fleet's tables after one clean nightly run (default settings, {@link NIGHTLY_TEST_ENV}):
 * those of the nightly template ({@link startTestServer}'s `afterNightly`), dumped once per
 * version of the code; the first file to ask dumps it while holding a lock, the others wait.
 */
export async function cleanRun(): Promise<CleanRun> {
  const dir = await buildOnce(path.join(os.tmpdir(), `reboundry-nightly-reference-${codeHash(['server', 'jobs'], JSON.stringify(NIGHTLY_TEST_ENV))}`), async (work) => {
    const srv = await startTestServer({ afterNightly: true });
    try {
      const out: CleanRun = { dump: await dump(srv.db), counts: srv.nightlyCounts! };
      fs.writeFileSync(path.join(work, 'reference.json'), JSON.stringify(out));
    } finally {
      await srv.stop();
    }
  });
  return JSON.parse(fs.readFileSync(path.join(dir, 'reference.json'), 'utf8')) as CleanRun;
}
