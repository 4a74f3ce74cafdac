/**
 * Runs scheduled jobs inside the app process with node-cron: the nightly damper-duty job at
 * `NIGHTLY_CRON` (default 02:30) in `TZ`. A run that finds the lock held by another process
 * is skipped (logged), so several app instances can share one database.
 */
import cron, { type ScheduledTask } from 'node-cron';
import type { Config } from '../server/config';
import type { Db } from '../server/db';
import type { Logger } from '../server/logger';
import type { Mailer } from '../server/mail/mailer';
import { LockBusyError } from '../server/jobs/repository';
import * as nightly from './nightly';

export interface Scheduler {
  stop(): Promise<void>;
  /** When the nightly job runs next. */
  nextNightly(): Date | null;
}

export function startScheduler(deps: { config: Config; db: Db; log: Logger; mailer: Mailer }): Scheduler {
  const { config, log } = deps;
  if (!cron.validate(config.nightlyCron)) throw new Error(`NIGHTLY_CRON "${config.nightlyCron}" is not a valid cron expression`);
  const abort = new AbortController();
  const when = nightly.schedule(config);
  const task: ScheduledTask = cron.schedule(
    when.cron,
    async () => {
      try {
        await nightly.run({ ...deps, now: new Date(), signal: abort.signal, trigger: 'schedule' });
      } catch (err) {
        if (err instanceof LockBusyError) log.warn(`nightly: skipped, ${err.message}`);
        else log.error('nightly: scheduled run failed to start', err);
      }
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
