/**
 * Cycle counting and fatigue: rainflow counting (ASTM E1049), Palmgren–Miner damage with a
 * Basquin S–N curve, and the Dirlik and narrow-band spectral estimates from a one-sided PSD.
 *
 * @module
 */
import { PhysicsInputError, PhysicsNumericError, requireInRange } from './types';
import { gamma } from './gamma';

/** One counted rainflow cycle. */
export interface RainflowCycle {
  /** Range (peak-to-valley) [unit of the series]. */
  range: number;
  /** Mean of the two extremes [unit of the series]. */
  mean: number;
  /** 1 for a full cycle, 0.5 for a half cycle. */
  count: 0.5 | 1;
}

/**
 * Reduce a series to its reversals (peaks and valleys), keeping the first and last points.
 *
 * @param series samples [any unit], finite
 * @returns reversal values
 * @example
 * reversals([0, 1, 2, 1, 1, 3]); // → [0, 2, 1, 3]
 */
export function reversals(series: ArrayLike<number>): number[] {
  const out: number[] = [];
  for (let i = 0; i < series.length; i++) {
    const v = series[i];
    if (!Number.isFinite(v)) throw new PhysicsNumericError(`series[${i}] (value ${v})`);
    const n = out.length;
    if (n === 0) {
      out.push(v);
      continue;
    }
    const last = out[n - 1];
    if (v === last) continue;
    if (n >= 2 && (last - out[n - 2]) * (v - last) > 0) out[n - 1] = v; // still rising/falling
    else out.push(v);
  }
  return out;
}

/**
 * Rainflow counting with half cycles.
 *
 * Method: ASTM E1049-85 (reapproved 2017) §5.4.4, three-point rainflow on the reversals: with
 * X the most recent range and Y the previous one, when X ≥ Y count Y — as a half cycle if it
 * contains the starting point (and drop that point), otherwise as a full cycle (and drop both
 * its points); at the end count every remaining range as a half cycle. O(n).
 *
 * @param series samples [any unit], finite
 * @returns cycles in the order counted, each with range, mean and count 0.5 or 1
 * @example
 * rainflow([-2, 1, -3, 5, -1, 3, -4, 4, -2]); // → ranges 3 (½), 4 (½), 4 (1), 8 (½), 9 (½), 8 (½), 6 (½): the ASTM E1049 §5.4.4 worked example
 */
export function rainflow(series: ArrayLike<number>): RainflowCycle[] {
  const pts = reversals(series);
  const stack: number[] = [];
  const cycles: RainflowCycle[] = [];
  for (const p of pts) {
    stack.push(p);
    while (stack.length >= 3) {
      const n = stack.length;
      const x = Math.abs(stack[n - 1] - stack[n - 2]);
      const y = Math.abs(stack[n - 2] - stack[n - 3]);
      if (x < y) break;
      const a = stack[n - 3];
      const b = stack[n - 2];
      if (n === 3) {
        cycles.push({ range: y, mean: (a + b) / 2, count: 0.5 });
        stack.shift();
      } else {
        cycles.push({ range: y, mean: (a + b) / 2, count: 1 });
        stack.splice(n - 3, 2);
      }
    }
  }
  for (let i = 0; i + 1 < stack.length; i++) {
    cycles.push({ range: Math.abs(stack[i + 1] - stack[i]), mean: (stack[i] + stack[i + 1]) / 2, count: 0.5 });
  }
  return cycles;
}

/** Basquin S–N curve `N·Sᵏ = C` (S = range). */
export interface SnCurve {
  /** Basquin exponent k [1], > 0. */
  k: number;
  /** Basquin constant C [unitᵏ], > 0. */
  C: number;
}

function checkSn(sn: SnCurve): void {
  requireInRange('k', sn?.k, '1', 0, 50, true);
  requireInRange('C', sn?.C, 'unit^k', 0, Number.MAX_VALUE, true);
}

/**
 * Palmgren–Miner linear damage of counted cycles with a Basquin S–N curve `N·Sᵏ = C`:
 * `D = Σ nᵢ·Sᵢᵏ / C` (S is the cycle range).
 *
 * Source: Miner 1945; Basquin 1910 (docs/methods.md "Duty, cycles and fatigue").
 *
 * @param cycles counted cycles (range [unit], count [1])
 * @param sn Basquin exponent k [1] and constant C [unitᵏ]
 * @returns damage [1] (1 = failure)
 * @example
 * minerDamage([{ range: 100, mean: 0, count: 1 }], { k: 3, C: 1e12 }); // → 1e-6
 */
