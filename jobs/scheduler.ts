/**
 * Runs scheduled jobs inside the app process with node-cron: the nightly damper-duty job at
 * `NIGHTLY_CRON` (default 02:30) in `TZ`. Several app instances may share one database, each
 * with its scheduler: a firing that finds the lock held by another instance's run is skipped,
 * and so is one whose day a scheduled run already did (an instance whose clock is a few seconds
 * behind fires after the first one's run has ended), so each scheduled day has one run.
 */
import cron, { type ScheduledTask } from 'node-cron';
import type { Config } from '../server/config';
import type { Db } from '../server/db';
import type { Logger } from '../server/logger';
import type { Mailer } from '../server/mail/mailer';
import { DayAlreadyDoneError, LockBusyError } from '../server/jobs/repository';
import * as nightly from './nightly';

export interface Scheduler {
  stop(): Promise<void>;
  /** When the nightly job runs next. */
  nextNightly(): Date | null;
}

export interface SchedulerDeps {
  config: Config;
  db: Db;
  log: Logger;
  mailer: Mailer;
}

/** What one firing of the nightly schedule did. */
export type ScheduledOutcome =
  | { outcome: 'ran'; runId: number; status: string }
  | { outcome: 'busy'; runId: number | null }
  | { outcome: 'already done'; runId: number }
  | { outcome: 'not started'; error: unknown };

/**
 * One firing of the nightly schedule at `now`: runs the job for that day unless another run
 * holds the lock or a scheduled run already did the day (each logged, neither an error).
 */
export async function fireNightly(deps: SchedulerDeps, now: Date, signal?: AbortSignal): Promise<ScheduledOutcome> {
  const { log } = deps;
  try {
    const r = await nightly.run({ ...deps, now, signal, trigger: 'schedule' });
    return { outcome: 'ran', runId: r.runId, status: r.status };
  } catch (err) {
    if (err instanceof LockBusyError) {
      log.warn(`nightly: skipped, ${err.message}`);
      return { outcome: 'busy', runId: err.runId };
    }
    if (err instanceof DayAlreadyDoneError) {
      log.info(`nightly: skipped, ${err.message}`);
      return { outcome: 'already done', runId: err.runId };
    }
    log.error('nightly: scheduled run failed to start', err);
    return { outcome: 'not started', error: err };
  }
}

export function startScheduler(deps: SchedulerDeps): Scheduler {
  const { config, log } = deps;
  if (!cron.validate(config.nightlyCron)) throw new Error(`NIGHTLY_CRON "${config.nightlyCron}" is not a valid cron expression`);
  const abort = new AbortController();
  const when = nightly.schedule(config);
  const task: ScheduledTask = cron.schedule(
    when.cron,
    async () => {
      await fireNightly(deps, new Date(), abort.signal);
    },
    { timezone: when.timeZone, name: 'nightly', noOverlap: true },
  );
  log.info(`scheduler: nightly job at "${when.cron}" (${when.timeZone}), next ${task.getNextRun()?.toISOString() ?? 'never'}`);
  return {
    nextNightly: () => task.getNextRun(),
    async stop() {
      abort.abort();
      await task.stop();
      await task.destroy();
    },
  };
}
