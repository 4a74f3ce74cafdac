/**
 * The duty runner's thread protocol (duty-pool.ts ⇄ duty-worker.ts) in this thread: node's
 * Worker is replaced by a stand-in that loads the real worker module against a stand-in parent
 * port, so the messages, the failure paths and the fallback are checked without starting
 * threads (tests/server/wear/duty.test.ts and tests/jobs/nightly-threads.test.ts start real ones).
 */
import { EventEmitter } from 'node:events';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { RouteInput, VehicleWork } from '../../../server/wear/duty';

type Listener = (msg: unknown) => void;

/** The parent port the worker module sees when it is loaded (set before each load). */
const port: { current: { on: (ev: string, fn: Listener) => void; postMessage: (m: unknown) => void } | null } = { current: null };
const workers: FakeWorker[] = [];
/** How the next stand-in workers behave: run the worker module, never answer, or fail to start. */
const mode: { next: 'run' | 'silent' | 'crash' } = { next: 'run' };
let loading: Promise<void> = Promise.resolve();

class FakeWorker extends EventEmitter {
  readonly toWorker: Listener[] = [];
  readonly queue: unknown[] = [];
  loaded = false;
  terminated = 0;
  constructor(
    readonly url: URL,
    readonly opts: { workerData: { entry: string } },
  ) {
    super();
    workers.push(this);
    const m = mode.next;
    if (m === 'crash') {
      queueMicrotask(() => this.emit('error', new Error('cannot load TypeScript')));
      return;
    }
    if (m === 'silent') return;
    // load the worker module once per stand-in, one after the other (each sees its own port)
    loading = loading.then(async () => {
      port.current = { on: (_ev, fn) => void this.toWorker.push(fn), postMessage: (msg) => queueMicrotask(() => this.emit('message', msg)) };
      vi.resetModules();
      await import('../../../server/wear/duty-worker');
      port.current = null;
      this.loaded = true;
      for (const q of this.queue.splice(0)) this.deliver(q);
    });
  }
  private deliver(msg: unknown) {
    for (const fn of this.toWorker) fn(structuredClone(msg));
  }
  postMessage(msg: unknown) {
    if (this.loaded) this.deliver(msg);
    else this.queue.push(msg);
  }
  async terminate() {
    this.terminated++;
    this.emit('exit', 1);
    return 1;
  }
}

vi.mock('node:worker_threads', () => ({
  Worker: FakeWorker,
  get parentPort() {
    return port.current;
  },
}));

const { createDutyRunner, inProcessDutyRunner } = await import('../../../server/wear/duty-pool');

const corner = { sprungMassKg: 430, unsprungMassKg: 46, springRateNPerM: 32000, dampingNsPerM: 2400, tireRateNPerM: 260000 };
const routes = new Map<number, RouteInput>([
  [1, { id: 1, lengthM: 1000, segments: [{ id: 1, startM: 0, endM: 1000, speedKmh: null, gdN0: 64e-6, profile: null }] }],
  [2, { id: 2, lengthM: 1000, segments: [{ id: 2, startM: 0, endM: 1000, speedKmh: 30, gdN0: 256e-6, profile: null }] }],
]);
const work = (vehicleId: number, routeId: number, trips: number): VehicleWork => ({
  vehicleId,
  axles: [{ axleIndex: 0, corner, ratedDamperLifeKm: 90000 }],
  dampers: [{ id: vehicleId * 10, position: 'FL', axleIndex: 0, installedAt: '2026-01-01', removedAt: null }],
  trips: Array.from({ length: trips }, (_, i) => ({ id: vehicleId * 100 + i, routeId, driverId: null, tripDate: '2026-11-01', durationS: 120, distanceKm: 1, meanSpeedKmh: 40 + i, payloadKg: null })),
});

afterEach(() => {
  workers.length = 0;
  mode.next = 'run';
  vi.useRealTimers();
});

