/**
 * A worker of the nightly duty queue (server/wear/duty-queue.ts):
 *
 *     QUEUE_URL=redis://host:6379 npm run worker
 *
 * Start any number, on any machines that reach the Redis at QUEUE_URL, each on the same version
 * of the app; one process computes one job at a time (start one per core). The nightly job hands
 * them the duty of each batch whenever at least one is listening; they need no database. Ctrl-C
 * or SIGTERM finishes the job in hand and stops; a worker killed outright loses nothing (its job
 * goes back to the queue after DUTY_WORKER_LOCK_SECONDS). Exit code 2 on bad configuration.
 */
import 'dotenv/config';
import { ConfigError, loadConfig } from '../server/config';
import { createLogger } from '../server/logger';
import { safeUrl, startDutyWorker } from '../server/wear/duty-queue';

function config() {
  try {
    // a worker signs no session: production does not ask it for SESSION_SECRET
    const c = loadConfig(process.env, { signsSessions: false });
    if (!c.queueUrl) throw new ConfigError(['QUEUE_URL: the worker needs the Redis of the duty queue, e.g. QUEUE_URL=redis://localhost:6379']);
    return c as typeof c & { queueUrl: string };
  } catch (err) {
    if (err instanceof ConfigError) {
      console.error(err.message);
      process.exit(2);
    }
    throw err;
  }
}

const c = config();
const log = createLogger(c.logLevel);
// ioredis retries on its own: say once per outage that the Redis cannot be reached, not per attempt
let unreachable = false;
const w = startDutyWorker(c.queueUrl, {
  lockMs: c.dutyWorkerLockMs,
  onConnectionError(err) {
    if (unreachable) return;
    unreachable = true;
    log.error(`duty worker ${process.pid}: cannot reach the queue's Redis at ${safeUrl(c.queueUrl)} (${err.message}); retrying`);
  },
});
let jobs = 0;
w.worker.on('ready', () => {
  unreachable = false;
  log.info(`duty worker ${process.pid}: listening on ${safeUrl(c.queueUrl)}`);
});
w.worker.on('active', (job) => log.debug(`duty worker ${process.pid}: job ${job.id} started`));
w.worker.on('completed', (job) => {
  jobs++;
  log.debug(`duty worker ${process.pid}: job ${job.id} done`);
  if (jobs % 50 === 0) log.info(`duty worker ${process.pid}: ${jobs} jobs done`);
});
w.worker.on('failed', (job, err) => log.error(`duty worker ${process.pid}: job ${job?.id ?? '?'} failed`, err));
w.worker.on('error', (err) => {
  // the connection's own failures are reported above, once per outage
  if (!unreachable) log.error(`duty worker ${process.pid}: queue connection`, err);
});
const stop = () => {
  log.info(`duty worker ${process.pid}: stopping after ${jobs} jobs`);
  void w.close().then(() => process.exit(0));
};
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
