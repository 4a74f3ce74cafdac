/**
 * ISO 8608 road roughness: classes A–H by displacement PSD `Gd(n0)`, classification of a
 * measured `Gd(n0)`, and seeded synthesis of random road profiles.
 *
 * PSD model: `Gd(n) = Gd(n0)·(n/n0)^−w`, `n0 = 0.1 cycles/m`, `w = 2` (ISO 8608; docs/methods.md "Road roughness").
 *
 * @module
 */
import FFT from 'fft.js';
import { PhysicsInputError, requireInRange } from './types';

/** ISO 8608 reference spatial frequency n0 [cycles/m]. Source: ISO 8608. */
export const ISO8608_N0 = 0.1;

/** ISO 8608 road classes. */
export type IsoClass = 'A' | 'B' | 'C' | 'D' | 'E' | 'F' | 'G' | 'H';

/** Bounds and geometric mean of one class [m³]. */
export interface IsoClassBounds {
  /** Class letter. */
  cls: IsoClass;
  /** Lower bound of Gd(n0) [m³] (0 for class A). */
  lower: number;
  /** Geometric mean Gd(n0) [m³]. */
  mean: number;
  /** Upper bound of Gd(n0) [m³] (Infinity for class H). */
  upper: number;
}

/**
 * ISO 8608 class table of `Gd(n0)` [m³]: lower / geometric mean / upper, 10⁻⁶ m³ values
 * 16·4^k (A mean 16, B 64, …, H 262 144). Source: ISO 8608 (docs/methods.md "Road roughness" table).
 */
export const ISO8608_CLASSES: readonly IsoClassBounds[] = Object.freeze(
  (['A', 'B', 'C', 'D', 'E', 'F', 'G', 'H'] as IsoClass[]).map((cls, k) => {
    const mean = 16e-6 * 4 ** k;
    return Object.freeze({ cls, lower: k === 0 ? 0 : mean / 2, mean, upper: k === 7 ? Infinity : mean * 2 });
  }),
);

/**
 * Geometric-mean `Gd(n0)` of an ISO 8608 class.
 *
 * Source: ISO 8608 class table (docs/methods.md "Road roughness"). Note: some public code uses the upper bound
 * as the class value; we use the geometric mean.
 *
 * @param cls class letter A–H (case-insensitive)
 * @returns Gd(n0) [m³]
 * @example
 * gdForClass('C'); // → 256e-6
 */
export function gdForClass(cls: IsoClass | string): number {
  const key = typeof cls === 'string' ? cls.trim().toUpperCase() : '';
  const row = ISO8608_CLASSES.find((r) => r.cls === key);
  if (!row) throw new PhysicsInputError('cls', 'ISO 8608 class', `must be one of A–H, got ${JSON.stringify(cls)}`);
  return row.mean;
}

/**
 * Bounds of an ISO 8608 class.
 * @param cls class letter A–H
 * @returns lower, mean, upper [m³]
 * @example
 * classBounds('B'); // → { cls: 'B', lower: 32e-6, mean: 64e-6, upper: 128e-6 }
 */
export function classBounds(cls: IsoClass | string): IsoClassBounds {
  gdForClass(cls);
  return ISO8608_CLASSES.find((r) => r.cls === cls.trim().toUpperCase()) as IsoClassBounds;
}

/**
 * ISO 8608 class of a measured `Gd(n0)`: the class whose [lower, upper) interval contains it
 * (a value exactly on a bound belongs to the rougher class).
 *
 * Source: ISO 8608 class bounds (docs/methods.md "Road roughness").
 *
 * @param gdN0 displacement PSD at n0 = 0.1 cycles/m [m³], > 0
 * @returns class letter
 * @example
 * classifyGd(100e-6); // → 'B'
 */
export function classifyGd(gdN0: number): IsoClass {
  requireInRange('gdN0', gdN0, 'm³', 0, 1, true);
  for (const r of ISO8608_CLASSES) {
    if (gdN0 < r.upper) return r.cls;
  }
  return 'H';
}

