/**
 * Runs the nightly job once on a prepared data folder, in its own process, and prints one JSON
 * line: wall time [s] of the whole run (database writes and mail included), peak resident
 * memory [MB] of the process, the run's counts, and per phase its wall time, the CPU time of
 * the process (all threads), the time the job's own thread was busy (`mainS`) and the peak
 * resident memory so far at the phase's end (`maxRssMb`). A folder made by an older version is
 * migrated first.
 *
 *     npx tsx tests/bench/nightly/run-once.ts <dataDir>
 */
import { performance } from 'node:perf_hooks';
import { loadConfig } from '../../../server/config';
import { createLogger } from '../../../server/logger';
import { dbFile, migrate, openDb } from '../../../server/db';
import { createMailer } from '../../../server/mail/mailer';
import { run } from '../../../jobs/nightly';
import { repredictVehicle } from '../../../server/wear/repredict';
import { BENCH_NOW } from './generate-fleet';

const dir = process.argv[2];
if (!dir) {
  console.error('usage: npx tsx tests/bench/nightly/run-once.ts <dataDir>');
  process.exit(2);
}
// NIGHTLY_WORKERS from the environment, to compare thread settings
const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: dir, FAKE_SMTP_PORT: '0', LOG_LEVEL: 'error', SEED_DEMO: 'false', NIGHTLY_WORKERS: process.env.NIGHTLY_WORKERS ?? 'auto' });
const log = createLogger('error');
const db = await openDb(dbFile(dir));
await migrate(db);
const { mailer } = await createMailer(config, log);
const t0 = performance.now();
// wall and CPU time per phase (phases as reported by the job's progress)
const phases: Record<string, { s: number; cpuS: number; mainS: number; maxRssMb: number }> = {};
let phase = 'start';
let tPhase = t0;
let cpuPhase = process.cpuUsage();
let elu = performance.eventLoopUtilization();
const mark = (next: string) => {
  const cpu = process.cpuUsage(cpuPhase);
  const e = performance.eventLoopUtilization(elu);
  phases[phase] = { s: (performance.now() - tPhase) / 1000, cpuS: (cpu.user + cpu.system) / 1e6, mainS: e.active / 1000, maxRssMb: Math.round(process.resourceUsage().maxRSS / 1024) };
  elu = performance.eventLoopUtilization();
  phase = next;
  tPhase = performance.now();
  cpuPhase = process.cpuUsage();
};
const r = await run({ db, config, log, mailer, now: BENCH_NOW, trigger: 'test', onProgress: (p) => p !== phase && mark(p) });
mark('end');
const seconds = (performance.now() - t0) / 1000;
const maxRssMb = process.resourceUsage().maxRSS / 1024;
// a workshop save re-predicts one vehicle (server/wear/repredict.ts): life resolver built over the whole fleet, then 4 dampers
const tRe = performance.now();
await repredictVehicle(db.sequelize, 1, { now: BENCH_NOW, timeZone: config.timeZone, thresholdFraction: config.inspection.threshold, workshop: config.workshop });
const repredictS = (performance.now() - tRe) / 1000;
await mailer.close();
await db.close();
console.log(JSON.stringify({ workers: config.nightlyWorkers, seconds, repredictS, maxRssMb, cpuS: (process.cpuUsage().user + process.cpuUsage().system) / 1e6, phases, status: r.status, counts: r.counts, errors: r.errors.length }));
