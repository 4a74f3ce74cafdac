/** The shared benchmark workload: one corner, one speed, one synthesised road. */
import { synthesizeProfile } from '../../server/physics/iso8608';
import type { CornerParams } from '../../server/physics/types';

/** Passenger-car corner (demo values in docs/methods.md "Typical parameters" ranges). */
export const BENCH_CORNER: CornerParams = {
  sprungMassKg: 400,
  unsprungMassKg: 45,
  springRateNPerM: 22000,
  dampingNsPerM: 1800,
  tireRateNPerM: 200000,
};
/** 80 km/h [m/s]. */
export const BENCH_SPEED_MPS = 80 / 3.6;
/** Profile spacing [m] (2.25 ms time step at 80 km/h). */
export const BENCH_DX_M = 0.05;
/** ISO 8608 class C mean [m³]. */
export const BENCH_GD = 256e-6;

let cached: Float64Array | null = null;
/** 50 km of class C road at 50 mm spacing (1 000 001 samples), seed 42. */
export function benchProfile(): Float64Array {
  cached ??= synthesizeProfile({ gdN0: BENCH_GD, lengthM: 50_000, dxM: BENCH_DX_M, seed: 42 });
  return cached;
}

/** Best-of-n wall time of fn [s]. */
export function bestTime(fn: () => void, repeats: number): number {
  let best = Infinity;
  for (let i = 0; i < repeats; i++) {
    const t0 = process.hrtime.bigint();
    fn();
    const t = Number(process.hrtime.bigint() - t0) / 1e9;
    if (t < best) best = t;
  }
  return best;
}
