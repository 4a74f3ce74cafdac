/** Closed-form duty: one Lyapunov solve per (corner, speed), then cheap evaluations per segment. */
import { prepareDuty, dutyOnRoad } from '../../../server/physics/closed-form';
import type { BenchSection } from '../registry';
import { BENCH_CORNER, BENCH_SPEED_MPS, bestTime } from '../workload';

export const closedFormSection: BenchSection = {
  key: 'closed-form',
  name: 'closed-form duty (cached Lyapunov solve)',
  run() {
    const solves = 200;
    const tSolve = bestTime(() => {
      for (let i = 0; i < solves; i++) prepareDuty(BENCH_CORNER, BENCH_SPEED_MPS + i * 0.01);
    }, 3);
    const prepared = prepareDuty(BENCH_CORNER, BENCH_SPEED_MPS);
    const gds = new Float64Array(4096);
    for (let i = 0; i < gds.length; i++) gds[i] = 16e-6 * 2 ** ((i % 64) / 8); // classes A–H
    const n = 5_000_000;
    let sink = 0;
    const evalAll = (): void => {
      for (let i = 0; i < n; i++) {
        const d = dutyOnRoad(prepared, gds[i & 4095]);
        sink += d.damperEnergyJPerKm + d.rmsWeightedAccel;
      }
    };
    evalAll();
    const t = bestTime(evalAll, 5);
    if (!Number.isFinite(sink)) throw new Error('bench: non-finite result');
    return {
      rows: [
        { label: 'segment evaluations per second', value: n / t, unit: 'evals/s', note: 'target ≥ 1 000 000' },
        { label: 'Lyapunov solves per second (12 states)', value: solves / tSolve, unit: 'solves/s', note: 'one per (corner, speed)' },
      ],
      metrics: { closedFormEvalsPerSec: n / t, closedFormSolvesPerSec: solves / tSolve },
    };
  },
};
