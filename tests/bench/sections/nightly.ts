/**
 * Nightly job on a synthetic fleet, the whole run — duty, wear history, predictions, scheduling,
 * e-mail through the built-in catcher and every database write — in a child process, so its
 * peak memory is its own: 10 000 vehicles with 30 000 trips (section `nightly`), and
 * 100 000 vehicles with 300 000 trips (section `nightly100k`; `BENCH_SKIP_100K=1` leaves it out,
 * and a run longer than `BENCH_100K_TIMEOUT_S`, default 600 s, is stopped and reported as such).
 * Targets on a 2-core machine: 10 000 vehicles under 30 s and 1 GB; 100 000 vehicles under 30 s
 * and 600 MB.
 */
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { BenchResult, BenchSection } from '../registry';
import { BENCH_FLEET, generateFleet, type FleetSize } from '../nightly/generate-fleet';

const here = import.meta.dirname;

interface RunOnce {
  workers: number;
  seconds: number;
  repredictS: number;
  maxRssMb: number;
  cpuS: number;
  status: string;
  counts: Record<string, number>;
  phases: Record<string, { s: number; cpuS: number; maxRssMb: number }>;
}

/** Generates a fleet of `size`, runs one night on it in a child process and reads its figures. */
async function nightlyRun(size: FleetSize, target: { seconds: number; rssMb: number }, prefix: string, timeoutS?: number): Promise<BenchResult> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'reboundry-bench-nightly-'));
  try {
    const t0 = performance.now();
    await generateFleet(dir, size);
    const genS = (performance.now() - t0) / 1000;
    let out: string;
    try {
      out = execFileSync(process.execPath, ['--import', 'tsx', path.join(here, '../nightly/run-once.ts'), dir], { encoding: 'utf8', maxBuffer: 1 << 20, timeout: timeoutS ? timeoutS * 1000 : undefined, killSignal: 'SIGKILL' });
    } catch (err) {
      if (timeoutS && (err as { signal?: string }).signal === 'SIGKILL') {
        return { rows: [{ label: 'whole run, wall time', value: null, unit: 's', note: `stopped after ${timeoutS} s (BENCH_100K_TIMEOUT_S)` }], metrics: { [`${prefix}RunS`]: null } };
      }
      throw err;
    }
    const r = JSON.parse(out.trim().split('\n').pop()!) as RunOnce;
    const phases = Object.entries(r.phases).filter(([k]) => k !== 'start');
    const phaseNote = phases.map(([k, v]) => `${k} ${v.s.toFixed(1)} s`).join(', ');
    const cpuNote = phases.map(([k, v]) => `${k} ${v.cpuS.toFixed(1)} s`).join(', ');
    return {
      rows: [
        { label: 'whole run, wall time', value: r.seconds, unit: 's', note: `target < ${target.seconds} s; status ${r.status}; duty on ${r.workers} worker thread(s); ${phaseNote}` },
        { label: 'CPU time of the run process', value: r.cpuS, unit: 's', note: cpuNote },
        { label: 'peak memory (max RSS of the run process)', value: r.maxRssMb, unit: 'MB', note: `target < ${target.rssMb} MB; at each phase's end: ${phases.map(([k, v]) => `${k} ${v.maxRssMb}`).join(', ')}` },
        { label: 'trips per second', value: (r.counts.trips ?? 0) / r.seconds, unit: 'trips/s', note: `${r.counts.dutyRecords} duty records, ${r.counts.profileSimulations} profile simulations` },
        { label: 'one vehicle re-predicted after a workshop save', value: r.repredictS, unit: 's', note: 'after the run; mostly building the fleet life resolver (every spec, damper and lane result)' },
        { label: 'synthetic fleet generation (not part of the run)', value: genS, unit: 's' },
      ],
      metrics: {
        [`${prefix}RunS`]: r.seconds,
        [`${prefix}RepredictVehicleS`]: r.repredictS,
        [`${prefix}CpuS`]: r.cpuS,
        [`${prefix}PeakRssMb`]: r.maxRssMb,
        [`${prefix}TripsPerS`]: (r.counts.trips ?? 0) / r.seconds,
        [`${prefix}Status`]: r.status,
        ...Object.fromEntries(phases.map(([k, v]) => [`${prefix}Phase_${k.replaceAll(' ', '_')}_S`, v.s])),
      },
    };
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

export const nightlySection: BenchSection = {
  key: 'nightly',
  name: 'Nightly job: 10 000 vehicles, 30 000 trips × 25 segments (whole run, DB writes and mail included)',
  async run() {
    const r = await nightlyRun(BENCH_FLEET, { seconds: 30, rssMb: 1000 }, 'nightly');
    // the metric names the 10 000-vehicle section has always had
    r.metrics.repredictVehicleS = r.metrics.nightlyRepredictVehicleS;
    return r;
  },
};

export const nightly100kSection: BenchSection = {
  key: 'nightly100k',
  name: 'Nightly job: 100 000 vehicles, 300 000 trips × 25 segments (whole run; BENCH_SKIP_100K=1 skips it)',
  async run() {
    if (process.env.BENCH_SKIP_100K === '1') return { rows: [{ label: 'whole run, wall time', value: null, unit: 's', note: 'skipped (BENCH_SKIP_100K=1)' }], metrics: {} };
    return nightlyRun({ ...BENCH_FLEET, vehicles: 100_000, trips: 300_000 }, { seconds: 30, rssMb: 600 }, 'nightly100k', Number(process.env.BENCH_100K_TIMEOUT_S ?? 600));
  },
};
