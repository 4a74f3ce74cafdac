/**
 * The nightly duty spread over worker processes on any number of machines, through a BullMQ
 * queue on Redis (`QUEUE_URL`). The job's coordinating process stays what it is without a
 * queue — it plans the batches, reads their inputs, writes every result and keeps the lock, the
 * run row, progress and crash safety — and only hands the pure computation
 * (`computeVehicleDuty`) to `npm run worker` processes (jobs/worker.ts), as the thread pool in
 * duty-pool.ts hands it to threads. Each vehicle's duty depends only on its own inputs, so the
 * tables end the same however the work was spread, retried or interrupted.
 *
 * Each batch of vehicles goes out as a few queue jobs of about equal trip counts; the run's
 * routes (with the measured profiles behind them) go once, as one Redis value per run. Inputs
 * and results travel in V8's structured-clone format (node:v8), which keeps every double to the
 * bit and carries the profiles' Float64Arrays: a duty computed on a worker is byte for byte the
 * duty computed here. Workers must therefore run the same version of the app.
 *
 * A worker killed in the middle of a job stops renewing the job's lock; another worker's stalled
 * check puts the job back in the queue and it is computed again. A job whose computation throws
 * is retried a few times, then fails the run (which the next run carries on from, as after any
 * failure).
 */
import v8 from 'node:v8';
import crypto from 'node:crypto';
import { Queue, QueueEvents, Worker, type Job } from 'bullmq';
import { Redis } from 'ioredis';
import type { DutyRunner } from './duty-pool';
import { createDutyRunner, splitByTrips } from './duty-pool';
import { computeVehicleDuty, DutyCache, packDuty, type PackedDutyResult, type RouteInput, type VehicleWork } from './duty';

/** The queue the coordinator fills and `npm run worker` empties. */
export const DUTY_QUEUE = 'reboundry-duty';

/**
 * A Redis connection as BullMQ wants it (commands wait for a reconnect instead of failing).
 * Connection errors go to `onError` (ioredis retries on its own; without a listener it prints
 * each one as an unhandled error event).
 */
export function redisConnection(url: string, onError: (err: Error) => void = () => undefined): Redis {
  const r = new Redis(url, { maxRetriesPerRequest: null, enableReadyCheck: true });
  r.on('error', onError);
  return r;
}

/** The queue's address without its password, for messages. */
export const safeUrl = (url: string) => url.replace(/\/\/[^@/]*@/, '//…@');

/** How long the nightly job waits for the queue's Redis before it computes the duty itself [ms]. */
export const QUEUE_CONNECT_MS = 5000;

/** Resolves once the connection is ready; rejects after `ms` naming the last connection error. */
export function whenReady(connection: Redis, url: string, ms: number): Promise<void> {
  if (connection.status === 'ready') return Promise.resolve();
  return new Promise((resolve, reject) => {
    let last: Error | null = null;
    const onError = (err: Error) => (last = err);
    const done = (err?: Error) => {
      clearTimeout(timer);
      connection.off('ready', onReady);
      connection.off('error', onError);
      if (err) reject(err);
      else resolve();
    };
    const onReady = () => done();
    const timer = setTimeout(() => done(new Error(`the duty queue's Redis at ${safeUrl(url)} did not answer within ${ms / 1000} s${last ? ` (${last.message})` : ''}`)), ms);
    connection.on('ready', onReady);
    connection.on('error', onError);
  });
}

/** Key of a run's routes; kept a day at most, deleted when the run's duty phase ends. */
export const routesKey = (runKey: string) => `reboundry:duty-routes:${runKey}`;

export interface DutyJobData {
  runKey: string;
  /** The vehicles' inputs, v8-serialised, base64. */
  works: string;
}

export interface DutyJobResult {
  /** The vehicles' packed duty in the order given, v8-serialised, base64. */
  results: string;
  solves: number;
  simulations: number;
}

export const encode = (value: unknown) => v8.serialize(value).toString('base64');
export const decode = <T>(text: string) => v8.deserialize(Buffer.from(text, 'base64')) as T;

/** Jobs a batch is cut into per worker seen at the start: enough to even out unequal workers. */
const JOBS_PER_WORKER = 2;
/** Attempts of a job whose computation throws (a killed worker's job is put back separately). */
const ATTEMPTS = 3;

/**
 * A {@link DutyRunner} on the queue at `url`. Resolves to a null runner when no worker is
 * listening or the Redis does not answer within `connectMs` (`unreachable` says why; the caller
 * computes here instead and says so), so a night never waits for workers that were never
 * started or a Redis that is down.
 */
