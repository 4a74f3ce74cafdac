/**
 * Baseline: the same ODE solved by a general-purpose adaptive solver from npm (`odex`, Hairer &
 * Wanner's ODEX extrapolation method), road velocity piecewise constant per sample (one
 * integration per sample interval, exactly the input the exact-discrete engine assumes).
 */
import { createRequire } from 'node:module';
import { stateSpace } from '../../../server/physics/quarter-car';
import { prepareSimulation, runSimulation } from '../../../server/physics/simulate';
import type { BenchSection } from '../registry';
import { BENCH_CORNER, BENCH_DX_M, BENCH_SPEED_MPS, benchProfile } from '../workload';

interface OdexSolver {
  absoluteTolerance: number;
  relativeTolerance: number;
  solve(f: (x: number, y: number[]) => number[], x0: number, y0: number[], x1: number): { y: number[]; outcome: number; nEval: number };
}
// loaded through require: the package ships TypeScript sources that do not pass our strict checks
const { Solver } = createRequire(import.meta.url)('odex') as { Solver: new (n: number) => OdexSolver };

/** Samples integrated by the baseline (it is slow; 100 m of road). */
const BASELINE_SAMPLES = 2001;
/** Solver tolerances (absolute and relative). */
const TOL = 1e-10;

export const baselineOdexSection: BenchSection = {
  key: 'baseline-odex',
  name: 'baseline: adaptive ODE solver (odex)',
  run(ctx) {
    const z = benchProfile().subarray(0, BASELINE_SAMPLES);
    const { A, B } = stateSpace(BENCH_CORNER);
    const dt = BENCH_DX_M / BENCH_SPEED_MPS;
    const solver = new Solver(4);
    const setTol = (tol: number): void => {
      solver.absoluteTolerance = tol;
      solver.relativeTolerance = tol;
    };
    setTol(TOL);
    const reference = runSimulation(prepareSimulation(BENCH_CORNER, BENCH_DX_M, BENCH_SPEED_MPS), z, { series: true }).series!;
    const travel = new Float64Array(z.length);
    let evals = 0;
    const run = (): void => {
      let y = [0, 0, 0, 0];
      evals = 0;
      for (let k = 0; k + 1 < z.length; k++) {
        const u = (z[k + 1] - z[k]) / dt;
        const f = (_t: number, x: number[]): number[] => [
          A[0] * x[0] + A[1] * x[1] + A[2] * x[2] + A[3] * x[3] + B[0] * u,
          A[4] * x[0] + A[5] * x[1] + A[6] * x[2] + A[7] * x[3] + B[1] * u,
          A[8] * x[0] + A[9] * x[1] + A[10] * x[2] + A[11] * x[3] + B[2] * u,
          A[12] * x[0] + A[13] * x[1] + A[14] * x[2] + A[15] * x[3] + B[3] * u,
        ];
        const r = solver.solve(f, k * dt, y, (k + 1) * dt);
        evals += r.nEval;
        y = r.y;
        travel[k + 1] = y[0];
      }
    };
    run(); // warm-up
    const t0 = process.hrtime.bigint();
    run();
    const t = Number(process.hrtime.bigint() - t0) / 1e9;
    const evalsPerStep = evals / (z.length - 1);
    let maxErr = 0;
    let sumSq = 0;
    for (let i = 0; i < z.length; i++) {
      maxErr = Math.max(maxErr, Math.abs(travel[i] - reference.suspensionTravel[i]));
      sumSq += reference.suspensionTravel[i] ** 2;
    }
    const rms = Math.sqrt(sumSq / z.length);
    const sps = (z.length - 1) / t;
    // for context: a loose tolerance, faster but far less accurate than the exact engine
    setTol(1e-6);
    const t1 = process.hrtime.bigint();
    run();
    const tLoose = Number(process.hrtime.bigint() - t1) / 1e9;
    let maxErrLoose = 0;
    for (let i = 0; i < z.length; i++) maxErrLoose = Math.max(maxErrLoose, Math.abs(travel[i] - reference.suspensionTravel[i]));
    const engine = ctx.metrics.timeDomainStepsPerSec;
    const speedup = typeof engine === 'number' ? engine / sps : null;
    return {
      rows: [
        { label: 'steps per second', value: sps, unit: 'steps/s', note: `${z.length - 1} steps, tolerance ${TOL}, ${evalsPerStep.toFixed(1)} f-evals/step` },
        { label: 'max |travel − exact| / RMS travel', value: maxErr / rms, unit: '1', note: 'agreement with the exact-discrete engine' },
        { label: 'engine speed-up over baseline', value: speedup, unit: '×', note: 'target ≥ 50×' },
        { label: 'steps per second at tolerance 1e-6', value: (z.length - 1) / tLoose, unit: 'steps/s', note: `context only: max error / RMS ${(maxErrLoose / rms).toExponential(1)}` },
      ],
      metrics: { baselineStepsPerSec: sps, baselineRelError: maxErr / rms, baselineTolerance: TOL, speedupVsBaseline: speedup, baselineLooseStepsPerSec: (z.length - 1) / tLoose, baselineLooseRelError: maxErrLoose / rms },
    };
  },
};
