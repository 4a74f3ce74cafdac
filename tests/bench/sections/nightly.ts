/**
 * Nightly job on a synthetic fleet (10 000 vehicles, 30 000 trips, 25 segments each): the whole
 * run — duty, wear history, predictions, scheduling, e-mail through the built-in catcher and
 * every database write — in a child process, so its peak memory is its own. Targets:
 * under 30 s and under 1 GB on a 2-core machine.
 */
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { BenchSection } from '../registry';
import { generateFleet } from '../nightly/generate-fleet';

const here = import.meta.dirname;

export const nightlySection: BenchSection = {
  key: 'nightly',
  name: 'Nightly job: 10 000 vehicles, 30 000 trips × 25 segments (whole run, DB writes and mail included)',
  async run() {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'reboundry-bench-nightly-'));
    try {
      const t0 = performance.now();
      await generateFleet(dir);
      const genS = (performance.now() - t0) / 1000;
      const out = execFileSync(process.execPath, ['--import', 'tsx', path.join(here, '../nightly/run-once.ts'), dir], { encoding: 'utf8', maxBuffer: 1 << 20 });
      const r = JSON.parse(out.trim().split('\n').pop()!) as { workers: number; seconds: number; repredictS: number; maxRssMb: number; cpuS: number; status: string; counts: Record<string, number>; phases: Record<string, { s: number; cpuS: number }> };
      const phaseNote = Object.entries(r.phases)
        .filter(([k]) => k !== 'start')
        .map(([k, v]) => `${k} ${v.s.toFixed(1)} s`)
        .join(', ');
      return {
        rows: [
          { label: 'whole run, wall time', value: r.seconds, unit: 's', note: `target < 30 s; status ${r.status}; duty on ${r.workers} worker thread(s)` },
          { label: 'CPU time of the run process', value: r.cpuS, unit: 's', note: phaseNote },
          { label: 'peak memory (max RSS of the run process)', value: r.maxRssMb, unit: 'MB', note: 'target < 1 GB' },
          { label: 'trips per second', value: (r.counts.trips ?? 0) / r.seconds, unit: 'trips/s', note: `${r.counts.dutyRecords} duty records, ${r.counts.profileSimulations} profile simulations` },
          { label: 'one vehicle re-predicted after a workshop save', value: r.repredictS, unit: 's', note: 'after the run; mostly building the fleet life resolver (every spec, damper and lane result)' },
          { label: 'synthetic fleet generation (not part of the run)', value: genS, unit: 's' },
        ],
        metrics: { nightlyRunS: r.seconds, repredictVehicleS: r.repredictS, nightlyCpuS: r.cpuS, nightlyPeakRssMb: r.maxRssMb, nightlyTripsPerS: (r.counts.trips ?? 0) / r.seconds, nightlyStatus: r.status },
      };
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  },
};
