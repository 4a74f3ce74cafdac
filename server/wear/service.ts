/**
 * The duty and wear phases of the nightly run: trips → duty records (batched, one transaction
 * per batch with the trips' processed mark), then each touched damper's daily history and
 * totals (recomputed from its duty records, so the result does not depend on how the work was
 * split or interrupted), then every fitted damper's prediction as of the run's day.
 */
import type { Sequelize } from 'sequelize';
import type { AxleInput, RouteInput, VehicleWork } from './duty';
import { attachProfiles } from './roughness-as-of';
import { dutyRunnerFor } from './duty-queue';
import { estimateOpening, levelsOf, predictionWindow, type LifeBasis, type LifeResolver, type PredictOptions } from './wear';
import { createPredictionRunner, predictionThreads } from './prediction-pool';
import { priorLifeResolver } from '../workshop/life';
import { wearRepository, type WearStart } from './repository';
import { dutySummaryRepository, retentionStart } from './duty-summary';

export interface ItemError {
  item: string;
  message: string;
}

export interface PhaseContext {
  sequelize: Sequelize;
  /** Logical time of the run (stamps written rows). */
  now: Date;
  /** The run's day (YYYY-MM-DD); trips that started before the end of it are processed. */
  asOf: string;
  /** Instant the day after `asOf` starts in the app's time zone. */
  before: Date;
  timeZone: string;
  dataDir: string;
  batchTrips: number;
  /** Worker threads for the duty computation (0 or absent = this thread). */
  dutyWorkers?: number;
  /** Redis of the duty queue: when set and workers listen, `npm run worker` processes compute the duty. */
  queueUrl?: string;
  /** Where a fallback (e.g. worker threads not available) is reported. */
  warn?: (message: string) => void;
  thresholdFraction: number;
  /** Calendar life [years] and the life quantile inspections are scheduled on. */
  calendarYears?: number;
  scheduleQuantile?: number;
  signal?: AbortSignal;
  /** The life each damper is measured against (default: the prior of every spec). */
  lifeResolver?: LifeResolver;
  /** Only these vehicles' dampers in the prediction phase (a vehicle re-predicted at once). */
  vehicleIds?: number[];
  /** Test hook: throw after this many committed batches (a crash in the middle of the run). */
  failAfterBatches?: number;
  /** Dampers per chunk of the wear and prediction phases (default {@link WEAR_CHUNK}). */
  damperChunk?: number;
  /** Days of per-trip duty kept (older days are folded into the daily summary); absent = all. */
  tripDutyRetentionDays?: number;
  /** Test hook: throw after folding this many days (a crash in the middle of the fold). */
  failAfterFoldDays?: number;
  /** Loads a measured profile (server/roads/profile-store.ts `loadSurveyProfile`). */
  loadProfile: (dataDir: string, surveyId: number) => Promise<{ dxM: number; startM: number; elevationsM: Float64Array }>;
  progress: (phase: string, done: number, total: number) => Promise<void> | void;
  errors: ItemError[];
  counts: Record<string, number>;
}

export class RunAborted extends Error {
  constructor() {
    super('The run was cancelled.');
    this.name = 'RunAborted';
  }
}

const checkAbort = (signal?: AbortSignal) => {
  if (signal?.aborted) throw new RunAborted();
};

const add = (counts: Record<string, number>, key: string, n: number) => {
  counts[key] = (counts[key] ?? 0) + n;
};

/**
 * Phase 1: every unprocessed trip → duty records, in batches of whole vehicles. Pipelined: while
 * one batch is being written, the next two are read and computed (on worker threads when
 * `ctx.dutyWorkers` > 0). Batches commit one at a time, in order.
 */
