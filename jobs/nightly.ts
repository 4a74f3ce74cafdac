/**
 * The nightly damper-duty job: trips → duty per trip × corner → life models refitted to the
 * removals → each damper's wear
 * and daily history → predictions → inspection scheduling → e-mail, with a run row and a lock.
 *
 * Idempotent and crash-safe: trips are committed in batches together with their processed
 * mark; wear, history and predictions are recomputed deterministically from the stored duty;
 * scheduling never duplicates (one open inspection per vehicle, also enforced by a unique
 * index); mail is de-duplicated by a key stored with each message. A second run on the same
 * data changes nothing and sends nothing; a run killed halfway and run again ends in the state
 * of one clean run. Two runs never overlap (lock row, taken over when stale).
 */
import os from 'node:os';
import type { Config } from '../server/config';
import type { Db } from '../server/db';
import type { JobRunStatus, JobTrigger } from '../server/db/models';
import type { Logger } from '../server/logger';
import type { Mailer } from '../server/mail/mailer';
import { queueAssignmentNotes, queueDigests, sendPending } from '../server/mail/service';
import { jobRepository } from '../server/jobs/repository';
import { runSchedule } from '../server/inspections/service';
import { loadSurveyProfile } from '../server/roads/profile-store';
import { localDay, startOfLocalDay } from '../server/wear/repository';
import { foldOldDuty, predictAll, processTrips, recomputeWear, RunAborted, type ItemError, type PhaseContext } from '../server/wear/service';
import { plusDays, type LifeResolver } from '../server/wear/wear';
import { refitAndResolveLife } from '../server/workshop/nightly-life';
import { refreshExposure } from '../server/drivers/exposure';
import { registerRideReportDigest } from '../server/drivers/ride-mail';

// The manager digest's sections beyond the inspections: severe ride reports.
registerRideReportDigest();

export const name = 'nightly';

/** When the scheduler runs it: `NIGHTLY_CRON` (default 02:30) in `TZ`. */
export const schedule = (config: Config) => ({ cron: config.nightlyCron, timeZone: config.timeZone });

export interface NightlyOptions {
  /** Logical "now": stamps rows and, unless `asOf` is given, sets the run's day. */
  now: Date;
  signal?: AbortSignal;
  log: Logger;
  db: Db;
  config: Config;
  mailer: Mailer;
  /** The run's day (YYYY-MM-DD); trips started before its end are processed. */
  asOf?: string;
  trigger?: JobTrigger;
  requestedById?: number | null;
  /** A given life for every damper instead of the fleet-fitted models (tools and tests). */
  lifeResolver?: LifeResolver;
  /** Test hook: fail after this many committed batches (simulated crash). */
  failAfterBatches?: number;
  /** Test hook: dampers per chunk of the wear and prediction phases. */
  damperChunk?: number;
  /** Test hook: vehicles per read of the scheduling phase. */
  scheduleChunk?: number;
  /** Test hook: fail after folding this many days of old per-trip duty. */
  failAfterFoldDays?: number;
  /** Wall clock for the run row, lock and heartbeat (default: the real clock). */
  wallClock?: () => Date;
  /** Called on every progress step (phase, done, total). */
  onProgress?: (phase: string, done: number, total: number) => void;
}

export interface NightlyResult {
  runId: number;
  status: string;
  counts: Record<string, number>;
  errors: ItemError[];
}

/**
 * Takes the lock, creates the run row and starts the work; `done` settles when it ends. Throws
 * LockBusyError when another run holds the lock, and for the `schedule` trigger
 * DayAlreadyDoneError when a scheduled run already did the day.
 */
export async function startNightly(opts: NightlyOptions): Promise<{ runId: number; done: Promise<NightlyResult> }> {
  const { config, db, log } = opts;
  const wall = opts.wallClock ?? (() => new Date());
  const asOf = opts.asOf ?? localDay(opts.now, config.timeZone);
  const { runId, takenOver } = await jobRepository.start(db, {
    name,
    holder: `${os.hostname()}:${process.pid}`,
    staleMs: config.jobLockTimeoutMinutes * 60_000,
    trigger: opts.trigger ?? 'manual',
    asOf,
    requestedById: opts.requestedById ?? null,
    wallNow: wall(),
    // several app instances each fire the schedule: the first to start does the day, the rest nothing
    oncePerDay: opts.trigger === 'schedule',
  });
  if (takenOver) log.warn(`nightly: took over the stale lock of run #${takenOver}`);
  log.info(`nightly: run #${runId} started (as of ${asOf})`);
  const done = execute(opts, runId, asOf, wall);
  return { runId, done };
}

