/**
 * Runs the prediction phase's per-damper work (prediction-rows.ts `packPredictions`, pure) in
 * the job's own thread or on worker threads, so the job's thread is free to read the next
 * chunk and write the last one meanwhile. The result is the same either way.
 */
import { Worker } from 'node:worker_threads';
import { packPredictions, type PackedPredictions, type PredictionChunk } from './prediction-rows';
import type { FromPredictionWorker, ToPredictionWorker } from './prediction-worker';

export interface PredictionRunner {
  pack(chunk: PredictionChunk): Promise<PackedPredictions>;
  /** Threads packing (0 = the job's own). */
  readonly workers: number;
  close(): Promise<void>;
}

/** Packs in the calling thread. */
export const inProcessPredictionRunner = (): PredictionRunner => ({ workers: 0, pack: async (chunk) => packPredictions(chunk), async close() {} });

/**
 * Threads packing predictions when the duty has `dutyWorkers`: one fewer, at least one. The
 * phase's slow path is the job's own thread and SQLite's (reading each chunk, writing the last),
 * so they keep a core: on 2 cores, a second packing thread made the 100 000-vehicle bench's
 * phase no faster and its peak memory 34 MB higher.
 */
export const predictionThreads = (dutyWorkers: number) => (dutyWorkers > 0 ? Math.max(1, dutyWorkers - 1) : 0);

const READY_TIMEOUT_MS = 30_000;

/** One started prediction thread and the chunks it has in hand. */
interface PredictionThread {
  worker: Worker;
  pending: Map<number, { resolve: (p: PackedPredictions) => void; reject: (e: Error) => void }>;
  dead: Error | null;
}

/** Starts one prediction thread; resolves when it says it is ready. */
async function startThread(): Promise<PredictionThread> {
  const worker = new Worker(new URL('./duty-worker-boot.mjs', import.meta.url), { workerData: { entry: new URL('./prediction-worker.ts', import.meta.url).href } });
  const t: PredictionThread = { worker, pending: new Map(), dead: null };
  const ready = new Promise<void>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error('the prediction worker did not start in time')), READY_TIMEOUT_MS);
    worker.on('message', (msg: FromPredictionWorker) => {
      if (msg.type === 'ready') {
        clearTimeout(timer);
        resolve();
        return;
      }
      const p = t.pending.get(msg.id);
      if (!p) return;
      t.pending.delete(msg.id);
      if (msg.type === 'failed') p.reject(new Error(msg.message));
      else p.resolve(msg.packed);
    });
    const fail = (err: Error) => {
      clearTimeout(timer);
      t.dead ??= err;
      reject(err);
      for (const p of t.pending.values()) p.reject(err);
      t.pending.clear();
    };
    worker.on('error', fail);
    worker.on('exit', (code) => fail(new Error(`the prediction worker stopped (exit code ${code})`)));
  });
  try {
    await ready;
  } catch (err) {
    await stopThread(t);
    throw err;
  }
  return t;
}

async function stopThread(t: PredictionThread) {
  t.worker.removeAllListeners('exit');
  await t.worker.terminate();
}

/**
 * A runner on `workers` threads when `workers` > 0, else in the calling thread. Each chunk goes
 * to the thread with the fewest chunks in hand, so two chunks in flight keep two threads busy.
 * If no thread can be started, packs in the calling thread and says why in `fallback`.
 */
export async function createPredictionRunner(workers: number): Promise<{ runner: PredictionRunner; fallback: string | null }> {
  if (workers <= 0) return { runner: inProcessPredictionRunner(), fallback: null };
  const started = await Promise.allSettled(Array.from({ length: workers }, () => startThread()));
  const threads = started.flatMap((r) => (r.status === 'fulfilled' ? [r.value] : []));
  const failure = started.find((r): r is PromiseRejectedResult => r.status === 'rejected');
  const close = async () => {
    await Promise.all(threads.map(stopThread));
  };
  if (!threads.length) {
    return { runner: inProcessPredictionRunner(), fallback: `the prediction worker thread could not start, predicting in the job's thread: ${(failure!.reason as Error).message}` };
  }
  let nextId = 1;
  return {
    fallback: failure ? `${workers - threads.length} of ${workers} prediction threads could not start, predicting on ${threads.length}: ${(failure.reason as Error).message}` : null,
    runner: {
      workers: threads.length,
      pack(chunk) {
        const t = threads.reduce((a, b) => (b.pending.size < a.pending.size ? b : a));
        if (t.dead) return Promise.reject(t.dead);
        const id = nextId++;
        return new Promise((resolve, reject) => {
          t.pending.set(id, { resolve, reject });
          t.worker.postMessage({ id, chunk } satisfies ToPredictionWorker);
        });
      },
      close,
    },
  };
}
