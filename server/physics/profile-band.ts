/**
 * A measured profile made ready for simulation on the app's road model: limited to the road band
 * of the closed form ({@link ROAD_BAND}) and resampled finer, so the exact-ZOH simulation of a
 * profiled segment sees the same road input as the closed form of a classified one
 * (docs/methods.md "One road model for both methods").
 *
 * @module
 */
import FFT from 'fft.js';
import { ROAD_BAND } from './closed-form';
import { PhysicsInputError, requireInRange } from './types';

/** Finest spacing the resampling aims at [m]: at most this, by a power-of-two factor. */
export const SIMULATION_TARGET_DX_M = 0.08;

/** A band-limited, resampled profile part. */
export interface BandLimitedProfile {
  /** Elevations [m] at spacing `dxM`, sample 0 at the part's first sample. */
  elevationsM: Float64Array;
  /** New spacing [m] = input spacing / factor. */
  dxM: number;
  /** Resampling factor (power of two, ≥ 1): input sample i is output sample i·factor. */
  factor: number;
}

/**
 * Band-limit a profile part to the road band and resample it finer.
 *
 * Method: remove the straight line through the first and last samples (so the FFT's periodic
 * extension is continuous), FFT (size the next power of two, zero-padded), keep spatial
 * frequencies below `maxCyclesPerM`, multiply each by `1/sinc²(π·n·dx')` — the loss that linear
 * interpolation between samples at the new spacing `dx'` (the simulation's zero-order hold on
 * road velocity) puts on a displacement wave — zero-pad the spectrum to `factor` times the size,
 * inverse FFT, and add the line back. Band-limited interpolation: input samples are kept where
 * the input had no content above the band.
 *
 * @param elevationsM elevations [m], evenly spaced, at least 8 samples
 * @param dxM spacing [m], 1 mm – 0.3 m
 * @param opts band [cycles/m] (default {@link ROAD_BAND}) and target spacing [m] (default {@link SIMULATION_TARGET_DX_M})
 * @returns the resampled part
 * @example
 * bandLimitProfile(part, 0.25).dxM; // → 0.0625 (factor 4)
 */
export function bandLimitProfile(elevationsM: ArrayLike<number>, dxM: number, opts: { maxCyclesPerM?: number; targetDxM?: number } = {}): BandLimitedProfile {
  requireInRange('dxM', dxM, 'm', 0.001, 0.3, false);
  const nMax = requireInRange('maxCyclesPerM', opts.maxCyclesPerM ?? ROAD_BAND.maxCyclesPerM, 'cycles/m', 0.01, 1000, false);
  const target = requireInRange('targetDxM', opts.targetDxM ?? SIMULATION_TARGET_DX_M, 'm', 0.001, 1, false);
  const len = elevationsM.length;
  if (len < 8) throw new PhysicsInputError('elevationsM', 'm', `needs at least 8 samples, got ${len}`);
  const factor = Math.max(1, 2 ** Math.ceil(Math.log2(dxM / target) - 1e-9));
  const e0 = elevationsM[0];
  const slope = (elevationsM[len - 1] - e0) / (len - 1);
  const size = Math.max(8, 2 ** Math.ceil(Math.log2(len)));
  const fft = new FFT(size);
  const input = fft.createComplexArray() as number[];
  for (let i = 0; i < len; i++) input[2 * i] = elevationsM[i] - e0 - slope * i;
  const spec = fft.createComplexArray() as number[];
  fft.transform(spec, input);
  const big = size * factor;
  const fftBig = new FFT(big);
  const out = fftBig.createComplexArray() as number[];
  const dxFine = dxM / factor;
  const bigSpec = fftBig.createComplexArray() as number[];
  for (let k = 1; k < size / 2; k++) {
    const n = k / (size * dxM);
    if (n > nMax) break;
    const x = Math.PI * n * dxFine;
    const s = Math.sin(x) / x;
    const g = factor / (s * s);
    const re = spec[2 * k] * g;
    const im = spec[2 * k + 1] * g;
    bigSpec[2 * k] = re;
    bigSpec[2 * k + 1] = im;
    bigSpec[2 * (big - k)] = re;
    bigSpec[2 * (big - k) + 1] = -im;
  }
  bigSpec[0] = spec[0] * factor;
  fftBig.inverseTransform(out, bigSpec);
  const count = (len - 1) * factor + 1;
  const z = new Float64Array(count);
  for (let i = 0; i < count; i++) z[i] = out[2 * i] + e0 + (slope * i) / factor;
  return { elevationsM: z, dxM: dxFine, factor };
}
