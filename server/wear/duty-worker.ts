/**
 * Worker thread of the nightly duty: holds the run's routes and its own {@link DutyCache},
 * and answers each batch of vehicles with their duty. Started by `duty-pool.ts` through
 * `duty-worker-boot.mjs` (which loads TypeScript); pure computation, no database.
 */
import { parentPort } from 'node:worker_threads';
import { computeVehicleDuty, DutyCache, packDuty, type PackedDutyResult, type RouteInput, type VehicleWork } from './duty';

export type ToWorker = { type: 'init'; routes: RouteInput[] } | { type: 'batch'; id: number; works: VehicleWork[] };
export type FromWorker =
  | { type: 'ready' }
  | { type: 'done'; id: number; results: PackedDutyResult[]; solves: number; simulations: number }
  | { type: 'failed'; id: number; message: string };

if (parentPort) {
  const port = parentPort;
  let routes = new Map<number, RouteInput>();
  const cache = new DutyCache();
  port.on('message', (msg: ToWorker) => {
    if (msg.type === 'init') {
      routes = new Map(msg.routes.map((r) => [r.id, r]));
      return;
    }
    let reply: FromWorker;
    try {
      const results = msg.works.map((w) => packDuty(computeVehicleDuty(w, routes, cache)));
      reply = { type: 'done', id: msg.id, results, solves: cache.solves, simulations: cache.simulations };
    } catch (err) {
      reply = { type: 'failed', id: msg.id, message: (err as Error).message };
    }
    port.postMessage(reply);
  });
  port.postMessage({ type: 'ready' } satisfies FromWorker);
}
