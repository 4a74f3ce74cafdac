/**
 * Whole-body vibration of drivers: the ISO 2631-1 `Wk` frequency weighting (vertical, seated),
 * weighted RMS of an acceleration series, and daily exposure A(8) against the action and limit
 * values of Directive 2002/44/EC.
 *
 * Caution (docs/methods.md "Whole-body vibration"): the body acceleration of a quarter-car model is the floor above one
 * wheel, not the seat; results are a screening estimate, not a measurement.
 *
 * @module
 */
import { discretizeZoh } from './linalg';
import { PhysicsInputError, PhysicsNumericError, requireInRange } from './types';

/**
 * Daily exposure action value A(8) for whole-body vibration [m/s²].
 * Source: Directive 2002/44/EC, Article 3(2)(b).
 */
export const EXPOSURE_ACTION_VALUE = 0.5;

/**
 * Daily exposure limit value A(8) for whole-body vibration [m/s²].
 * Source: Directive 2002/44/EC, Article 3(2)(a).
 */
export const EXPOSURE_LIMIT_VALUE = 1.15;

/**
 * Parameters of the ISO 2631-1:1997 `Wk` weighting (vertical, seated): band limits f1, f2
 * (2nd-order Butterworth), acceleration–velocity transition f3, f4, Q4 and upward step
 * f5, Q5, f6, Q6 [Hz, 1]. Source: ISO 2631-1:1997 Table A.2 (values from memory, docs/methods.md "Whole-body vibration";
 * they reproduce Table 3 — see tests).
 */
export const WK_PARAMS = Object.freeze({
  f1: 0.4,
  f2: 100,
  f3: 12.5,
  f4: 12.5,
  q4: 0.63,
  f5: 2.37,
  q5: 0.91,
  f6: 3.35,
  q6: 0.91,
});

/** One second-order section `(b2·s² + b1·s + b0)/(s² + a1·s + a0)` in s [rad/s]. */
interface Biquad {
  b2: number;
  b1: number;
  b0: number;
  a1: number;
  a0: number;
}

function wkSections(): Biquad[] {
  const { f1, f2, f3, f4, q4, f5, q5, f6, q6 } = WK_PARAMS;
  const w = (f: number): number => 2 * Math.PI * f;
  const [w1, w2, w3, w4, w5, w6] = [w(f1), w(f2), w(f3), w(f4), w(f5), w(f6)];
  return [
    // high-pass band limit Hh = s²/(s² + √2·ω1·s + ω1²)
    { b2: 1, b1: 0, b0: 0, a1: Math.SQRT2 * w1, a0: w1 * w1 },
    // low-pass band limit Hl = ω2²/(s² + √2·ω2·s + ω2²)
    { b2: 0, b1: 0, b0: w2 * w2, a1: Math.SQRT2 * w2, a0: w2 * w2 },
    // acceleration–velocity transition Ht = (1 + s/ω3)/(1 + s/(Q4·ω4) + s²/ω4²)
    { b2: 0, b1: (w4 * w4) / w3, b0: w4 * w4, a1: w4 / q4, a0: w4 * w4 },
    // upward step Hs = (s² + s·ω5/Q5 + ω5²)/(s² + s·ω6/Q6 + ω6²)
    { b2: 1, b1: w5 / q5, b0: w5 * w5, a1: w6 / q6, a0: w6 * w6 },
  ];
}

/**
 * Magnitude of the ISO 2631-1 `Wk` weighting at a frequency.
 *
 * Source: ISO 2631-1:1997 Annex A, product `Hh·Hl·Ht·Hs` of band-limiting, transition and
 * upward-step filters with {@link WK_PARAMS}.
 *
 * @param fHz frequency [Hz], ≥ 0
 * @returns |Wk(j2πf)| [1]
 * @example
 * wkWeight(6.3); // → ≈ 1.054 (ISO 2631-1 Table 3: 1054 ×10⁻³)
 */
export function wkWeight(fHz: number): number {
  requireInRange('fHz', fHz, 'Hz', 0, 1e9, false);
  const w = 2 * Math.PI * fHz;
  let mag = 1;
  for (const s of wkSections()) {
    const nr = s.b0 - s.b2 * w * w;
    const ni = s.b1 * w;
    const dr = s.a0 - w * w;
    const di = s.a1 * w;
    mag *= Math.hypot(nr, ni) / Math.hypot(dr, di);
  }
  return mag;
}

