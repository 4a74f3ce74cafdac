/**
 * Job runs and the run lock. The lock is a row per job name in `job_locks`: taken in an
 * IMMEDIATE transaction (so two starters cannot both see it free), refreshed by a heartbeat,
 * and taken over when its heartbeat is older than the timeout (a run that died), or at once when
 * its holder was a process on this host that no longer exists (a crash, a kill -9).
 */
import os from 'node:os';
import { Op } from 'sequelize';
import { JobLock, JobRun, type JobRunStatus, type JobTrigger } from '../db/models';
import { User } from '../db/models';
import type { Db } from '../db';
import type { JobRunView } from '../contracts/jobs';

/** A run as the API answers it (server/contracts/jobs.ts). */
export type JobRunRow = JobRunView;

const toRow = (r: JobRun & { requestedBy?: User | null }, withErrors = true): JobRunRow => {
  const errors = JSON.parse(r.errors || '[]') as { item: string; message: string }[];
  return {
    id: r.id,
    job: r.job,
    status: r.status,
    trigger: r.trigger,
    asOf: r.asOf,
    requestedBy: r.requestedBy ? { id: r.requestedBy.id, name: r.requestedBy.name } : null,
    startedAt: r.startedAt.toISOString(),
    endedAt: r.endedAt ? r.endedAt.toISOString() : null,
    durationS: r.endedAt ? Math.round((r.endedAt.getTime() - r.startedAt.getTime()) / 100) / 10 : null,
    phase: r.phase,
    progressDone: r.progressDone,
    progressTotal: r.progressTotal,
    counts: JSON.parse(r.counts || '{}') as Record<string, number>,
    errors: withErrors ? errors.slice(0, 200) : [],
    errorCount: errors.length,
    message: r.message,
  };
};

/**
 * Whether a lock holder (`host:pid`, as jobs/nightly.ts writes it) was a process on this host
 * that no longer runs. A holder on another host, or in a form not understood, is never called
 * gone: only its heartbeat can tell.
 */
export function holderIsGone(holder: string | null | undefined, host = os.hostname()): boolean {
  const m = /^(.*):(\d+)$/.exec(holder ?? '');
  if (!m || m[1] !== host) return false;
  const pid = Number(m[2]);
  if (pid === process.pid) return false;
  try {
    process.kill(pid, 0);
    return false;
  } catch (e) {
    // EPERM: it exists but belongs to another user
    return (e as NodeJS.ErrnoException).code === 'ESRCH';
  }
}

export class LockBusyError extends Error {
  constructor(public readonly runId: number | null, public readonly since: Date) {
    super(`Another run (#${runId ?? '?'}) holds the lock since ${since.toISOString()}.`);
    this.name = 'LockBusyError';
  }
}

/** A scheduled start refused because a scheduled run of the same job already did that day's work. */
export class DayAlreadyDoneError extends Error {
  constructor(public readonly runId: number, public readonly asOf: string) {
    super(`The scheduled run of ${asOf} has already been done (run #${runId}).`);
    this.name = 'DayAlreadyDoneError';
  }
}

/**
 * The ends of a run that did its day's work: every phase ran, with or without errors of single
 * items (a mail server refusing a message, one vehicle's duty), which a rerun would meet again.
 * A failed or cancelled run did not, and a later start of the same day goes on from its work.
 */
const DAY_DONE: JobRunStatus[] = ['succeeded', 'completed_with_errors'];

