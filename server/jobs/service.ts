import type { Config } from '../config';
import type { Db } from '../db';
import type { Logger } from '../logger';
import type { Mailer } from '../mail/mailer';
import { AppError } from '../errors';
import { startNightly } from '../../jobs/nightly';
import { jobRepository, LockBusyError } from './repository';

export function jobService(deps: { config: Config; db: Db; log: Logger; mailer: Mailer | null; now: () => Date }) {
  return {
    /** Starts the nightly job in the background; resolves with the run id once it holds the lock. */
    async startNightly(input: { asOf?: string; requestedById: number }) {
      try {
        const { runId, done } = await startNightly({
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