export async function processTrips(ctx: PhaseContext) {
  const repo = wearRepository(ctx.sequelize);
  const plan = await repo.planUnprocessed(ctx.before);
  const totalTrips = plan.reduce((s, p) => s + p.trips, 0);
  await ctx.progress('duty', 0, totalTrips);
  if (!plan.length) return;
  const specs = await repo.specAxles();
  const { routes, surveyIds } = await repo.routesForUnprocessed(ctx.before);
  // measured profiles behind the segments' roughness on the trips' days
  const profiles = new Map<number, { dxM: number; startM: number; elevationsM: Float64Array }>();
  for (const id of surveyIds) {
    try {
      profiles.set(id, await ctx.loadProfile(ctx.dataDir, id));
    } catch (err) {
      ctx.errors.push({ item: `survey ${id}`, message: `profile not readable, its segments use the closed form: ${(err as Error).message}` });
    }
  }
  // on every version of each route's segments (the value in force on each trip's day)
  attachProfiles(routes.values(), profiles);
  // batches of whole vehicles, in vehicle order: a rerun after a crash forms the same batches
  const batches: number[][] = [];
  let cur: number[] = [];
  let n = 0;
  for (const p of plan) {
    cur.push(p.vehicleId);
    n += p.trips;
    if (n >= ctx.batchTrips) {
      batches.push(cur);
      cur = [];
      n = 0;
    }
  }
  if (cur.length) batches.push(cur);

  /** Reads one batch's inputs; vehicles whose spec has no axles are reported and left out. */
  const load = async (vehicleIds: number[]) => {
    const [specOf, dampers, trips] = await Promise.all([
      repo.vehicleSpecs(vehicleIds),
      repo.dampersOf(vehicleIds),
      repo.unprocessedTrips(vehicleIds, ctx.before, ctx.timeZone),
    ]);
    const works: VehicleWork[] = [];
    let tripCount = 0;
    for (const vehicleId of vehicleIds) {
      const vTrips = trips.get(vehicleId) ?? [];
      tripCount += vTrips.length;
      const axles: AxleInput[] | undefined = specOf.has(vehicleId) ? specs.get(specOf.get(vehicleId)!) : undefined;
      if (!axles?.length) {
        ctx.errors.push({ item: `vehicle ${vehicleId}`, message: 'its suspension spec has no axles; trips left unprocessed' });
        continue;
      }
      works.push({ vehicleId, axles, dampers: dampers.get(vehicleId) ?? [], trips: vTrips });
    }
    return { works, tripCount };
  };

  const { runner, fallback, queueWorkers } = await dutyRunnerFor(routes as Map<number, RouteInput>, ctx.queueUrl, ctx.dutyWorkers ?? 0);
  if (queueWorkers !== undefined) ctx.counts.queueWorkers = queueWorkers;
  if (fallback) ctx.warn?.(fallback);
  let done = 0;
  let committed = 0;
  // Read and compute batch i. Batch i+1 is read and queued for computing as soon as batch i is
  // taken, so the threads computing do not wait for the database, nor for a slow write.
  const prepared = new Map<number, Promise<{ index: number; works: VehicleWork[]; tripCount: number; results: Awaited<ReturnType<typeof runner.compute>> }>>();
  const prepare = (i: number) => {
    if (i >= batches.length || prepared.has(i)) return;
    const p = load(batches[i]).then(async ({ works, tripCount }) => ({ index: i, works, tripCount, results: await runner.compute(works) }));
    p.catch(() => {}); // awaited in turn; not an unhandled rejection if the run stops first
    prepared.set(i, p);
  };
  const read = async (prev: { index: number } | null) => {
    const index = prev ? prev.index + 1 : 0;
    if (index >= batches.length) return null;
    prepare(index);
    prepare(index + 1);
    const item = await prepared.get(index)!;
    prepared.delete(index);
    return item;
  };
  try {
    await readAheadWriteBehind(ctx.signal, read, async ({ works, tripCount, results }) => {
      const duties = [];
      let dutyRecords = 0;
      const wear = [];
      const processed: number[] = [];
      let segments = 0;
      let tripErrors = 0;
      for (let i = 0; i < works.length; i++) {
        const r = results[i];
        for (const e of r.errors) ctx.errors.push({ item: `trip ${e.tripId}`, message: e.message });
        const failed = new Set(r.errors.map((e) => e.tripId));
        for (const t of works[i].trips) if (!failed.has(t.id)) processed.push(t.id);
        duties.push({ json: r.dutyRows, count: r.dutyCount });
        dutyRecords += r.dutyCount;
        for (const w of r.wear) wear.push(w);
        segments += r.segments;
        tripErrors += r.errors.length;
      }
      add(ctx.counts, 'severityBinsWritten', await repo.storeBatch({ duties, wear, processedTripIds: processed, now: ctx.now, runId: 0 }));
      // counted once committed
      committed++;
      add(ctx.counts, 'batches', 1);
      add(ctx.counts, 'trips', processed.length);
      add(ctx.counts, 'dutyRecords', dutyRecords);
      add(ctx.counts, 'segments', segments);
      add(ctx.counts, 'tripErrors', tripErrors);
      done += tripCount;
      await ctx.progress('duty', done, totalTrips);
      if (ctx.failAfterBatches !== undefined && committed >= ctx.failAfterBatches) {
        throw new Error(`injected failure after ${committed} batch(es)`);
      }
    });
  } finally {
    const st = runner.stats();
    add(ctx.counts, 'closedFormSolves', st.solves);
    add(ctx.counts, 'profileSimulations', st.simulations);
    await runner.close();
  }
}

const WEAR_CHUNK = 2000;

