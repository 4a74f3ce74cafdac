import { beforeAll, describe, expect, it } from 'vitest';
import { defaultTestDatabase, startTestServer, TEST_NOW } from '../support/server';
import { cleanRun, diffTablesNear, dump, NIGHTLY_TEST_ENV, type CleanRun } from '../support/nightly';
import { run } from '../../jobs/nightly';

/**
 * The nightly job on PostgreSQL (DATABASE_URL) ends in the same tables as on SQLite, from the
 * same demo fleet: every bulk path's PostgreSQL form (db/raw.ts, db/dialect.ts) stores what the
 * SQLite one does. Runs in the `pg` project, which has a PostgreSQL server.
 */
describe.skipIf(defaultTestDatabase() !== 'postgres')('nightly job on PostgreSQL', () => {
  let ref: CleanRun;
  beforeAll(async () => {
    ref = await cleanRun('sqlite');
  }, 600_000);

  it('when the job runs on PostgreSQL, then every table equals the one the same run leaves on SQLite, table by table (sums to 1e-9)', async () => {
    const P = await startTestServer({ env: NIGHTLY_TEST_ENV, database: 'postgres' });
    try {
      expect(P.db.dialect).toBe('postgres');
      const r = await run({ db: P.db, config: P.config, log: P.log, mailer: P.mailer, now: TEST_NOW, trigger: 'test' });
      expect(r.status, JSON.stringify(r.errors)).toBe('succeeded');
      expect(r.counts).toEqual(ref.counts);
      // SQLite's SUM adds doubles with compensation, PostgreSQL's plainly: the last bits of sums differ
      expect(diffTablesNear(ref.dump, await dump(P.db), 1e-9)).toEqual([]);
    } finally {
      await P.stop();
    }
  }, 600_000);
});
