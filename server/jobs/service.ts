import type { Config } from '../config';
import type { Db } from '../db';
import type { Logger } from '../logger';
import type { Mailer } from '../mail/mailer';
import { AppError } from '../errors';
import { jobRepository, LockBusyError } from './repository';

/**
 * Starts a nightly run (jobs/nightly.ts `startNightly`), handed in by the process that composes
 * the app (server/main.ts, the test server), so this area does not import the job that imports it.
 */
export type StartNightly = (opts: { now: Date; asOf?: string; log: Logger; db: Db; config: Config; mailer: Mailer; trigger: 'manual'; requestedById: number }) => Promise<{ runId: number; done: Promise<unknown> }>;

export function jobService(deps: { config: Config; db: Db; log: Logger; mailer: Mailer | null; now: () => Date; startNightly: StartNightly | null }) {
  return {
    /** Starts the nightly job in the background; resolves with the run id once it holds the lock. */
    async startNightly(input: { asOf?: string; requestedById: number }) {
      if (!deps.startNightly) throw new AppError(503, 'job_unavailable', 'This app instance cannot start the nightly job.');
      try {
        const { runId, done } = await deps.startNightly({
          now: deps.now(),
          asOf: input.asOf,
          log: deps.log,
          db: deps.db,
          config: deps.config,
          mailer: deps.mailer!,
          trigger: 'manual',
          requestedById: input.requestedById,
        });
        done.catch((err) => deps.log.error(`nightly: run #${runId} could not be recorded`, err));
        return runId;
      } catch (err) {
        if (err instanceof LockBusyError) {
          throw AppError.conflict(`A nightly run is already in progress (run #${err.runId ?? '?'}, started ${err.since.toISOString()}). Follow it on the Job runs page.`);
        }
        throw err;
      }
    },
    list: (p: { offset: number; pageSize: number }) => jobRepository.list({ job: undefined, ...p }),
    get: (id: number) => jobRepository.get(id),
  };
}