/**
 * Seeded pseudo-random generator (mulberry32, public domain, T. Ettinger): uniform in [0, 1).
 *
 * @param seed 32-bit integer seed
 * @returns a function returning the next number
 * @example
 * seededRandom(1)(); // → 0.6270739405881613
 */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Options of {@link synthesizeProfile}. */
export interface SynthesisOptions {
  /** Displacement PSD at n0 [m³]. */
  gdN0: number;
  /** Profile length [m]. */
  lengthM: number;
  /** Sample spacing [m]. */
  dxM: number;
  /** PRNG seed (integer). */
  seed: number;
  /** Waviness exponent w (default 2). */
  waviness?: number;
  /** Lowest spatial frequency included [cycles/m] (default: all from 1/L). */
  nMinCyclesPerM?: number;
  /** Highest spatial frequency included [cycles/m] (default: up to the Nyquist 1/(2dx)). */
  nMaxCyclesPerM?: number;
}

/**
 * Synthesise an evenly spaced random road profile with the ISO 8608 PSD.
 *
 * Method: sum of harmonics at `n_k = k/(M·dx)` with deterministic amplitudes
 * `√(2·Gd(n_k)·Δn)` and independent uniform random phases (Rice's random-phase method, as
 * described in ISO 8608 Annex and common practice), evaluated by one inverse FFT of size
 * M = next power of two ≥ the number of samples (fft.js). The profile is periodic over
 * M·dx and returned truncated to `round(lengthM/dxM) + 1` samples, starting at 0.
 *
 * @param opts Gd(n0) [m³], length [m], spacing [m], seed, optional waviness and band [cycles/m]
 * @returns elevations [m], first sample at distance 0
 * @example
 * synthesizeProfile({ gdN0: 64e-6, lengthM: 1000, dxM: 0.25, seed: 1 }).length; // → 4001
 */
export function synthesizeProfile(opts: SynthesisOptions): Float64Array {
  const gd = requireInRange('gdN0', opts.gdN0, 'm³', 0, 1, false);
  const lengthM = requireInRange('lengthM', opts.lengthM, 'm', 0, 1e7, true);
  const dxM = requireInRange('dxM', opts.dxM, 'm', 0.001, 10, false);
  const seed = requireInRange('seed', opts.seed, '1', -(2 ** 53), 2 ** 53, false);
  const w = requireInRange('waviness', opts.waviness ?? 2, '1', 0.5, 4, false);
  const count = Math.round(lengthM / dxM) + 1;
  if (count < 2) throw new PhysicsInputError('lengthM', 'm', `must cover at least one sample interval (dxM ${dxM} m)`);
  if (count > 2 ** 26) throw new PhysicsInputError('lengthM', 'm', `gives ${count} samples, more than 2^26`);
  const size = Math.max(4, 2 ** Math.ceil(Math.log2(count)));
  const dn = 1 / (size * dxM);
  const nMin = opts.nMinCyclesPerM ?? 0;
  const nMax = opts.nMaxCyclesPerM ?? Infinity;
  const rand = seededRandom(seed);
  const fft = new FFT(size);
  const spec = fft.createComplexArray() as number[];
  for (let k = 1; k < size / 2; k++) {
    const phase = 2 * Math.PI * rand(); // drawn for every k so the band does not change the phases
    const n = k * dn;
    if (n < nMin || n > nMax) continue;
    const amp = Math.sqrt(2 * gd * (n / ISO8608_N0) ** -w * dn);
    // inverse FFT divides by size: X_k = (size/2)·amp·e^{iφ} gives amp·cos(2πkn/size + φ)
    const re = 0.5 * size * amp * Math.cos(phase);
    const im = 0.5 * size * amp * Math.sin(phase);
    spec[2 * k] = re;
    spec[2 * k + 1] = im;
    spec[2 * (size - k)] = re;
    spec[2 * (size - k) + 1] = -im;
  }
  const out = fft.createComplexArray() as number[];
  fft.inverseTransform(out, spec);
  const z = new Float64Array(count);
  for (let i = 0; i < count; i++) z[i] = out[2 * i];
  return z;
}