export async function createQueueDutyRunner(
  routes: Map<number, RouteInput>,
  url: string,
  connectMs = QUEUE_CONNECT_MS,
): Promise<{ runner: DutyRunner | null; workersSeen: number; unreachable?: string }> {
  const connection = redisConnection(url);
  try {
    await whenReady(connection, url, connectMs);
  } catch (err) {
    connection.disconnect();
    return { runner: null, workersSeen: 0, unreachable: (err as Error).message };
  }
  const eventsConnection = redisConnection(url);
  const queue = new Queue<DutyJobData, DutyJobResult>(DUTY_QUEUE, { connection });
  const events = new QueueEvents(DUTY_QUEUE, { connection: eventsConnection });
  // BullMQ leaves a connection it was handed open when it closes: both are ended here
  const shut = async () => {
    await Promise.allSettled([queue.close(), events.close()]);
    connection.disconnect();
    eventsConnection.disconnect();
  };
  try {
    const workersSeen = await queue.getWorkersCount();
    if (!workersSeen) {
      await shut();
      return { runner: null, workersSeen };
    }
    // Jobs of an earlier run that stopped before their results were taken: nobody waits for them.
    await queue.drain(true);
    await events.waitUntilReady();
    const runKey = crypto.randomUUID();
    await connection.set(routesKey(runKey), v8.serialize([...routes.values()]), 'EX', 24 * 3600);
    let solves = 0;
    let simulations = 0;
    const parts = Math.max(1, workersSeen * JOBS_PER_WORKER);
    return {
      workersSeen,
      runner: {
        workers: workersSeen,
        async compute(works: VehicleWork[]) {
          const pieces = splitByTrips(works, parts).filter((p) => p.length);
          const jobs: Job<DutyJobData, DutyJobResult>[] = await queue.addBulk(
            pieces.map((p) => ({
              name: 'duty',
              data: { runKey, works: encode(p) },
              opts: { attempts: ATTEMPTS, backoff: { type: 'fixed', delay: 500 }, removeOnComplete: true, removeOnFail: 100 },
            })),
          );
          const done = await Promise.all(jobs.map((j) => j.waitUntilFinished(events) as Promise<DutyJobResult>));
          const out: PackedDutyResult[] = [];
          for (const d of done) {
            solves += d.solves;
            simulations += d.simulations;
            for (const r of decode<PackedDutyResult[]>(d.results)) out.push(r);
          }
          return out;
        },
        stats: () => ({ solves, simulations }),
        async close() {
          await queue.drain(true).catch(() => undefined);
          await connection.del(routesKey(runKey)).catch(() => undefined);
          await shut();
        },
      },
    };
  } catch (err) {
    await shut();
    throw err;
  }
}

/**
 * The nightly duty's runner: the queue's workers when `queueUrl` is set and any listen (with how
 * many), else `threads` worker threads of this process (0 = the calling thread), with the reason
 * in `fallback` when a queue was asked for and is not used.
 */
export async function dutyRunnerFor(
  routes: Map<number, RouteInput>,
  queueUrl: string | undefined,
  threads: number,
): Promise<{ runner: DutyRunner; fallback: string | null; queueWorkers?: number }> {
  if (queueUrl) {
    const { runner, unreachable } = await createQueueDutyRunner(routes, queueUrl);
    if (runner) return { runner, fallback: null, queueWorkers: runner.workers };
    const local = await createDutyRunner(routes, threads);
    const why = unreachable ?? 'no duty worker is listening on the queue (start `npm run worker`)';
    return { runner: local.runner, fallback: `${why}; computing the duty in this process${local.fallback ? `; ${local.fallback}` : ''}` };
  }
  return createDutyRunner(routes, threads);
}

/**
 * The computation of one queue job, for `npm run worker` (jobs/worker.ts): the run's routes are
 * read from Redis once per run and kept with their cache of solved and simulated segments, as a
 * worker thread keeps them for the run it serves.
 */
export function dutyJobProcessor(connection: Redis) {
  let current: { runKey: string; routes: Map<number, RouteInput>; cache: DutyCache } | null = null;
  return async (job: Job<DutyJobData, DutyJobResult>): Promise<DutyJobResult> => {
    const { runKey } = job.data;
    if (current?.runKey !== runKey) {
      const blob = await connection.getBuffer(routesKey(runKey));
      if (!blob) throw new Error(`the routes of run ${runKey} are no longer in Redis (the run has ended)`);
      const list = v8.deserialize(blob) as RouteInput[];
      current = { runKey, routes: new Map(list.map((r) => [r.id, r])), cache: new DutyCache() };
    }
    const { routes, cache } = current;
    const solves0 = cache.solves;
    const sims0 = cache.simulations;
    const results = decode<VehicleWork[]>(job.data.works).map((w) => packDuty(computeVehicleDuty(w, routes, cache)));
    return { results: encode(results), solves: cache.solves - solves0, simulations: cache.simulations - sims0 };
  };
}

export interface DutyWorkerOptions {
  /** How long a job stays claimed without its lock being renewed [ms]: after it, a killed
   * worker's job goes back to the queue. */
  lockMs: number;
  /** Jobs computed at once by this process (the computation is CPU-bound: one per process). */
  concurrency?: number;
}

/** A worker taking duty jobs from the queue at `url` until closed; `onConnectionError` hears each failed attempt to reach the Redis. */
export function startDutyWorker(url: string, opts: DutyWorkerOptions & { onConnectionError?: (err: Error) => void }) {
  const connection = redisConnection(url, opts.onConnectionError);
  const workerConnection = redisConnection(url, opts.onConnectionError);
  const worker = new Worker<DutyJobData, DutyJobResult>(DUTY_QUEUE, dutyJobProcessor(connection), {
    connection: workerConnection,
    concurrency: opts.concurrency ?? 1,
    lockDuration: opts.lockMs,
    stalledInterval: Math.max(1000, Math.round(opts.lockMs / 2)),
    // a job put back after a worker died is tried again, up to this many deaths
    maxStalledCount: 3,
  });
  return {
    worker,
    async close() {
      await worker.close();
      connection.disconnect();
      workerConnection.disconnect();
    },
  };
}