export function minerDamage(cycles: ArrayLike<{ range: number; count: number }>, sn: SnCurve): number {
  checkSn(sn);
  let d = 0;
  for (let i = 0; i < cycles.length; i++) {
    const c = cycles[i];
    d += c.count * c.range ** sn.k;
  }
  if (!Number.isFinite(d)) throw new PhysicsNumericError('damage sum in minerDamage');
  return d / sn.C;
}

/** Spectral moments of a one-sided PSD. */
export interface SpectralMoments {
  /** ∫G df [unit²]. */
  m0: number;
  /** ∫f·G df [unit²·Hz]. */
  m1: number;
  /** ∫f²·G df [unit²·Hz²]. */
  m2: number;
  /** ∫f⁴·G df [unit²·Hz⁴]. */
  m4: number;
}

/**
 * Spectral moments `m_i = ∫ fⁱ·G(f) df` (i = 0, 1, 2, 4) of a one-sided PSD by the trapezoidal
 * rule on the given grid.
 *
 * @param freqsHz increasing frequencies [Hz], ≥ 0
 * @param psd one-sided PSD values at those frequencies [unit²/Hz], ≥ 0
 * @returns m0, m1, m2, m4
 * @example
 * spectralMoments([9, 11], [1, 1]); // → { m0: 2, m1: 20, m2: 202, m4: 21202 } (trapezoid rule)
 */
export function spectralMoments(freqsHz: ArrayLike<number>, psd: ArrayLike<number>): SpectralMoments {
  if (freqsHz.length !== psd.length || freqsHz.length < 2) {
    throw new PhysicsInputError('psd', 'unit²/Hz', `needs the same length as freqsHz and at least 2 points (got ${psd.length} and ${freqsHz.length})`);
  }
  let m0 = 0, m1 = 0, m2 = 0, m4 = 0;
  for (let i = 0; i < freqsHz.length; i++) {
    requireInRange(`freqsHz[${i}]`, freqsHz[i], 'Hz', 0, 1e9, false);
    requireInRange(`psd[${i}]`, psd[i], 'unit²/Hz', 0, Number.MAX_VALUE, false);
    if (i === 0) continue;
    const df = freqsHz[i] - freqsHz[i - 1];
    if (!(df > 0)) throw new PhysicsInputError(`freqsHz[${i}]`, 'Hz', 'must be strictly increasing');
    const f0 = freqsHz[i - 1], f1 = freqsHz[i], g0 = psd[i - 1], g1 = psd[i];
    m0 += 0.5 * df * (g0 + g1);
    m1 += 0.5 * df * (f0 * g0 + f1 * g1);
    m2 += 0.5 * df * (f0 * f0 * g0 + f1 * f1 * g1);
    m4 += 0.5 * df * (f0 ** 4 * g0 + f1 ** 4 * g1);
  }
  return { m0, m1, m2, m4 };
}

/** Dirlik (1985) parameters of a spectrum. */
export interface DirlikParams {
  /** Irregularity factor γ = m2/√(m0·m4) [1]. */
  gamma: number;
  /** xm = (m1/m0)·√(m2/m4) [1]. */
  xm: number;
  D1: number;
  D2: number;
  D3: number;
  Q: number;
  R: number;
  /** Expected rate of peaks √(m4/m2) [1/s]. */
  peakRateHz: number;
}

/**
 * Dirlik's parameters from spectral moments (docs/methods.md "Duty, cycles and fatigue"):
 * `γ = m2/√(m0·m4)`, `xm = (m1/m0)·√(m2/m4)`, `D1 = 2(xm − γ²)/(1 + γ²)`,
 * `R = (γ − xm − D1²)/(1 − γ − D1 + D1²)`, `D2 = (1 − γ − D1 + D1²)/(1 − R)`, `D3 = 1 − D1 − D2`,
 * `Q = 1.25(γ − D3 − D2·R)/D1`.
 *
 * Source: Dirlik, "Application of computers in fatigue analysis", PhD thesis, Warwick 1985.
 *
 * @param m spectral moments of a one-sided PSD
 * @returns the parameters
 * @example
 * dirlikParams(spectralMoments(freqs, psd)).gamma; // → between 0 and 1 (1 for a pure tone)
 */
