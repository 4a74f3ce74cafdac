/**
 * The duty queue (server/wear/duty-queue.ts) in this process, on a private Redis
 * (tests/support/redis.ts): a duty worker started here with startDutyWorker, the coordinator's
 * runner from createQueueDutyRunner, and the small hand-written fleet of tests/support/wear-fleet.ts
 * (its inputs read as the nightly job reads them). What the queue hands back is held to
 * computeVehicleDuty computed directly in the test, bit for bit (both serialised with node:v8).
 * tests/jobs/nightly-queue.test.ts runs the whole night over real worker processes.
 */
import v8 from 'node:v8';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { Queue, QueueEvents } from 'bullmq';
import type { Redis } from 'ioredis';
import { startRedis, type PrivateRedis } from '../../support/redis';
import { BEFORE, PROFILE, TZ, wearFleetTemplate } from '../../support/wear-fleet';
import { computeVehicleDuty, DutyCache, packDuty, type RouteInput, type VehicleWork } from '../../../server/wear/duty';
import { attachProfiles } from '../../../server/wear/roughness-as-of';
import { wearRepository } from '../../../server/wear/repository';
import { createQueueDutyRunner, decode, DUTY_QUEUE, encode, redisConnection, routesKey, startDutyWorker, type DutyJobData, type DutyJobResult } from '../../../server/wear/duty-queue';

let redis: PrivateRedis;
let probe: Redis;
/** The fleet's duty inputs: its routes (survey 1's measured profile attached) and each vehicle's work. */
let fleet: { routes: Map<number, RouteInput>; works: VehicleWork[] };

beforeAll(async () => {
  const [r, template] = await Promise.all([startRedis(), wearFleetTemplate()]);
  redis = r;
  probe = redisConnection(redis.url);
  const run = await template.fresh();
  try {
    const repo = wearRepository(run.db.sequelize);
    const { routes } = await repo.routesForUnprocessed(BEFORE);
    attachProfiles(routes.values(), new Map([[1, PROFILE]]));
    const vehicleIds = (await repo.planUnprocessed(BEFORE)).map((p) => p.vehicleId);
    const [specOf, specs, dampers, trips] = await Promise.all([repo.vehicleSpecs(vehicleIds), repo.specAxles(), repo.dampersOf(vehicleIds), repo.unprocessedTrips(vehicleIds, BEFORE, TZ)]);
    const works: VehicleWork[] = [];
    for (const vehicleId of vehicleIds) {
      const axles = specs.get(specOf.get(vehicleId)!);
      if (axles?.length) works.push({ vehicleId, axles, dampers: dampers.get(vehicleId) ?? [], trips: trips.get(vehicleId) ?? [] });
    }
    fleet = { routes: routes as Map<number, RouteInput>, works };
  } finally {
    await run.done();
  }
}, 120_000);

afterEach(async () => {
  await probe.flushall();
});

afterAll(async () => {
  probe?.disconnect();
  await redis?.stop();
});

/** Clients connected to the Redis other than the probe (CLIENT LIST, one line a client). */
async function otherClients(): Promise<number> {
  const list = (await probe.client('LIST')) as string;
  return list.trim().split('\n').length - 1;
}

/** The other clients once their number holds still for a moment (connections just ended leave the list a moment later). */
async function settledClients(): Promise<number> {
  let last = await otherClients();
  for (;;) {
    await new Promise((r) => setTimeout(r, 50));
    const now = await otherClients();
    if (now === last) return now;
    last = now;
  }
}

/** Waits until the other clients are down to `n` (a closed connection leaves the server's list a moment later). */
async function clientsDownTo(n: number): Promise<number> {
  const deadline = Date.now() + 5000;
  let now = await otherClients();
  while (now > n && Date.now() < deadline) {
    await new Promise((r) => setTimeout(r, 50));
    now = await otherClients();
  }
  return now;
}

/** A duty worker in this process, once the queue sees it; counts the jobs it took (each attempt) and the attempts that failed. */
async function worker() {
  const w = startDutyWorker(redis.url, { lockMs: 2000 });
  const seen = { taken: 0, failed: 0 };
  w.worker.on('active', () => seen.taken++);
  w.worker.on('failed', () => seen.failed++);
  await w.worker.waitUntilReady();
  await withQueue(async (q) => {
    const deadline = Date.now() + 10_000;
    while ((await q.getWorkersCount()) < 1) {
      if (Date.now() > deadline) throw new Error('the duty worker is not seen on the queue after 10 s');
      await new Promise((r) => setTimeout(r, 20));
    }
  });
  return { ...w, seen };
}

const routeKeys = () => probe.keys(routesKey('*'));

