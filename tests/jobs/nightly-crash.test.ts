import { describe, expect, it } from 'vitest';
import { startTestServer, TEST_NOW } from '../support/server';
import { cleanRunForFile, count, diffTables, dump, NIGHTLY_TEST_ENV } from '../support/nightly';
import { run } from '../../jobs/nightly';
import { ApiClient, DEMO } from '../support/client';

/** A nightly run that fails or is cancelled, then run again, ends with the tables of one clean run. */

const ref = cleanRunForFile('small');

describe('nightly job crash safety', () => {
  it('when a run fails after one batch and is run again, then the tables equal those of one clean run', async () => {
    const B = await startTestServer({ fleet: 'small', env: NIGHTLY_TEST_ENV });
    try {
      const deps = { db: B.db, config: B.config, log: B.log, mailer: B.mailer, now: TEST_NOW, trigger: 'test' as const };
      const crashed = await run({ ...deps, failAfterBatches: 1 });
      expect(crashed.status).toBe('failed');
      const left = await count(B.db, `SELECT COUNT(*) AS n FROM trips WHERE processed_at IS NULL`);
      expect(left).toBeGreaterThan(0);
      expect(crashed.counts.trips).toBeGreaterThan(0);
      const again = await run(deps);
      expect(again.status).toBe('succeeded');
      expect(again.counts.trips).toBe(left);
      expect(diffTables(ref.dump, await dump(B.db))).toEqual([]);
    } finally {
      await B.stop();
    }
  }, 240_000);

  it('when a run is cancelled through its signal and run again, then the tables equal those of one clean run; a user who turned the digest off gets none', async () => {
    const C = await startTestServer({ fleet: 'small', env: NIGHTLY_TEST_ENV });
    try {
      const deps = { db: C.db, config: C.config, log: C.log, mailer: C.mailer, now: TEST_NOW, trigger: 'test' as const };
      const abort = new AbortController();
      const cancelled = await run({ ...deps, signal: abort.signal, onProgress: (phase, done) => phase === 'duty' && done > 0 && abort.abort() });
      expect(cancelled.status).toBe('cancelled');
      expect(cancelled.counts.batches).toBe(1);
      const again = await run(deps);
      expect(again.status).toBe('succeeded');
      expect(diffTables(ref.dump, await dump(C.db))).toEqual([]);

      // preferences: the manager turns the digest off; a later day makes scheduled inspections due
      const c = new ApiClient(C.url);
      await c.login(DEMO.manager);
      const off = await c.json<{ preferences: Record<string, boolean> }>('PATCH', '/api/account/notifications', { inspectionDigest: false });
      expect(off.body.preferences).toEqual({ inspectionDigest: false, rideReports: true, assignments: true });
      const bad = await c.json('PATCH', '/api/account/notifications', {});
      expect(bad.status).toBe(400);
      const before = await count(C.db, `SELECT COUNT(*) AS n FROM mail_messages WHERE kind = 'digest'`);
      const later = await run({ ...deps, now: new Date('2026-12-20T12:00:00Z') });
      expect(later.status).toBe('succeeded');
      expect(later.counts.inspectionsNowDue + later.counts.inspectionsNowOverdue).toBeGreaterThan(0);
      expect(await count(C.db, `SELECT COUNT(*) AS n FROM mail_messages WHERE kind = 'digest'`)).toBe(before);
      expect(await count(C.db, `SELECT COUNT(*) AS n FROM inspections WHERE status IN ('due','overdue') AND notified_status IS DISTINCT FROM status`)).toBe(0);
    } finally {
      await C.stop();
    }
  }, 300_000);
});
