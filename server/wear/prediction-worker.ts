/**
 * Worker thread of the nightly prediction phase: answers each chunk of dampers with their
 * predictions packed for the database (prediction-rows.ts). Started by `prediction-pool.ts`
 * through `duty-worker-boot.mjs` (which loads TypeScript); pure computation, no database.
 */
import { parentPort } from 'node:worker_threads';
import { packPredictions, type PackedPredictions, type PredictionChunk } from './prediction-rows';

export type ToPredictionWorker = { id: number; chunk: PredictionChunk };
export type FromPredictionWorker = { type: 'ready' } | { type: 'done'; id: number; packed: PackedPredictions } | { type: 'failed'; id: number; message: string };

if (parentPort) {
  const port = parentPort;
  port.on('message', (msg: ToPredictionWorker) => {
    let reply: FromPredictionWorker;
    try {
      reply = { type: 'done', id: msg.id, packed: packPredictions(msg.chunk) };
    } catch (err) {
      reply = { type: 'failed', id: msg.id, message: (err as Error).message };
    }
    port.postMessage(reply);
  });
  port.postMessage({ type: 'ready' } satisfies FromPredictionWorker);
}