/**
 * Runs chunks in order with one read ahead and one write behind: chunk k+1 is read while chunk k
 * is computed and written. `read` gets the previous chunk (null for the first) and returns null
 * when there are no more. The chunks of a phase touch disjoint dampers, so the overlap changes
 * nothing in the result; a write in flight is always awaited before the phase ends or throws.
 */
async function readAheadWriteBehind<T>(signal: AbortSignal | undefined, read: (prev: T | null) => Promise<T | null>, write: (item: T) => Promise<void>) {
  const ahead = (prev: T | null) => {
    const p = read(prev);
    p.catch(() => {}); // awaited in turn; not an unhandled rejection if the phase stops first
    return p;
  };
  let writing: Promise<void> | null = null;
  const settle = async () => {
    const w = writing;
    writing = null;
    if (w) await w;
  };
  try {
    let next = ahead(null);
    for (;;) {
      checkAbort(signal);
      const item = await next;
      if (item === null) break;
      next = ahead(item);
      await settle();
      checkAbort(signal);
      writing = write(item);
      writing.catch(() => {}); // awaited by the next settle; a failed write is thrown from there
    }
    await settle();
  } finally {
    if (writing) await (writing as Promise<void>).catch(() => {});
  }
}

/**
 * Phase 2: recompute daily history and totals of every damper whose duty changed (or whose
 * spec's road sensitivity changed since its wear days were summed), and store each one's
 * untracked distance (the distance before the records, revised as they grow).
 */
export async function recomputeWear(ctx: PhaseContext) {
  const repo = wearRepository(ctx.sequelize);
  const resolve = ctx.lifeResolver ?? priorLifeResolver();
  await repo.markOpeningsDue();
  // the road sensitivity b of each spec: wear days summed with another b are recomputed
  const specs = await repo.specAxles();
  const bOf = new Map<number, number>();
  for (const [specId, axles] of specs) {
    if (!axles.length) continue;
    const b = resolve({ damperId: 0, specId, axleIndex: axles[0].axleIndex, ratedDamperLifeKm: axles[0].ratedDamperLifeKm }).b;
    bOf.set(specId, b);
    await repo.markExponentChanged(specId, b);
  }
  const ids = await repo.dirtyDampers();
  await ctx.progress('wear', 0, ids.length);
  const read = async (prev: { end: number } | null) => {
    const from = prev ? prev.end : 0;
    if (from >= ids.length) return null;
    const chunk = ids.slice(from, from + (ctx.damperChunk ?? WEAR_CHUNK));
    const [context, before, untracked] = await Promise.all([repo.damperContext(chunk), repo.wearBeforeDirty(chunk), repo.untrackedKm(chunk, ctx.before)]);
    return { end: from + chunk.length, context, before, untracked };
  };
  await readAheadWriteBehind(ctx.signal, read, async ({ end, context, before, untracked }) => {
    const kept = new Map(before.map((b) => [b.damper_id, b]));
    const starts: WearStart[] = [];
    for (const c of context) {
      const s = kept.get(c.id);
      starts.push({
        damperId: c.id,
        vehicleId: c.vehicleId,
        cumKm: s?.cum_km ?? 0,
        cumEnergyJ: s?.cum_energy_j ?? 0,
        cumWearKm: s?.cum_wear_km ?? 0,
        springDamage: s?.cum_spring_damage ?? 0,
        b: bOf.get(c.specId) ?? 0,
      });
    }
    const { wearDays, dutyRowsRead } = await repo.storeWear(starts, ctx.now, untracked.map((u) => ({ damperId: u.id, km: u.untracked_km })));
    add(ctx.counts, 'wearDutyRowsRead', dutyRowsRead);
    add(ctx.counts, 'dampersUpdated', starts.length);
    add(ctx.counts, 'wearDays', wearDays);
    await ctx.progress('wear', end, ids.length);
  });
}

/**
 * Phase 3: predict every fitted damper (or those of `ctx.vehicleIds`) as of the run's day. Each
 * chunk's predictions are worked out and packed on worker threads ({@link predictionThreads},
 * when the duty has threads) when the whole fleet is predicted, else in this thread; the same
 * rows either way (prediction-rows.ts).
 */
