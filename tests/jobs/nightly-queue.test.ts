import { spawn, type ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Queue, QueueEvents } from 'bullmq';
import { startTestServer, TEST_NOW, type PostgresTarget } from '../support/server';
import { cleanRun, diffTables, diffTablesNear, dump, NIGHTLY_TEST_ENV, type CleanRun } from '../support/nightly';
import { startPostgresTarget } from '../support/postgres-global';
import { startRedis, type PrivateRedis } from '../support/redis';
import { run } from '../../jobs/nightly';
import { DUTY_QUEUE, redisConnection } from '../../server/wear/duty-queue';

/**
 * The night's duty spread over `npm run worker` processes through Redis ends, table by table,
 * equal to the run computed in the job's own process on SQLite; a worker killed in the middle of
 * a job changes nothing. The same holds for a night on PostgreSQL (a private server this file
 * starts) with two workers, one of them killed while it holds a job.
 */

let ref: CleanRun;
let redis: PrivateRedis;
beforeAll(async () => {
  [ref, redis] = await Promise.all([cleanRun('sqlite'), startRedis()]);
}, 240_000);
afterAll(async () => redis?.stop());

interface WorkerProc {
  proc: ChildProcess;
  /** Jobs this worker reported done. */
  jobs(): number;
  output(): string;
}