/** A queue handle of the test's own, its connection closed with it (BullMQ leaves a connection it was given open). */
async function withQueue<T>(fn: (q: Queue<DutyJobData, DutyJobResult>) => Promise<T>): Promise<T> {
  const connection = redisConnection(redis.url);
  const q = new Queue<DutyJobData, DutyJobResult>(DUTY_QUEUE, { connection });
  try {
    return await fn(q);
  } finally {
    await q.close();
    await connection.quit();
  }
}

describe('the duty queue’s wire format', () => {
  it('when a value is encoded and decoded, then every double comes back to the bit (-0, NaN, the smallest subnormal, Float64Array), as node:v8 defines, in base64 text', () => {
    const value = { zero: -0, nan: Number.NaN, tiny: Number.MIN_VALUE, third: 1 / 3, profile: Float64Array.from([0.1, -2.5e-300, Math.PI]), days: new Map([[1, 'a']]) };
    const text = encode(value);
    expect(text).toMatch(/^[A-Za-z0-9+/]+=*$/);
    expect(Buffer.from(text, 'base64').equals(v8.serialize(value))).toBe(true);
    const back = decode<typeof value>(text);
    expect(Object.is(back.zero, -0)).toBe(true);
    expect(Number.isNaN(back.nan)).toBe(true);
    expect(back.tiny).toBe(Number.MIN_VALUE);
    expect(back.profile).toBeInstanceOf(Float64Array);
    expect(back).toStrictEqual(value);
  });
});

