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

/** Key of a vehicle's corners: vehicles with the same key share every cached solve and simulation. */
const cornersKeyOf = (w: VehicleWork) => w.axles.map((a) => `${a.corner.sprungMassKg}/${a.corner.unsprungMassKg}/${a.corner.springRateNPerM}/${a.corner.dampingNsPerM}/${a.corner.tireRateNPerM}`).join('|');

/**
 * Splits a batch among `n` threads so that each set of corners (each spec) keeps going to the
 * same thread: the cache entries a vehicle needs depend on its corners, so a thread that owns a
 * spec computes each of its profile simulations once for the whole run, where splitting by trip
 * counts alone has every thread simulate nearly every (corner, band, segment) again
 * (docs/methods.md "The nightly job on one machine"). `owner` and `load` carry the assignment from batch
 * to batch: a spec seen first goes to the thread with the fewest trips assigned so far. When one
 * thread would get more than {@link MAX_SPEC_SHARE} × its even share of the batch's trips (a fleet
 * of one or two specs), the batch is split by trip counts instead. Returns, per thread, the
 * indexes into `works` it computes, in order.
 */
export function splitBySpec(works: VehicleWork[], n: number, owner: Map<string, number>, load: number[]): number[][] {
  const parts: number[][] = Array.from({ length: n }, () => []);
  const trips = new Array<number>(n).fill(0);
  let total = 0;
  const keys = works.map(cornersKeyOf);
  for (let i = 0; i < works.length; i++) {
    let t = owner.get(keys[i]);
    if (t === undefined) {
      t = 0;
      for (let k = 1; k < n; k++) if (load[k] < load[t]) t = k;
      owner.set(keys[i], t);
    }
    const c = works[i].trips.length;
    load[t] += c;
    trips[t] += c;
    total += c;
    parts[t].push(i);
  }
  if (n > 1 && Math.max(...trips) > (MAX_SPEC_SHARE * total) / n) {
    const byTrips: number[][] = [];
    let at = 0;
    for (const p of splitByTrips(works, n)) {
      byTrips.push(p.map((_, k) => at + k));
      at += p.length;
    }
    while (byTrips.length < n) byTrips.push([]);
    return byTrips;
  }
  return parts;
}

/** Largest share of a batch's trips, against the even share, one thread is given by {@link splitBySpec}. */
export const MAX_SPEC_SHARE = 1.5;

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
  // which thread computes each set of corners, and the trips given to each so far (splitBySpec)
  const owner = new Map<string, number>();
  const load = new Array<number>(pool.length).fill(0);
  return {
    fallback: null,
    runner: {
      workers,
      async compute(works) {
        const parts = splitBySpec(works, pool.length, owner, load);
        const results = await Promise.all(parts.map((p, i) => (p.length ? pool[i].compute(p.map((k) => works[k])) : Promise.resolve([]))));
        const out = new Array<PackedDutyResult>(works.length);
        parts.forEach((p, i) => p.forEach((k, j) => (out[k] = results[i][j])));
        return out;
      },
      stats: () => ({ solves: pool.reduce((s, w) => s + w.solves, 0), simulations: pool.reduce((s, w) => s + w.simulations, 0) }),
      async close() {
        await Promise.all(pool.map((w) => w.close()));
      },
    },
  };
}