/** Continuous state-space realisation `x' = A·x + B·u`, `y = C·x + D·u`. */
export interface StateSpaceFilter {
  /** Order. */
  n: number;
  /** n×n row-major [1/s]. */
  A: Float64Array;
  /** Input vector, length n. */
  B: Float64Array;
  /** Output row, length n. */
  C: Float64Array;
  /** Feed-through. */
  D: number;
}

/**
 * State-space realisation (order 8) of the `Wk` weighting: the four second-order sections in
 * controllable canonical form, connected in series. Strictly proper overall (D = 0).
 *
 * Source: ISO 2631-1:1997 Annex A (transfer functions); series connection as in any control
 * text (e.g. Franklin, Powell & Emami-Naeini, Feedback Control of Dynamic Systems).
 *
 * @returns the filter; input body acceleration [m/s²], output weighted acceleration [m/s²]
 * @example
 * wkStateSpace().n; // → 8
 */
export function wkStateSpace(): StateSpaceFilter {
  let sys: StateSpaceFilter | null = null;
  for (const s of wkSections()) {
    const sec: StateSpaceFilter = {
      n: 2,
      A: new Float64Array([0, 1, -s.a0, -s.a1]),
      B: new Float64Array([0, 1]),
      C: new Float64Array([s.b0 - s.b2 * s.a0, s.b1 - s.b2 * s.a1]),
      D: s.b2,
    };
    sys = sys === null ? sec : series(sys, sec);
  }
  return sys as StateSpaceFilter;
}

/** Series connection: output of `f` feeds `g`. */
function series(f: StateSpaceFilter, g: StateSpaceFilter): StateSpaceFilter {
  const n = f.n + g.n;
  const A = new Float64Array(n * n);
  const B = new Float64Array(n);
  const C = new Float64Array(n);
  for (let i = 0; i < f.n; i++) {
    for (let j = 0; j < f.n; j++) A[i * n + j] = f.A[i * f.n + j];
    B[i] = f.B[i];
    C[i] = g.D * f.C[i];
  }
  for (let i = 0; i < g.n; i++) {
    for (let j = 0; j < f.n; j++) A[(f.n + i) * n + j] = g.B[i] * f.C[j];
    for (let j = 0; j < g.n; j++) A[(f.n + i) * n + f.n + j] = g.A[i * g.n + j];
    B[f.n + i] = g.B[i] * f.D;
    C[f.n + i] = g.C[i];
  }
  return { n, A, B, C, D: g.D * f.D };
}

/**
 * Append the `Wk` filter to a linear system whose output row `outRow` (no feed-through) is the
 * body acceleration: returns the augmented `(A, B)` of order n + 8 and the output row of the
 * weighted acceleration.
 *
 * @param a n×n system matrix
 * @param b input vector, length n
 * @param n order of the system
 * @param outRow row giving body acceleration [m/s²] from the state
 * @returns augmented system and weighted-output row
 * @example
 * appendWk(stateSpace(c).A, stateSpace(c).B, 4, stateSpace(c).outputs.bodyAccel).n; // → 12
 */
export function appendWk(
  a: Float64Array,
  b: Float64Array,
  n: number,
  outRow: Float64Array,
): { n: number; A: Float64Array; B: Float64Array; weighted: Float64Array } {
  const wk = wkStateSpace();
  const m = n + wk.n;
  const A = new Float64Array(m * m);
  const B = new Float64Array(m);
  const weighted = new Float64Array(m);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) A[i * m + j] = a[i * n + j];
    B[i] = b[i];
    weighted[i] = wk.D * outRow[i];
  }
  for (let i = 0; i < wk.n; i++) {
    for (let j = 0; j < n; j++) A[(n + i) * m + j] = wk.B[i] * outRow[j];
    for (let j = 0; j < wk.n; j++) A[(n + i) * m + n + j] = wk.A[i * wk.n + j];
    weighted[n + i] = wk.C[i];
  }
  return { n: m, A, B, weighted };
}

/**
 * `Wk`-weighted RMS of an evenly sampled vertical acceleration series.
 *
 * Method: the {@link wkStateSpace} filter discretised exactly for a held input (zero-order
 * hold) at the sample interval, run from rest, then the RMS of its output. Treating samples as
 * held makes the gain low by about (π·f/fs)²/6 at frequency f; use fs ≥ 500 Hz for errors
 * below 0.5 % up to 25 Hz. The 0.4 Hz high-pass needs several seconds to settle; discard the
 * first `settleS` seconds (default 2 s, never more than half the record).
 *
 * @param series acceleration samples [m/s²]
 * @param sampleRateHz sample rate [Hz], 10 Hz – 100 kHz
 * @param settleS time excluded from the RMS at the start [s] (default 2)
 * @returns weighted RMS acceleration a_w [m/s²]
 * @example
 * // 1 m/s² amplitude at 6.3 Hz, 20 s at 1 kHz:
 * weightedRms(Float64Array.from({ length: 20000 }, (_, i) => Math.sin(2 * Math.PI * 6.3 * i / 1000)), 1000); // → ≈ 1.054/√2 ≈ 0.745
 */