export function dirlikParams(m: SpectralMoments): DirlikParams {
  const { m0, m1, m2, m4 } = m;
  for (const [k, v] of Object.entries(m)) requireInRange(k, v, 'unit²·Hzⁱ', 0, Number.MAX_VALUE, true);
  const gammaI = m2 / Math.sqrt(m0 * m4);
  const xm = (m1 / m0) * Math.sqrt(m2 / m4);
  const D1 = (2 * (xm - gammaI * gammaI)) / (1 + gammaI * gammaI);
  const R = (gammaI - xm - D1 * D1) / (1 - gammaI - D1 + D1 * D1);
  const D2 = (1 - gammaI - D1 + D1 * D1) / (1 - R);
  const D3 = 1 - D1 - D2;
  const Q = (1.25 * (gammaI - D3 - D2 * R)) / D1;
  const p = { gamma: gammaI, xm, D1, D2, D3, Q, R, peakRateHz: Math.sqrt(m4 / m2) };
  for (const [k, v] of Object.entries(p)) if (!Number.isFinite(v)) throw new PhysicsNumericError(`Dirlik parameter ${k} (spectrum too narrow or degenerate)`);
  return p;
}

/**
 * Dirlik's rainflow range probability density at range S:
 * `p(S) = [D1/Q·e^(−Z/Q) + D2·Z/R²·e^(−Z²/2R²) + D3·Z·e^(−Z²/2)] / (2√m0)`, `Z = S/(2√m0)`.
 *
 * Source: Dirlik 1985 (docs/methods.md "Duty, cycles and fatigue").
 *
 * @param m spectral moments
 * @param rangeS range S [unit], ≥ 0
 * @returns density [1/unit]
 * @example
 * dirlikDensity(m, 0); // → D1/(Q·2√m0)
 */
export function dirlikDensity(m: SpectralMoments, rangeS: number): number {
  const p = dirlikParams(m);
  return dirlikDensityWith(p, m.m0, rangeS);
}

/**
 * Dirlik density with parameters already computed (see {@link dirlikDensity}).
 * @param p Dirlik parameters
 * @param m0 zeroth moment [unit²]
 * @param rangeS range [unit]
 * @returns density [1/unit]
 * @example
 * dirlikDensityWith(dirlikParams(m), m.m0, 0.01); // → p(0.01)
 */
export function dirlikDensityWith(p: DirlikParams, m0: number, rangeS: number): number {
  requireInRange('rangeS', rangeS, 'unit', 0, Number.MAX_VALUE, false);
  const s0 = 2 * Math.sqrt(m0);
  const z = rangeS / s0;
  const { D1, D2, D3, Q, R } = p;
  return ((D1 / Q) * Math.exp(-z / Q) + ((D2 * z) / (R * R)) * Math.exp((-z * z) / (2 * R * R)) + D3 * z * Math.exp((-z * z) / 2)) / s0;
}

/** Options of the spectral damage estimates. */
export interface SpectralDamageOptions extends SnCurve {
  /** Exposure duration [s]. */
  durationS: number;
}

/**
 * Expected Miner damage over a duration from a one-sided PSD by Dirlik's method:
 * `D = ν_p·T/C·∫Sᵏp(S)dS = ν_p·T/C·(2√m0)ᵏ·[D1·Qᵏ·Γ(1+k) + (√2)ᵏ·Γ(1+k/2)·(D2·|R|ᵏ + D3)]`,
 * with ν_p = √(m4/m2) the rate of peaks.
 *
 * Source: Dirlik 1985; closed-form moment as in e.g. Bishop & Sherratt 1989 / common practice.
 *
 * @param m spectral moments [unit², …]
 * @param opts Basquin k [1], C [unitᵏ], duration [s]
 * @returns damage [1]
 * @example
 * dirlikDamage(m, { k: 3, C: 1e12, durationS: 3600 }); // → expected damage in one hour
 */
