import { describe, expect, it } from 'vitest';
import { startTestServer, TEST_NOW } from '../support/server';
import { cleanRunForFile, diffTables, dump, NIGHTLY_TEST_ENV } from '../support/nightly';
import { run } from '../../jobs/nightly';

/**
 * The nightly job's duty computed on its own thread and on worker threads gives the same tables,
 * and so do the later phases read a few dampers or vehicles at a time.
 */

const ref = cleanRunForFile('small');

describe('nightly job threads', () => {
  // The reference ran on the default `auto` setting: at least one worker thread computes the duty.
  // The run on the job's own thread also reads the later phases in the smallest parts: 3 dampers
  // a chunk in the wear and prediction phases, 2 vehicles a read in the scheduling.
  for (const workers of ['0', '2']) {
    const small = workers === '0';
    it(`when the duty is computed on ${small ? "the job's own thread and the later phases read 3 dampers or 2 vehicles at a time" : `${workers} worker threads`}, then the tables equal those of the run on the default setting`, async () => {
      const D = await startTestServer({ fleet: 'small', env: { ...NIGHTLY_TEST_ENV, NIGHTLY_WORKERS: workers } });
      try {
        expect(D.config.nightlyWorkers).toBe(Number(workers));
        const chunks = small ? { damperChunk: 3, scheduleChunk: 2 } : {};
        const r = await run({ db: D.db, config: D.config, log: D.log, mailer: D.mailer, now: TEST_NOW, trigger: 'test', ...chunks });
        expect(r.status, JSON.stringify(r.errors)).toBe('succeeded');
        expect(r.counts.trips).toBe(ref.counts.trips);
        expect(r.counts.inspectionsCreated, 'the small fleet schedules inspections').toBeGreaterThan(0);
        expect(r.counts.inspectionsCreated).toBe(ref.counts.inspectionsCreated);
        expect(diffTables(ref.dump, await dump(D.db))).toEqual([]);
      } finally {
        await D.stop();
      }
    }, 240_000);
  }
});