export function weightedRms(series: ArrayLike<number>, sampleRateHz: number, settleS = 2): number {
  requireInRange('sampleRateHz', sampleRateHz, 'Hz', 10, 1e5, false);
  requireInRange('settleS', settleS, 's', 0, 1e6, false);
  const len = series.length;
  if (len < 2) throw new PhysicsInputError('series', 'm/s²', `needs at least 2 samples, got ${len}`);
  const wk = wkStateSpace();
  const n = wk.n;
  const { Ad, Bd } = discretizeZoh(wk.A, wk.B, n, 1 / sampleRateHz);
  const x = new Float64Array(n);
  const nx = new Float64Array(n);
  const skip = Math.min(Math.round(settleS * sampleRateHz), Math.floor(len / 2));
  let sum = 0;
  for (let k = 0; k < len; k++) {
    const u = series[k];
    let y = wk.D * u;
    for (let i = 0; i < n; i++) y += wk.C[i] * x[i];
    if (k >= skip) sum += y * y;
    for (let i = 0; i < n; i++) {
      let s = Bd[i] * u;
      for (let j = 0; j < n; j++) s += Ad[i * n + j] * x[j];
      nx[i] = s;
    }
    x.set(nx);
  }
  const rms = Math.sqrt(sum / (len - skip));
  if (!Number.isFinite(rms)) throw new PhysicsNumericError('value in weightedRms series');
  return rms;
}

/** One period of driving for exposure. */
export interface ExposureTrip {
  /** Frequency-weighted RMS acceleration over the trip a_w [m/s²]. */
  weightedAccel: number;
  /** Exposure duration [h]. */
  hours: number;
}

/**
 * Daily vibration exposure A(8) from several trips (vertical axis, k = 1.0):
 * `A(8) = √(Σ a_w,i²·T_i / 8 h)`.
 *
 * Source: Directive 2002/44/EC Annex B(1) with ISO 2631-1:1997 (docs/methods.md "Whole-body vibration").
 *
 * @param trips each with weighted RMS [m/s²] and duration [h]
 * @returns A(8) [m/s²]
 * @example
 * dailyA8([{ weightedAccel: 0.5, hours: 8 }]); // → 0.5
 * dailyA8([{ weightedAccel: 0.6, hours: 2 }, { weightedAccel: 0.4, hours: 4 }]); // → √((0.72 + 0.64)/8) ≈ 0.412
 */
export function dailyA8(trips: ExposureTrip[]): number {
  if (!Array.isArray(trips)) throw new PhysicsInputError('trips', '-', 'must be an array of { weightedAccel, hours }');
  let sum = 0;
  trips.forEach((t, i) => {
    requireInRange(`trips[${i}].weightedAccel`, t?.weightedAccel, 'm/s²', 0, 100, false);
    requireInRange(`trips[${i}].hours`, t?.hours, 'h', 0, 24, false);
    sum += t.weightedAccel * t.weightedAccel * t.hours;
  });
  return Math.sqrt(sum / 8);
}

/** Where a daily exposure stands against Directive 2002/44/EC. */
export type ExposureStatus = 'within-action-value' | 'exceeds-action-value' | 'exceeds-limit-value';

/**
 * Compare a daily exposure with the action value (0.5 m/s²) and limit value (1.15 m/s²) of
 * Directive 2002/44/EC Art. 3(2). A value equal to a threshold does not exceed it.
 *
 * @param a8 daily exposure A(8) [m/s²]
 * @returns status
 * @example
 * exposureStatus(0.7); // → 'exceeds-action-value'
 */
export function exposureStatus(a8: number): ExposureStatus {
  requireInRange('a8', a8, 'm/s²', 0, 1000, false);
  if (a8 > EXPOSURE_LIMIT_VALUE) return 'exceeds-limit-value';
  if (a8 > EXPOSURE_ACTION_VALUE) return 'exceeds-action-value';
  return 'within-action-value';
}