describe('duty over the queue, worker in this process', () => {
  it('when no worker listens, then there is no runner, nothing is left in Redis and no connection stays open', async () => {
    const before = await settledClients();
    const r = await createQueueDutyRunner(fleet.routes, redis.url);
    expect(r).toEqual({ runner: null, workersSeen: 0 });
    expect(await routeKeys()).toEqual([]);
    expect(await clientsDownTo(before)).toBe(before);
  });

  it('when one worker listens, then the fleet’s duty comes back, in order, equal bit for bit (every double by Object.is) to computeVehicleDuty computed here, in two jobs, with the solves and simulations of one shared cache', async () => {
    expect(fleet.works.length).toBeGreaterThanOrEqual(2);
    const w = await worker();
    try {
      const { runner, workersSeen } = await createQueueDutyRunner(fleet.routes, redis.url);
      expect(workersSeen).toBe(1);
      expect(runner!.workers).toBe(1);
      const got = await runner!.compute(fleet.works);
      const cache = new DutyCache();
      const direct = fleet.works.map((work) => packDuty(computeVehicleDuty(work, fleet.routes, cache)));
      expect(direct.reduce((s, d) => s + d.dutyCount, 0)).toBeGreaterThan(0);
      expect(cache.simulations).toBeGreaterThan(0);
      expect(got.map((g) => g.dutyCount)).toEqual(direct.map((d) => d.dutyCount));
      expect(got).toStrictEqual(direct);
      // one worker seen → its batch is cut into two jobs, so an uneven pair of workers evens out
      expect(w.seen.taken).toBe(2);
      expect(runner!.stats()).toEqual({ solves: cache.solves, simulations: cache.simulations });
      // the same run again: the worker keeps the run's routes and cache, so nothing is solved twice
      const again = await runner!.compute(fleet.works.slice(0, 1));
      expect(again).toStrictEqual(direct.slice(0, 1));
      expect(runner!.stats()).toEqual({ solves: cache.solves, simulations: cache.simulations });
      // nothing to compute: no job
      expect(await runner!.compute([])).toEqual([]);
      expect(w.seen.taken).toBe(3);
      await runner!.close();
    } finally {
      await w.close();
    }
  });

  it('while a run is open, then its routes are one Redis value kept a day at most, finished jobs are not kept, and closing the runner deletes the routes and leaves no connection open', async () => {
    const w = await worker();
    try {
      const before = await settledClients();
      const { runner } = await createQueueDutyRunner(fleet.routes, redis.url);
      const keys = await routeKeys();
      expect(keys).toHaveLength(1);
      const ttl = await probe.ttl(keys[0]);
      expect(ttl).toBeGreaterThan(24 * 3600 - 60);
      expect(ttl).toBeLessThanOrEqual(24 * 3600);
      expect(v8.deserialize((await probe.getBuffer(keys[0]))!)).toStrictEqual([...fleet.routes.values()]);
      await runner!.compute(fleet.works);
      expect(await withQueue(async (q) => [await q.getCompletedCount(), await q.getWaitingCount(), await q.getFailedCount()])).toEqual([0, 0, 0]);
      await runner!.close();
      expect(await routeKeys()).toEqual([]);
      expect(await clientsDownTo(before)).toBe(before);
    } finally {
      await w.close();
    }
  });

  it('when jobs of an earlier run still wait in the queue (one waiting, one delayed for its retry), then a new run drops them before it starts', async () => {
    const w = await worker();
    try {
      await withQueue(async (q) => {
        // the queue held so the worker takes neither before the run starts
        await q.pause();
        const waiting = await q.add('duty', { runKey: 'earlier', works: encode(fleet.works) });
        const delayed = await q.add('duty', { runKey: 'earlier', works: encode(fleet.works) }, { delay: 60_000 });
        expect(await q.getJobCounts('waiting', 'paused', 'delayed')).toEqual({ waiting: 0, paused: 1, delayed: 1 });
        const { runner } = await createQueueDutyRunner(fleet.routes, redis.url);
        expect(await q.getJob(waiting.id!)).toBeUndefined();
        expect(await q.getJob(delayed.id!)).toBeUndefined();
        await runner!.close();
        await q.resume();
      });
    } finally {
      await w.close();
    }
  });

  it('when a job’s computation throws, then it is tried again before the batch is refused with its message, and the worker goes on with the next batch', async () => {
    const w = await worker();
    try {
      const { runner } = await createQueueDutyRunner(fleet.routes, redis.url);
      const bad = { ...fleet.works[0], axles: undefined } as unknown as VehicleWork;
      await expect(runner!.compute([bad])).rejects.toThrow(/axles|undefined/);
      expect(w.seen.failed).toBeGreaterThan(1);
      const next = await runner!.compute(fleet.works.slice(1, 2));
      expect(next).toStrictEqual([packDuty(computeVehicleDuty(fleet.works[1], fleet.routes, new DutyCache()))]);
      await runner!.close();
    } finally {
      await w.close();
    }
  });

  it('when two runs are open at once, then each has its own routes in Redis, and closing one leaves the other computing', async () => {
    const w = await worker();
    try {
      const first = (await createQueueDutyRunner(fleet.routes, redis.url)).runner!;
      const second = (await createQueueDutyRunner(fleet.routes, redis.url)).runner!;
      expect(await routeKeys()).toHaveLength(2);
      await first.close();
      expect(await routeKeys()).toHaveLength(1);
      const got = await second.compute(fleet.works);
      const cache = new DutyCache();
      expect(got).toStrictEqual(fleet.works.map((work) => packDuty(computeVehicleDuty(work, fleet.routes, cache))));
      await second.close();
      expect(await routeKeys()).toEqual([]);
    } finally {
      await w.close();
    }
  });

  it('when a run is closed while one of its jobs waits for a retry, then that job is dropped with the run', async () => {
    const w = await worker();
    try {
      const { runner } = await createQueueDutyRunner(fleet.routes, redis.url);
      const [key] = await routeKeys();
      const runKey = key.slice(routesKey('').length);
      await withQueue(async (q) => {
        // as BullMQ holds a failed attempt until its back-off has passed
        const retry = await q.add('duty', { runKey, works: encode(fleet.works) }, { delay: 60_000 });
        expect(await q.getDelayedCount()).toBe(1);
        await runner!.close();
        expect(await q.getJob(retry.id!)).toBeUndefined();
        expect(await q.getDelayedCount()).toBe(0);
      });
    } finally {
      await w.close();
    }
  });

  it('when a job names a run whose routes are gone from Redis, then it fails saying so', async () => {
    const w = await worker();
    const events = new QueueEvents(DUTY_QUEUE, { connection: { host: '127.0.0.1', port: Number(new URL(redis.url).port) } });
    try {
      await events.waitUntilReady();
      await withQueue(async (q) => {
        const job = await q.add('duty', { runKey: 'ended', works: encode(fleet.works.slice(0, 1)) });
        await expect(job.waitUntilFinished(events)).rejects.toThrow('the routes of run ended are no longer in Redis (the run has ended)');
      });
    } finally {
      await events.close();
      await w.close();
    }
  });

  it('when the routes cannot be serialised, then the runner is refused and no connection stays open', async () => {
    const w = await worker();
    try {
      const before = await settledClients();
      const routes = new Map([[1, { id: 1, lengthM: 1, segments: [], cannot: () => 1 } as unknown as RouteInput]]);
      await expect(createQueueDutyRunner(routes, redis.url)).rejects.toThrow(/could not be cloned/);
      expect(await clientsDownTo(before)).toBe(before);
    } finally {
      await w.close();
    }
  });

  it('when a worker is closed, then it leaves the queue and no connection of its own open', async () => {
    const before = await settledClients();
    const w = await worker();
    expect(await otherClients()).toBeGreaterThan(before);
    await w.close();
    expect(await clientsDownTo(before)).toBe(before);
    expect(await withQueue((q) => q.getWorkersCount())).toBe(0);
  });
});
