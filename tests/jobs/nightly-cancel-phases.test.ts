import { describe, expect, it } from 'vitest';
import { startTestServer, TEST_NOW } from '../support/server';
import { cleanRunForFile, count, diffTables, dump, NIGHTLY_TEST_ENV } from '../support/nightly';
import { run } from '../../jobs/nightly';

/** A nightly run cancelled while it writes wear history or predictions, then run again, ends with the tables of one clean run. */

const ref = cleanRunForFile('small');

describe('nightly job crash safety, by phase', () => {
  it('when a run is cancelled while it writes wear history or predictions and run again, then the tables equal those of one clean run', async () => {
    for (const phase of ['wear', 'predictions']) {
      const E = await startTestServer({ fleet: 'small', env: NIGHTLY_TEST_ENV });
      try {
        const deps = { db: E.db, config: E.config, log: E.log, mailer: E.mailer, now: TEST_NOW, trigger: 'test' as const };
        const abort = new AbortController();
        // small chunks, so that the fleet's dampers take several and the cancel lands between two
        const cancelled = await run({ ...deps, damperChunk: 40, signal: abort.signal, onProgress: (p, done) => p === phase && done > 0 && abort.abort() });
        expect(cancelled.status, phase).toBe('cancelled');
        if (phase === 'predictions') expect(await count(E.db, `SELECT COUNT(*) AS n FROM damper_predictions`)).toBeLessThan(ref.counts.predictions);
        if (phase === 'wear') expect(await count(E.db, `SELECT COUNT(*) AS n FROM dampers WHERE wear_dirty_from IS NOT NULL`)).toBeGreaterThan(0);
        const again = await run(deps);
        expect(again.status).toBe('succeeded');
        expect(diffTables(ref.dump, await dump(E.db)), phase).toEqual([]);
      } finally {
        await E.stop();
      }
    }
  }, 240_000);
});
