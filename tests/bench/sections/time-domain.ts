/** Time-domain engine: exact-discrete 4-state recurrence over 50 km of road. */
import { prepareSimulation, runSimulation } from '../../../server/physics/simulate';
import type { BenchSection } from '../registry';
import { BENCH_CORNER, BENCH_DX_M, BENCH_SPEED_MPS, benchProfile, bestTime } from '../workload';

export const timeDomainSection: BenchSection = {
  key: 'time-domain',
  name: 'time-domain engine (exact ZOH, Float64Array)',
  run() {
    const z = benchProfile();
    const p = prepareSimulation(BENCH_CORNER, BENCH_DX_M, BENCH_SPEED_MPS);
    let sink = 0;
    for (let i = 0; i < 3; i++) sink += runSimulation(p, z).rmsBodyAccel; // warm-up (JIT)
    const t = bestTime(() => {
      sink += runSimulation(p, z).rmsBodyAccel;
    }, 15);
    const steps = z.length - 1;
    const sps = steps / t;
    const pw = prepareSimulation(BENCH_CORNER, BENCH_DX_M, BENCH_SPEED_MPS, { weighted: true });
    const zShort = z.subarray(0, 200_001);
    runSimulation(pw, zShort);
    const tw = bestTime(() => {
      sink += runSimulation(pw, zShort).rmsWeightedAccel;
    }, 3);
    if (!Number.isFinite(sink)) throw new Error('bench: non-finite result');
    return {
      rows: [
        { label: 'steps per second (4 states, statistics)', value: sps, unit: 'steps/s', note: `${steps} steps, best of 15` },
        { label: 'steps per second (12 states with Wk filter)', value: (zShort.length - 1) / tw, unit: 'steps/s', note: 'corner unrolled, Wk filter rows in a loop' },
      ],
      metrics: { timeDomainStepsPerSec: sps, timeDomainWeightedStepsPerSec: (zShort.length - 1) / tw },
    };
  },
};
