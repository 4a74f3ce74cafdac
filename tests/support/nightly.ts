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
import { run } from '../../jobs/nightly';
import { startTestServer, TEST_NOW } from './server';
import { sourceHash } from './code-hash';

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

/** The server and job code, hashed: a reference computed by other code is never reused. */
function codeHash(): string {
  return sourceHash(['server', 'jobs'], TEST_NOW.toISOString());
}

export interface CleanRun {
  dump: Dump;
  counts: Record<string, number>;
}

/** The job's settings every reference and comparison run uses (several batches on the demo fleet). */
export const NIGHTLY_TEST_ENV = { NIGHTLY_BATCH_TRIPS: '400' };

/**
 * The demo fleet's tables after one clean nightly run (default settings, {@link NIGHTLY_TEST_ENV}).
 * The first file to ask computes it while holding a lock folder; the others wait for its file.
 */
export async function cleanRun(): Promise<CleanRun> {
  const file = path.join(os.tmpdir(), `reboundry-nightly-reference-${codeHash()}.json`);
  const lock = `${file}.lock`;
  const started = Date.now();
  for (;;) {
    if (fs.existsSync(file)) return JSON.parse(fs.readFileSync(file, 'utf8')) as CleanRun;
    let mine = false;
    try {
      fs.mkdirSync(lock);
      mine = true;
    } catch {
      // another worker is computing it; after four minutes assume it died and compute it here
      if (Date.now() - started > 240_000) mine = true;
    }
    if (mine) {
      const srv = await startTestServer({ env: NIGHTLY_TEST_ENV });
      try {
        const r = await run({ db: srv.db, config: srv.config, log: srv.log, mailer: srv.mailer, now: TEST_NOW, trigger: 'test' });
        if (r.status !== 'succeeded') throw new Error(`the reference run ${r.status}: ${JSON.stringify(r.errors)}`);
        const out: CleanRun = { dump: await dump(srv.db), counts: r.counts };
        const tmp = `${file}.${process.pid}.tmp`;
        fs.writeFileSync(tmp, JSON.stringify(out));
        fs.renameSync(tmp, file);
        return out;
      } finally {
        await srv.stop();
        fs.rmSync(lock, { recursive: true, force: true });
      }
    }
    await new Promise((res) => setTimeout(res, 500));
  }
}