export async function predictAll(ctx: PhaseContext) {
  const repo = wearRepository(ctx.sequelize);
  const resolve = ctx.lifeResolver ?? priorLifeResolver();
  let done = 0;
  await repo.dropStalePredictions();
  const { runner, fallback } = await createPredictionRunner(ctx.vehicleIds ? 0 : predictionThreads(ctx.dutyWorkers ?? 0));
  if (fallback) ctx.warn?.(fallback);
  const read = async (prev: { lastId: number } | null) => {
    const ids = await repo.installedDamperIds(prev ? prev.lastId : 0, ctx.damperChunk ?? WEAR_CHUNK, ctx.vehicleIds);
    if (!ids.length) return null;
    const [context, recorded] = await Promise.all([repo.damperContext(ids), repo.recordedTotals(ids, ctx.asOf)]);
    const inputs: { c: (typeof context)[number]; opts: Omit<PredictOptions, 'life'>; life: number; windowStart: string; levels: number[] }[] = [];
    const lives: LifeBasis[] = [];
    const lifeIndex = new Map<LifeBasis, number>();
    const errors: ItemError[] = [];
    for (const c of context) {
      try {
        const life = resolve({ damperId: c.id, specId: c.specId, axleIndex: c.axleIndex, ratedDamperLifeKm: c.ratedDamperLifeKm });
        let k = lifeIndex.get(life);
        if (k === undefined) {
          k = lives.push(life) - 1;
          lifeIndex.set(life, k);
        }
        const base: Omit<PredictOptions, 'life'> = {
          asOf: ctx.asOf,
          installedAt: c.installedAt,
          thresholdFraction: ctx.thresholdFraction,
          nominalDampingNsPerM: c.corner.dampingNsPerM,
          untrackedKm: c.untrackedKm ?? 0,
          calendarYears: ctx.calendarYears,
          scheduleQuantile: ctx.scheduleQuantile,
        };
        const opts: PredictOptions = { ...base, life };
        const r = recorded.get(c.id);
        const opening = estimateOpening({ untrackedKm: opts.untrackedKm, recordedKm: r?.cumKm ?? 0, recordedWearKm: r?.cumWearKm ?? 0 });
        inputs.push({ c, opts: base, life: k, windowStart: predictionWindow(opts).windowStart, levels: levelsOf(opts, opening.wearKm + (life.offsetWearKm ?? 0)) });
      } catch (err) {
        errors.push({ item: `damper ${c.id}`, message: (err as Error).message });
      }
    }
    const summaries = await repo.wearSummaries(
      inputs.map((x) => ({ damperId: x.c.id, windowStart: x.windowStart, levels: x.levels })),
      ctx.thresholdFraction,
      ctx.asOf,
    );
    // not awaited here: the next chunk is read while this one is packed (with several threads,
    // several chunks are packed at once); the write awaits it
    const packing = runner.pack({
      lives,
      jobs: inputs.map(({ c, opts, life }) => ({ damperId: c.id, vehicleId: c.vehicleId, opts, life, summary: summaries.get(c.id) ?? null })),
    });
    packing.catch(() => {}); // awaited by the write; not an unhandled rejection if the phase stops first
    return { lastId: ids[ids.length - 1], packing, errors };
  };
  try {
    await readAheadWriteBehind(ctx.signal, read, async ({ packing, errors }) => {
      const packed = await packing;
      ctx.errors.push(...errors, ...packed.errors);
      await repo.storePredictions(packed);
      done += packed.count;
      add(ctx.counts, 'predictions', packed.count);
      await ctx.progress('predictions', done, done);
    });
  } finally {
    await runner.close();
  }
}

/**
 * Per-trip duty older than the retention window is folded into the summaries and deleted
 * (duty-summary.ts), oldest day first, in transactions of at most four rows per trip of a batch
 * (`batchTrips`, default 2000). Idempotent: with nothing older than the window it changes nothing.
 */
export async function foldOldDuty(ctx: Pick<PhaseContext, 'sequelize' | 'asOf' | 'tripDutyRetentionDays' | 'signal' | 'counts' | 'failAfterFoldDays'> & { batchTrips?: number }) {
  if (!ctx.tripDutyRetentionDays) return;
  const repo = dutySummaryRepository(ctx.sequelize);
  const keepFrom = retentionStart(ctx.asOf, ctx.tripDutyRetentionDays);
  const maxRows = 4 * (ctx.batchTrips ?? 2000);
  let days = 0;
  for (let day = await repo.oldestDutyDay(); day !== null && day < keepFrom; day = await repo.oldestDutyDay()) {
    for (;;) {
      checkAbort(ctx.signal);
      const { folded, summaryRows } = await repo.foldChunk(day, maxRows);
      add(ctx.counts, 'dutyRowsFolded', folded);
      add(ctx.counts, 'dutySummaryRowsWritten', summaryRows);
      if (folded < maxRows) break;
    }
    add(ctx.counts, 'dutyDaysFolded', 1);
    days++;
    if (ctx.failAfterFoldDays !== undefined && days >= ctx.failAfterFoldDays) throw new Error(`injected failure after folding ${days} day(s)`);
  }
}