/** A real worker process (jobs/worker.ts), as `npm run worker` starts it. */
function startWorker(url: string): WorkerProc {
  const proc = spawn(process.execPath, ['--import', 'tsx', 'jobs/worker.ts'], {
    env: { ...process.env, QUEUE_URL: url, DUTY_WORKER_LOCK_SECONDS: '2', LOG_LEVEL: 'debug' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  proc.stdout!.on('data', (b: Buffer) => (out += b.toString()));
  proc.stderr!.on('data', (b: Buffer) => (out += b.toString()));
  return { proc, jobs: () => (out.match(/: job \S+ done/g) ?? []).length, output: () => out };
}

/** The jobs a worker has said it started and not yet said it finished (it logs both at debug). */
function jobsInHand(w: WorkerProc): string[] {
  const out = w.output();
  const done = new Set([...out.matchAll(/: job (\S+) done/g)].map((m) => m[1]));
  return [...out.matchAll(/: job (\S+) started/g)].map((m) => m[1]).filter((id) => !done.has(id));
}

/**
 * Watches `w` until `over()` and kills it (SIGKILL) the first time it holds a job: it is frozen
 * (SIGSTOP) on a job it has started and not finished, and killed if Redis still has that job
 * active, else let go on to try at the next one. `killed()` says whether it was.
 */
function killWhileHolding(w: WorkerProc, probe: Queue, over: () => boolean) {
  let killed = false;
  const done = (async () => {
    while (!over() && !killed) {
      const [id] = jobsInHand(w);
      if (!id) {
        await new Promise((r) => setTimeout(r, 10));
        continue;
      }
      w.proc.kill('SIGSTOP');
      // what it wrote before it froze has come through the pipe
      await new Promise((r) => setTimeout(r, 300));
      if (!jobsInHand(w).includes(id) || (await (await probe.getJob(id))?.getState()) !== 'active') {
        w.proc.kill('SIGCONT');
        continue;
      }
      await stopWorker(w);
      killed = true;
    }
  })();
  return { killed: () => killed, done };
}

/**
 * The counts of what a run did, without those of how the duty was spread: the workers the queue
 * saw, and the solves and simulations of the caches (each worker process has its own for the
 * run, the threads in-process theirs, so the counts depend on which got which vehicles).
 */
const whatItDid = (counts: Record<string, number>) => Object.fromEntries(Object.entries(counts).filter(([k]) => !['queueWorkers', 'closedFormSolves', 'profileSimulations'].includes(k)));

async function stopWorker(w: WorkerProc) {
  if (w.proc.exitCode !== null || w.proc.signalCode !== null) return;
  const exited = new Promise((res) => w.proc.once('exit', res));
  w.proc.kill('SIGKILL');
  await exited;
}

/** Resolves once `n` workers listen on the queue. */
async function workersListening(url: string, n: number) {
  const q = new Queue(DUTY_QUEUE, { connection: redisConnection(url) });
  try {
    const deadline = Date.now() + 60_000;
    while ((await q.getWorkersCount()) < n) {
      if (Date.now() > deadline) throw new Error(`fewer than ${n} duty workers listen after 60 s`);
      await new Promise((r) => setTimeout(r, 100));
    }
  } finally {
    await q.close();
  }
}

describe('nightly duty over a job queue', () => {
  it('when two worker processes compute the duty through Redis, then the tables equal those of the run computed in-process, and both workers took jobs', async () => {
    const workers = [startWorker(redis.url), startWorker(redis.url)];
    const S = await startTestServer({ env: { ...NIGHTLY_TEST_ENV, QUEUE_URL: redis.url } });
    try {
      await workersListening(redis.url, 2);
      const r = await run({ db: S.db, config: S.config, log: S.log, mailer: S.mailer, now: TEST_NOW, trigger: 'test' });
      expect(r.status, JSON.stringify(r.errors)).toBe('succeeded');
      expect(r.counts.queueWorkers).toBe(2);
      expect(r.counts.trips).toBe(ref.counts.trips);
      expect(diffTables(ref.dump, await dump(S.db))).toEqual([]);
      expect(workers.map((w) => w.jobs() > 0), workers.map((w) => w.output()).join('\n---\n')).toEqual([true, true]);
    } finally {
      await S.stop();
      await Promise.all(workers.map(stopWorker));
    }
  }, 240_000);

  it('when the only worker is killed while it holds a job and another starts, then the job is computed again and the tables equal those of the in-process run', async () => {
    const first = startWorker(redis.url);
    let second: WorkerProc | null = null;
    const events = new QueueEvents(DUTY_QUEUE, { connection: redisConnection(redis.url) });
    const probe = new Queue(DUTY_QUEUE, { connection: redisConnection(redis.url) });
    let stalled = 0;
    events.on('stalled', () => stalled++);
    const S = await startTestServer({ env: { ...NIGHTLY_TEST_ENV, QUEUE_URL: redis.url } });
    try {
      await events.waitUntilReady();
      await workersListening(redis.url, 1);
      // Freeze the worker on a job it has claimed, so it can neither finish nor renew its claim,
      // then kill it and start another: the claim lapses and the other computes the job again.
      let killed: Promise<void> | null = null;
      events.on('active', () => {
        if (killed) return;
        first.proc.kill('SIGSTOP');
        killed = (async () => {
          if ((await probe.getActiveCount()) === 0) {
            // it had already finished that job and holds none: let it go on, try at the next one
            first.proc.kill('SIGCONT');
            killed = null;
            return;
          }
          await stopWorker(first);
          second = startWorker(redis.url);
        })();
      });
      const r = await run({ db: S.db, config: S.config, log: S.log, mailer: S.mailer, now: TEST_NOW, trigger: 'test' });
      expect(r.status, JSON.stringify(r.errors)).toBe('succeeded');
      expect(first.proc.signalCode).toBe('SIGKILL');
      expect(stalled).toBeGreaterThan(0);
      expect(diffTables(ref.dump, await dump(S.db))).toEqual([]);
    } finally {
      await S.stop();
      await events.close();
      await probe.close();
      await stopWorker(first);
      if (second) await stopWorker(second);
    }
  }, 240_000);

  it('when a queue is configured but no worker listens, then the job computes the duty itself, says so, and the tables equal those of the in-process run', async () => {
    const warnings: string[] = [];
    const S = await startTestServer({ env: { ...NIGHTLY_TEST_ENV, QUEUE_URL: redis.url } });
    try {
      const log = { ...S.log, warn: (m: string) => warnings.push(m) };
      const r = await run({ db: S.db, config: S.config, log, mailer: S.mailer, now: TEST_NOW, trigger: 'test' });
      expect(r.status, JSON.stringify(r.errors)).toBe('succeeded');
      expect(r.counts.queueWorkers).toBeUndefined();
      expect(warnings.join('\n')).toMatch(/no duty worker is listening/);
      expect(diffTables(ref.dump, await dump(S.db))).toEqual([]);
    } finally {
      await S.stop();
    }
  }, 240_000);
});

describe('nightly duty over a job queue, on PostgreSQL', () => {
  let pg: { target: PostgresTarget; stop(): void } | undefined;
  beforeAll(async () => {
    pg = await startPostgresTarget(['demo']);
  }, 300_000);
  afterAll(() => pg?.stop());

  it('when two worker processes compute the duty through Redis for a night on PostgreSQL, then every table equals the in-process run on SQLite (sums to 1e-9), with the same counts, and both workers took jobs', async () => {
    const workers = [startWorker(redis.url), startWorker(redis.url)];
    const P = await startTestServer({ env: { ...NIGHTLY_TEST_ENV, QUEUE_URL: redis.url }, postgres: pg!.target });
    try {
      expect(P.db.dialect).toBe('postgres');
      await workersListening(redis.url, 2);
      const r = await run({ db: P.db, config: P.config, log: P.log, mailer: P.mailer, now: TEST_NOW, trigger: 'test' });
      expect(r.status, JSON.stringify(r.errors)).toBe('succeeded');
      expect(r.counts.queueWorkers).toBe(2);
      expect(whatItDid(r.counts)).toEqual(whatItDid(ref.counts));
      // SQLite's SUM adds doubles with compensation, PostgreSQL's plainly: the last bits of sums differ
      expect(diffTablesNear(ref.dump, await dump(P.db), 1e-9)).toEqual([]);
      expect(workers.map((w) => w.jobs() > 0), workers.map((w) => w.output()).join('\n---\n')).toEqual([true, true]);
    } finally {
      await P.stop();
      await Promise.all(workers.map(stopWorker));
    }
  }, 600_000);

  it('when one of two workers is killed while it holds a job of a night on PostgreSQL, then the other computes it again and every table equals the in-process run on SQLite (sums to 1e-9)', async () => {
    const [doomed, survivor] = [startWorker(redis.url), startWorker(redis.url)];
    const events = new QueueEvents(DUTY_QUEUE, { connection: redisConnection(redis.url) });
    const probe = new Queue(DUTY_QUEUE, { connection: redisConnection(redis.url) });
    let stalled = 0;
    events.on('stalled', () => stalled++);
    const P = await startTestServer({ env: { ...NIGHTLY_TEST_ENV, QUEUE_URL: redis.url }, postgres: pg!.target });
    let over = false;
    try {
      await events.waitUntilReady();
      await workersListening(redis.url, 2);
      const killer = killWhileHolding(doomed, probe, () => over);
      const r = await run({ db: P.db, config: P.config, log: P.log, mailer: P.mailer, now: TEST_NOW, trigger: 'test' }).finally(() => (over = true));
      await killer.done;
      expect(r.status, JSON.stringify(r.errors)).toBe('succeeded');
      expect(killer.killed(), doomed.output()).toBe(true);
      expect(doomed.proc.signalCode).toBe('SIGKILL');
      // its job went back to the queue when its claim lapsed, and the survivor computed it
      expect(stalled).toBeGreaterThan(0);
      expect(survivor.jobs()).toBeGreaterThan(0);
      expect(whatItDid(r.counts)).toEqual(whatItDid(ref.counts));
      expect(diffTablesNear(ref.dump, await dump(P.db), 1e-9)).toEqual([]);
    } finally {
      over = true;
      await P.stop();
      await events.close();
      await probe.close();
      await Promise.all([stopWorker(doomed), stopWorker(survivor)]);
    }
  }, 600_000);
});