describe('duty on worker threads, the protocol', () => {
  it('when two workers compute, then each gets the routes and its consecutive part, and the results, in order, equal those of this thread; stats are summed over the workers', async () => {
    const { runner, fallback } = await createDutyRunner(routes, 2);
    expect(fallback).toBeNull();
    expect(runner.workers).toBe(2);
    expect(workers).toHaveLength(2);
    for (const w of workers) {
      expect(w.url.href).toMatch(/\/server\/wear\/duty-worker-boot\.mjs$/);
      expect(w.opts.workerData.entry).toMatch(/^file:.*\/server\/wear\/duty-worker\.ts$/);
    }
    const works = [work(1, 1, 3), work(2, 2, 1), work(3, 1, 2), work(4, 2, 2)];
    const threaded = await runner.compute(works);
    const local = await inProcessDutyRunner(routes).compute(works);
    expect(threaded).toEqual(local);
    expect(threaded.map((r) => r.dutyCount)).toEqual([6, 2, 4, 4]);
    // parts of about equal trips: vehicles 1–2 (4 trips) on the first, 3–4 (4) on the second
    // → the first solved its two speed bands on two routes, the second too
    const local1 = inProcessDutyRunner(routes);
    await local1.compute(works.slice(0, 2));
    const local2 = inProcessDutyRunner(routes);
    await local2.compute(works.slice(2));
    expect(runner.stats()).toEqual({ solves: local1.stats().solves + local2.stats().solves, simulations: 0 });
    expect(local1.stats().solves).toBeGreaterThan(0);
    // fewer vehicles than workers: the idle worker is not asked
    expect(await runner.compute([work(5, 1, 1)])).toEqual(await inProcessDutyRunner(routes).compute([work(5, 1, 1)]));
    await runner.close();
    expect(workers.map((w) => w.terminated)).toEqual([1, 1]);
  });

  it('when a batch throws in the worker, then that batch is refused with its message and the worker goes on', async () => {
    const { runner } = await createDutyRunner(routes, 1);
    const bad = { ...work(1, 1, 1), axles: undefined } as unknown as VehicleWork;
    await expect(runner.compute([bad])).rejects.toThrow(/axles|undefined/);
    expect(await runner.compute([work(2, 1, 1)])).toEqual(await inProcessDutyRunner(routes).compute([work(2, 1, 1)]));
    await runner.close();
  });

  it('when a worker fails or stops, then its pending batch and every later one are refused with the reason', async () => {
    const { runner } = await createDutyRunner(routes, 1);
    const w = workers[0];
    // hold the next batch in the worker: the failure comes first
    w.loaded = false;
    const pending = runner.compute([work(1, 1, 1)]);
    w.emit('error', new Error('out of memory'));
    await expect(pending).rejects.toThrow('out of memory');
    await expect(runner.compute([work(2, 1, 1)])).rejects.toThrow('out of memory');
    await runner.close();

    const second = await createDutyRunner(routes, 1);
    const w2 = workers[1];
    w2.loaded = false;
    const held = second.runner.compute([work(1, 1, 1)]);
    w2.emit('exit', 3);
    await expect(held).rejects.toThrow('the duty worker stopped (exit code 3)');
    await expect(second.runner.compute([work(1, 1, 1)])).rejects.toThrow('the duty worker stopped (exit code 3)');
    // closing does not count as a failure
    await second.runner.close();
  });

  it('when a worker cannot start, then the duty is computed in this thread and the reason is given', async () => {
    mode.next = 'crash';
    const { runner, fallback } = await createDutyRunner(routes, 2);
    expect(fallback).toBe("duty worker threads could not start, computing in the job's thread: cannot load TypeScript");
    expect(runner.workers).toBe(0);
    expect(workers.map((w) => w.terminated)).toEqual([1, 1]);
    expect(await runner.compute([work(1, 1, 2)])).toEqual(await inProcessDutyRunner(routes).compute([work(1, 1, 2)]));
  });

  it('when a worker does not say it is ready within 30 s, then the duty is computed in this thread', async () => {
    vi.useFakeTimers();
    mode.next = 'silent';
    const started = createDutyRunner(routes, 1);
    await vi.advanceTimersByTimeAsync(29_999);
    expect(workers[0].terminated).toBe(0);
    await vi.advanceTimersByTimeAsync(1);
    const { runner, fallback } = await started;
    expect(fallback).toBe("duty worker threads could not start, computing in the job's thread: the worker did not start in time");
    expect(runner.workers).toBe(0);
  });

  it('when no workers are asked for, then none is started and the duty is computed in this thread', async () => {
    const { runner, fallback } = await createDutyRunner(routes, 0);
    expect(fallback).toBeNull();
    expect(runner.workers).toBe(0);
    expect(workers).toHaveLength(0);
    await runner.compute([work(1, 2, 1)]);
    expect(runner.stats()).toEqual({ solves: 1, simulations: 0 });
    await runner.close();
  });
});