export const jobRepository = {
  /**
   * Takes the lock for `name` and creates the run row in the same transaction. Throws
   * {@link LockBusyError} when a live run holds it; takes over a lock whose heartbeat is older
   * than `staleMs`. With `oncePerDay`, first throws {@link DayAlreadyDoneError} when a run of the
   * same trigger already did the day `asOf`: checked in the lock's transaction, which no other
   * start runs beside (SQLite's write lock; the advisory lock of every PostgreSQL transaction),
   * so of several instances' schedulers firing for one day only the first starts a run.
   */
  async start(db: Db, input: { name: string; holder: string; staleMs: number; trigger: JobTrigger; asOf: string; requestedById: number | null; wallNow: Date; oncePerDay?: boolean }) {
    return db.sequelize.transaction(async (transaction) => {
      if (input.oncePerDay) {
        const done = await JobRun.findOne({
          attributes: ['id'],
          where: { job: input.name, trigger: input.trigger, asOf: input.asOf, status: { [Op.in]: DAY_DONE } },
          order: [['id', 'ASC']],
          transaction,
        });
        if (done) throw new DayAlreadyDoneError(done.id, input.asOf);
      }
      const lock = await JobLock.findByPk(input.name, { transaction });
      let takenOver: number | null = null;
      if (lock) {
        const fresh = input.wallNow.getTime() - lock.heartbeatAt.getTime() < input.staleMs;
        if (fresh && !holderIsGone(lock.holder)) throw new LockBusyError(lock.runId, lock.acquiredAt);
        takenOver = lock.runId;
        if (lock.runId) {
          await JobRun.update(
            { status: 'failed', endedAt: lock.heartbeatAt, message: 'The run stopped without finishing (no heartbeat); its lock was taken over by a later run.' },
            { where: { id: lock.runId, status: 'running' }, transaction },
          );
        }
        await lock.destroy({ transaction });
      }
      const run = await JobRun.create(
        { job: input.name, status: 'running', trigger: input.trigger, asOf: input.asOf, requestedById: input.requestedById, startedAt: input.wallNow, endedAt: null, heartbeatAt: input.wallNow, phase: 'starting', message: null },
        { transaction },
      );
      await JobLock.create({ name: input.name, runId: run.id, holder: input.holder, acquiredAt: input.wallNow, heartbeatAt: input.wallNow }, { transaction });
      return { runId: run.id, takenOver };
    });
  },

  /** Progress and heartbeat (run row and lock). */
  async heartbeat(runId: number, name: string, fields: { phase?: string; progressDone?: number; progressTotal?: number; counts?: Record<string, number> }, wallNow: Date) {
    await JobRun.update(
      { ...('phase' in fields ? { phase: fields.phase } : {}), progressDone: fields.progressDone, progressTotal: fields.progressTotal, heartbeatAt: wallNow, ...(fields.counts ? { counts: JSON.stringify(fields.counts) } : {}) },
      { where: { id: runId } },
    );
    await JobLock.update({ heartbeatAt: wallNow }, { where: { name, runId } });
  },

  /** Ends the run and releases the lock (only if this run still holds it). */
  async finish(runId: number, name: string, end: { status: JobRunStatus; counts: Record<string, number>; errors: { item: string; message: string }[]; message: string | null; wallNow: Date }) {
    await JobRun.update(
      { status: end.status, counts: JSON.stringify(end.counts), errors: JSON.stringify(end.errors), message: end.message, endedAt: end.wallNow, heartbeatAt: end.wallNow, phase: 'finished' },
      { where: { id: runId } },
    );
    await JobLock.destroy({ where: { name, runId } });
  },

  async list(opts: { job?: string; offset: number; pageSize: number }) {
    const where = opts.job ? { job: opts.job } : {};
    const { rows, count } = await JobRun.findAndCountAll({
      where,
      include: [{ model: User, as: 'requestedBy', attributes: ['id', 'name'] }],
      order: [['id', 'DESC']],
      offset: opts.offset,
      limit: opts.pageSize,
    });
    return { items: rows.map((r) => toRow(r, false)), total: count };
  },

  async get(id: number): Promise<JobRunRow | null> {
    const r = await JobRun.findByPk(id, { include: [{ model: User, as: 'requestedBy', attributes: ['id', 'name'] }] });
    return r ? toRow(r) : null;
  },

  async running(name: string) {
    const r = await JobRun.findOne({ where: { job: name, status: 'running', id: { [Op.gt]: 0 } }, order: [['id', 'DESC']] });
    return r ? r.id : null;
  },
};