/** Runs the job to the end (lock, run row and all phases). */
export async function run(opts: NightlyOptions): Promise<NightlyResult> {
  const { done } = await startNightly(opts);
  return done;
}

async function execute(opts: NightlyOptions, runId: number, asOf: string, wall: () => Date): Promise<NightlyResult> {
  const { config, db, log } = opts;
  const errors: ItemError[] = [];
  const counts: Record<string, number> = {};
  let lastBeat = 0;
  const progress = async (phase: string, doneN: number, total: number) => {
    opts.onProgress?.(phase, doneN, total);
    const t = wall().getTime();
    if (t - lastBeat < 250 && doneN !== total && doneN !== 0) return;
    lastBeat = t;
    await jobRepository.heartbeat(runId, name, { phase, progressDone: doneN, progressTotal: total, counts }, wall());
  };
  const ctx: PhaseContext = {
    sequelize: db.sequelize,
    now: opts.now,
    asOf,
    before: startOfLocalDay(plusDays(asOf, 1), config.timeZone),
    timeZone: config.timeZone,
    dataDir: config.dataDir,
    batchTrips: config.nightlyBatchTrips,
    dutyWorkers: config.nightlyWorkers,
    queueUrl: config.queueUrl,
    warn: (m) => log.warn(`nightly: ${m}`),
    thresholdFraction: config.inspection.threshold,
    calendarYears: config.workshop.life.calendarYears,
    scheduleQuantile: config.workshop.life.scheduleQuantile,
    signal: opts.signal,
    failAfterBatches: opts.failAfterBatches,
    damperChunk: opts.damperChunk,
    tripDutyRetentionDays: config.tripDutyRetentionDays,
    failAfterFoldDays: opts.failAfterFoldDays,
    loadProfile: loadSurveyProfile,
    progress,
    errors,
    counts,
  };
  let status: JobRunStatus = 'succeeded';
  let message: string | null = null;
  try {
    await processTrips(ctx);
    // the life models are refitted to the removals on record before the wear is summed with them
    await progress('life models', 0, 1);
    if (opts.lifeResolver) ctx.lifeResolver = opts.lifeResolver;
    else {
      const life = await refitAndResolveLife(config, opts.now, log);
      ctx.lifeResolver = life.resolver;
      counts.lifeModelsFitted = life.fitted;
      counts.lifeBandRows = life.bandRows;
    }
    await recomputeWear(ctx);
    await predictAll(ctx);
    // Drivers' daily A(8) from the front-axle duty just stored (queues managers' mail, sent below)
    if (opts.signal?.aborted) throw new RunAborted();
    await progress('exposure', 0, 1);
    Object.assign(counts, await refreshExposure({ sequelize: db.sequelize, now: opts.now, asOf, publicUrl: config.publicUrl, runId }));
    // per-trip duty past the retention window into the daily summary (after every reader of this run)
    if (opts.signal?.aborted) throw new RunAborted();
    await progress('duty retention', 0, 1);
    await foldOldDuty(ctx);
    if (opts.signal?.aborted) throw new RunAborted();
    await progress('scheduling', 0, 1);
    await runSchedule({ sequelize: db.sequelize, now: opts.now, asOf, timeZone: config.timeZone, rules: config.inspection, runId, errors, counts, vehiclesPerRead: opts.scheduleChunk });
    if (opts.signal?.aborted) throw new RunAborted();
    await progress('mail', 0, 1);
    const mailCtx = { sequelize: db.sequelize, publicUrl: config.publicUrl, asOf, now: opts.now, runId };
    counts.mailsQueued = (await queueDigests(mailCtx)) + (await queueAssignmentNotes(mailCtx));
    const sent = await sendPending(opts.mailer, opts.now, log, { signal: opts.signal, wallClock: wall });
    counts.mailsSent = sent.sent;
    counts.mailsFailed = sent.failed.length;
    errors.push(...sent.failed);
    if (errors.length) status = 'completed_with_errors';
  } catch (err) {
    if (err instanceof RunAborted) {
      status = 'cancelled';
      message = 'Cancelled; work committed so far is kept and the next run carries on from there.';
    } else {
      status = 'failed';
      message = (err as Error).message;
      log.error(`nightly: run #${runId} failed`, err);
    }
  }
  for (const k of ['trips', 'segments', 'dutyRecords', 'inspectionsCreated', 'mailsSent']) counts[k] ??= 0;
  await jobRepository.finish(runId, name, { status, counts, errors, message, wallNow: wall() });
  log.info(`nightly: run #${runId} ${status} ${JSON.stringify(counts)}`);
  return { runId, status, counts, errors };
}
