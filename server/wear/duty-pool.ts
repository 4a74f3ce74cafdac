/**
 * Runs the nightly duty computation (`computeVehicleDuty`, pure) either in the job's own thread
 * or on worker threads, so the job's thread is free to read and write the database while the
 * next batch is computed. Results are the same either way: each vehicle's duty depends only on
 * its own inputs and on cache entries that are the same for the same key.
 */
import { Worker } from 'node:worker_threads';
import { computeVehicleDuty, DutyCache, packDuty, type PackedDutyResult, type RouteInput, type VehicleWork } from './duty';
import type { FromWorker, ToWorker } from './duty-worker';

export interface DutyRunner {
  /** Duty of each vehicle, in the order given, packed for the database. */
  compute(works: VehicleWork[]): Promise<PackedDutyResult[]>;
  /** Closed-form solves and profile simulations so far, summed over threads. */
  stats(): { solves: number; simulations: number };
  /** Threads computing (0 = the job's own). */
  readonly workers: number;
  close(): Promise<void>;
}

/** Computes in the calling thread. */
export function inProcessDutyRunner(routes: Map<number, RouteInput>): DutyRunner {
  const cache = new DutyCache();
  return {
    workers: 0,
    async compute(works) {
      return works.map((w) => packDuty(computeVehicleDuty(w, routes, cache)));
    },
    stats: () => ({ solves: cache.solves, simulations: cache.simulations }),
    async close() {},
  };
}

const READY_TIMEOUT_MS = 30_000;

class DutyWorker {
  private readonly worker: Worker;
  private readonly pending = new Map<number, { resolve: (r: PackedDutyResult[]) => void; reject: (e: Error) => void }>();
  private nextId = 1;
  private dead: Error | null = null;
  solves = 0;
  simulations = 0;
  readonly ready: Promise<void>;

  constructor(routes: RouteInput[]) {
    this.worker = new Worker(new URL('./duty-worker-boot.mjs', import.meta.url), {
      workerData: { entry: new URL('./duty-worker.ts', import.meta.url).href },
    });
    this.ready = new Promise<void>((resolve, reject) => {
      const timer = setTimeout(() => reject(new Error('the worker did not start in time')), READY_TIMEOUT_MS);
      this.worker.on('message', (msg: FromWorker) => {
        if (msg.type === 'ready') {
          clearTimeout(timer);
          resolve();
          return;
        }
        const p = this.pending.get(msg.id);
        if (!p) return;
        this.pending.delete(msg.id);
        if (msg.type === 'failed') p.reject(new Error(msg.message));
        else {
          this.solves = msg.solves;
          this.simulations = msg.simulations;
          p.resolve(msg.results);
        }
      });
      const fail = (err: Error) => {
        clearTimeout(timer);
        this.dead ??= err;
        reject(err);
        for (const p of this.pending.values()) p.reject(err);
        this.pending.clear();
      };
      this.worker.on('error', fail);
      this.worker.on('exit', (code) => fail(new Error(`the duty worker stopped (exit code ${code})`)));
    });
    this.ready.catch(() => {});
    this.worker.postMessage({ type: 'init', routes } satisfies ToWorker);
  }

  compute(works: VehicleWork[]): Promise<PackedDutyResult[]> {
    if (this.dead) return Promise.reject(this.dead);
    const id = this.nextId++;
    return new Promise((resolve, reject) => {
      this.pending.set(id, { resolve, reject });
      this.worker.postMessage({ type: 'batch', id, works } satisfies ToWorker);
    });
  }

  async close() {
    this.worker.removeAllListeners('exit');
    await this.worker.terminate();
  }
}

/** Splits `works` into at most `n` consecutive parts of about equal trip counts. */
export function splitByTrips(works: VehicleWork[], n: number): VehicleWork[][] {
  const total = works.reduce((s, w) => s + w.trips.length, 0);
  const parts: VehicleWork[][] = [];
  let cur: VehicleWork[] = [];
  let acc = 0;
  for (const w of works) {
    cur.push(w);
    acc += w.trips.length;
    if (parts.length < n - 1 && acc >= (total * (parts.length + 1)) / n) {
      parts.push(cur);
      cur = [];
    }
  }
  if (cur.length || !parts.length) parts.push(cur);
  return parts;
}

/**
 * A runner on `workers` worker threads (0 = in the calling thread). If the threads cannot be
 * started, computes in the calling thread and says why in `fallback`.
 */
export async function createDutyRunner(routes: Map<number, RouteInput>, workers: number): Promise<{ runner: DutyRunner; fallback: string | null }> {
  if (workers <= 0) return { runner: inProcessDutyRunner(routes), fallback: null };
  const list = [...routes.values()];
  const pool = Array.from({ length: workers }, () => new DutyWorker(list));
  try {
    await Promise.all(pool.map((w) => w.ready));
  } catch (err) {
    await Promise.all(pool.map((w) => w.close()));
    return { runner: inProcessDutyRunner(routes), fallback: `duty worker threads could not start, computing in the job's thread: ${(err as Error).message}` };
  }
  return {
    fallback: null,
    runner: {
      workers,
      async compute(works) {
        const parts = splitByTrips(works, pool.length);
        const results = await Promise.all(parts.map((p, i) => (p.length ? pool[i].compute(p) : Promise.resolve([]))));
        return results.flat();
      },
      stats: () => ({ solves: pool.reduce((s, w) => s + w.solves, 0), simulations: pool.reduce((s, w) => s + w.simulations, 0) }),
      async close() {
        await Promise.all(pool.map((w) => w.close()));
      },
    },
  };
}
