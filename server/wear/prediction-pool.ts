/**
 * Runs the prediction phase's per-damper work (prediction-rows.ts `packPredictions`, pure) in
 * the job's own thread or on one worker thread, so the job's thread is free to read the next
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

const READY_TIMEOUT_MS = 30_000;

/**
 * A runner on a worker thread when `workers` > 0, else in the calling thread. If the thread
 * cannot be started, packs in the calling thread and says why in `fallback`.
 */
export async function createPredictionRunner(workers: number): Promise<{ runner: PredictionRunner; fallback: string | null }> {
  if (workers <= 0) return { runner: inProcessPredictionRunner(), fallback: null };
  const worker = new Worker(new URL('./duty-worker-boot.mjs', import.meta.url), { workerData: { entry: new URL('./prediction-worker.ts', import.meta.url).href } });
  const pending = new Map<number, { resolve: (p: PackedPredictions) => void; reject: (e: Error) => void }>();
  let dead: Error | null = null;
  let nextId = 1;
  const ready = new Promise<void>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error('the prediction worker did not start in time')), READY_TIMEOUT_MS);
    worker.on('message', (msg: FromPredictionWorker) => {
      if (msg.type === 'ready') {
        clearTimeout(timer);
        resolve();
        return;
      }
      const p = pending.get(msg.id);
      if (!p) return;
      pending.delete(msg.id);
      if (msg.type === 'failed') p.reject(new Error(msg.message));
      else p.resolve(msg.packed);
    });
    const fail = (err: Error) => {
      clearTimeout(timer);
      dead ??= err;
      reject(err);
      for (const p of pending.values()) p.reject(err);
      pending.clear();
    };
    worker.on('error', fail);
    worker.on('exit', (code) => fail(new Error(`the prediction worker stopped (exit code ${code})`)));
  });
  const close = async () => {
    worker.removeAllListeners('exit');
    await worker.terminate();
  };
  try {
    await ready;
  } catch (err) {
    await close();
    return { runner: inProcessPredictionRunner(), fallback: `the prediction worker thread could not start, predicting in the job's thread: ${(err as Error).message}` };
  }
  return {
    fallback: null,
    runner: {
      workers: 1,
      pack(chunk) {
        if (dead) return Promise.reject(dead);
        const id = nextId++;
        return new Promise((resolve, reject) => {
          pending.set(id, { resolve, reject });
          worker.postMessage({ id, chunk } satisfies ToPredictionWorker);
        });
      },
      close,
    },
  };
}