export function dirlikDamage(m: SpectralMoments, opts: SpectralDamageOptions): number {
  checkSn(opts);
  requireInRange('durationS', opts.durationS, 's', 0, Number.MAX_VALUE, false);
  const p = dirlikParams(m);
  const k = opts.k;
  const s0 = 2 * Math.sqrt(m.m0);
  const moment = s0 ** k * (p.D1 * p.Q ** k * gamma(1 + k) + Math.SQRT2 ** k * gamma(1 + k / 2) * (p.D2 * Math.abs(p.R) ** k + p.D3));
  return (p.peakRateHz * opts.durationS * moment) / opts.C;
}

/**
 * Expected Miner damage of a narrow-band Gaussian process (Rayleigh ranges, S = 2·amplitude):
 * `D = ν0·T/C·(2√(2·m0))ᵏ·Γ(1 + k/2)`, ν0 = √(m2/m0) the rate of zero up-crossings.
 *
 * Source: Bendat 1964 narrow-band approximation (docs/methods.md "Duty, cycles and fatigue").
 *
 * @param m spectral moments
 * @param opts Basquin k [1], C [unitᵏ], duration [s]
 * @returns damage [1]
 * @example
 * narrowBandDamage({ m0: 1, m1: 10, m2: 100, m4: 10000 }, { k: 2, C: 1, durationS: 1 }); // → 10·8·1 = 80
 */
export function narrowBandDamage(m: SpectralMoments, opts: SpectralDamageOptions): number {
  checkSn(opts);
  requireInRange('durationS', opts.durationS, 's', 0, Number.MAX_VALUE, false);
  requireInRange('m0', m.m0, 'unit²', 0, Number.MAX_VALUE, true);
  requireInRange('m2', m.m2, 'unit²·Hz²', 0, Number.MAX_VALUE, true);
  const nu0 = Math.sqrt(m.m2 / m.m0);
  return (nu0 * opts.durationS * (2 * Math.sqrt(2 * m.m0)) ** opts.k * gamma(1 + opts.k / 2)) / opts.C;
}

let stack = new Float64Array(1024);

/**
 * Miner damage `Σ n·Sᵏ / C` of the rainflow cycles of `x[0..len)`, counted as ASTM E1049-85
 * §5.4.4 (three-point method with half cycles, as {@link rainflow} with {@link minerDamage}),
 * without building the cycle list: the nightly job's form, run on every profiled segment.
 *
 * @param x series [m]
 * @param len samples to use
 * @param k Basquin exponent [1]
 * @param C Basquin constant [mᵏ]
 * @returns damage [1]
 */
export function rainflowDamage(x: Float64Array, len: number, k: number, C: number): number {
  if (len === 0) return 0;
  if (stack.length < len + 2) stack = new Float64Array(len + 2);
  const st = stack;
  let n = 0;
  let d = 0;
  let prevDir = 0;
  let last = x[0];
  let pending = false;
  let i = 1;
  // Reversals on the fly (keep the first point, extend monotone runs, push turning points and
  // the last point); each pushed point runs the three-point rule.
  let v = last;
  let flush = true; // push x[0] first
  for (;;) {
    if (flush) {
      st[n++] = v;
      while (n >= 3) {
        const X = Math.abs(st[n - 1] - st[n - 2]);
        const Y = Math.abs(st[n - 2] - st[n - 3]);
        if (X < Y) break;
        if (n === 3) {
          d += 0.5 * Y ** k;
          st[0] = st[1];
          st[1] = st[2];
          n = 2;
        } else {
          d += Y ** k;
          st[n - 3] = st[n - 1];
          n -= 2;
        }
      }
      flush = false;
    }
    if (i >= len) {
      if (pending) {
        v = last;
        pending = false;
        flush = true;
        continue;
      }
      break;
    }
    const xi = x[i++];
    if (xi === last) continue;
    const dir = xi > last ? 1 : -1;
    if (pending && dir === prevDir) {
      last = xi;
    } else if (pending) {
      v = last;
      flush = true;
      last = xi;
      prevDir = dir;
    } else {
      last = xi;
      pending = true;
      prevDir = dir;
    }
  }
  for (let j = 0; j + 1 < n; j++) d += 0.5 * Math.abs(st[j + 1] - st[j]) ** k;
  return d / C;
}
