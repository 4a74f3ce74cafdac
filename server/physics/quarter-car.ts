/**
 * The two-mass (quarter-car) model of one vehicle corner: state-space matrices, modes and
 * frequency response to road input.
 *
 * Model (docs/methods.md "The corner model"): `ms·zs'' = −ks(zs − zu) − cs(zs' − zu')`,
 * `mu·zu'' = ks(zs − zu) + cs(zs' − zu') − kt(zu − zr)`; state `x = [zs − zu, zs', zu − zr, zu']`,
 * input road velocity `u = zr'`.
 *
 * @module
 */
import { eigenvalues } from './linalg';
import { validateCorner, requireInRange, STANDARD_GRAVITY, type CornerParams } from './types';

/** Output rows `y = C·x` of the quarter-car state (all with zero feed-through). */
export interface QuarterCarOutputs {
  /** Body (sprung-mass) acceleration zs'' [m/s² per state unit]. */
  bodyAccel: Float64Array;
  /** Suspension travel zs − zu [m]. */
  suspensionTravel: Float64Array;
  /** Damper relative velocity zs' − zu' [m/s]. */
  relativeVelocity: Float64Array;
  /** Dynamic tyre load −kt(zu − zr), positive = more load on the road [N]. */
  tireLoad: Float64Array;
}

/** State-space form `x' = A·x + B·u` of a corner, with its output rows. */
export interface QuarterCarStateSpace {
  /** Order (4). */
  n: 4;
  /** System matrix, 4×4 row-major [1/s, 1/s²]. */
  A: Float64Array;
  /** Input vector for road velocity [1]. */
  B: Float64Array;
  /** Output rows. */
  outputs: QuarterCarOutputs;
  /** Static wheel load (ms + mu)·g [N]. */
  staticLoadN: number;
}

/**
 * State-space matrices of a corner with road velocity as input.
 *
 * Source: docs/methods.md "The corner model" (standard two-mass model, e.g. Cebon 1999, Handbook of Vehicle–Road
 * Interaction).
 *
 * @param c corner parameters [kg, N/m, N·s/m]
 * @returns A (4×4), B (4), output rows and static load
 * @example
 * stateSpace(corner).A[4]; // → −ks/ms = −22000/400 = −55 [1/s²]
 */
export function stateSpace(c: CornerParams): QuarterCarStateSpace {
  validateCorner(c);
  const { sprungMassKg: ms, unsprungMassKg: mu, springRateNPerM: ks, dampingNsPerM: cs, tireRateNPerM: kt } = c;
  const A = new Float64Array([
    0, 1, 0, -1,
    -ks / ms, -cs / ms, 0, cs / ms,
    0, 0, 0, 1,
    ks / mu, cs / mu, -kt / mu, -cs / mu,
  ]);
  const B = new Float64Array([0, 0, -1, 0]);
  return {
    n: 4,
    A,
    B,
    outputs: {
      bodyAccel: A.slice(4, 8),
      suspensionTravel: new Float64Array([1, 0, 0, 0]),
      relativeVelocity: new Float64Array([0, 1, 0, -1]),
      tireLoad: new Float64Array([0, 0, -kt, 0]),
    },
    staticLoadN: (ms + mu) * STANDARD_GRAVITY,
  };
}

/** Natural frequencies and damping ratios of the two modes of a corner. */
export interface CornerModes {
  /** Body-bounce undamped natural frequency [Hz]. */
  bodyHz: number;
  /** Body-bounce damping ratio [1]. */
  bodyDampingRatio: number;
  /** Wheel-hop undamped natural frequency [Hz]. */
  wheelHz: number;
  /** Wheel-hop damping ratio [1]. */
  wheelDampingRatio: number;
}

/**
 * The two modes of a corner (body bounce, wheel hop) from the eigenvalues of A.
 *
 * Each mode is a pair of eigenvalues λ; natural frequency |λ|/2π, damping ratio −Re λ/|λ|.
 * The mode of lower natural frequency is body bounce. An over-damped mode (two real
 * eigenvalues) is reported as ωn = √(λ₁λ₂), ζ = −(λ₁+λ₂)/(2ωn).
 *
 * @param c corner parameters [kg, N/m, N·s/m]
 * @returns frequencies [Hz] and damping ratios [1]
 * @example
 * modes({ sprungMassKg: 400, unsprungMassKg: 45, springRateNPerM: 22000, dampingNsPerM: 1800,
 *   tireRateNPerM: 200000 }); // → bodyHz ≈ 1.14, bodyDampingRatio ≈ 0.26, wheelHz ≈ 11.0, wheelDampingRatio ≈ 0.29
 */
export function modes(c: CornerParams): CornerModes {
  const { A } = stateSpace(c);
  const { re, im } = eigenvalues(A, 4);
  const order = [0, 1, 2, 3].sort((i, j) => Math.hypot(re[i], im[i]) - Math.hypot(re[j], im[j]));
  const complex = (i: number): boolean => Math.abs(im[i]) > 1e-9 * Math.hypot(re[i], im[i]);
  // A mode is a conjugate pair or two real eigenvalues. With a very stiff damper one mode is
  // over-damped and its two real eigenvalues lie on either side of the other mode's pair in
  // magnitude, so the pairs are formed first (conjugates are adjacent in magnitude order, and so
  // are the remaining reals) and then ordered by natural frequency.
  const cx = order.filter(complex);
  const rl = order.filter((i) => !complex(i));
  const pair = (i: number, j: number): [number, number] => {
    if (complex(i)) {
      const wn = Math.hypot(re[i], im[i]);
      return [wn / (2 * Math.PI), -re[i] / wn];
    }
    const wn = Math.sqrt(re[i] * re[j]);
    return [wn / (2 * Math.PI), -(re[i] + re[j]) / (2 * wn)];
  };
  const pairs = [...cx, ...rl];
  const [[bodyHz, bodyDampingRatio], [wheelHz, wheelDampingRatio]] = [pair(pairs[0], pairs[1]), pair(pairs[2], pairs[3])].sort((p, q) => p[0] - q[0]);
  return { bodyHz, bodyDampingRatio, wheelHz, wheelDampingRatio };
}

/** Complex transfer values of a corner at one frequency, per unit road displacement. */
export interface CornerTransfer {
  /** Body acceleration [(m/s²)/m], real and imaginary parts. */
  bodyAccel: [number, number];
  /** Suspension travel [m/m]. */
  suspensionTravel: [number, number];
  /** Relative velocity [(m/s)/m]. */
  relativeVelocity: [number, number];
  /** Dynamic tyre load [N/m]. */
  tireLoad: [number, number];
}

/**
 * Complex transfer functions of a corner from road displacement, at one frequency.
 *
 * Closed-form rational functions of s = j·2πf (derived from the equations of docs/methods.md "The corner model"):
 * `Δ = ms·mu·s⁴ + cs(ms+mu)s³ + (ms(ks+kt) + mu·ks)s² + cs·kt·s + ks·kt`,
 * `Zs/Zr = kt(cs·s + ks)/Δ`, `(Zs−Zu)/Zr = −kt·ms·s²/Δ`, `Zu/Zr = kt(ms·s² + cs·s + ks)/Δ`.
 * Independent of {@link stateSpace}, so tests can compare the two.
 *
 * @param c corner parameters (not validated here: call {@link validateCorner} first)
 * @param fHz frequency [Hz]
 * @returns complex gains per metre of road elevation
 * @example
 * cornerTransfer(corner, 0).suspensionTravel; // → [0, 0] (a static road offset moves the whole car)
 */
export function cornerTransfer(c: CornerParams, fHz: number): CornerTransfer {
  const { sprungMassKg: ms, unsprungMassKg: mu, springRateNPerM: ks, dampingNsPerM: cs, tireRateNPerM: kt } = c;
  const w = 2 * Math.PI * fHz;
  const w2 = w * w;
  // s = jw: s² = −w², s³ = −j w³, s⁴ = w⁴
  const dRe = ms * mu * w2 * w2 - (ms * (ks + kt) + mu * ks) * w2 + ks * kt;
  const dIm = -cs * (ms + mu) * w2 * w + cs * kt * w;
  const den = dRe * dRe + dIm * dIm;
  const div = (nr: number, ni: number): [number, number] => [(nr * dRe + ni * dIm) / den, (ni * dRe - nr * dIm) / den];
  const zs = div(kt * ks, kt * cs * w);
  const travel = div(kt * ms * w2, 0); // −kt·ms·s² = kt·ms·w²
  const zu = div(kt * (ks - ms * w2), kt * cs * w);
  return {
    bodyAccel: [-w2 * zs[0], -w2 * zs[1]],
    suspensionTravel: travel,
    relativeVelocity: [-w * travel[1], w * travel[0]],
    tireLoad: [-kt * (zu[0] - 1), -kt * zu[1]],
  };
}

/** Magnitudes of a corner's responses over a list of frequencies. */
export interface FrequencyResponse {
  /** The frequencies [Hz]. */
  freqsHz: number[];
  /** |body acceleration / road displacement| [(m/s²)/m]. */
  bodyAccel: number[];
  /** |suspension travel / road displacement| [m/m]. */
  suspensionTravel: number[];
  /** |relative velocity / road displacement| [(m/s)/m]. */
  relativeVelocity: number[];
  /** |dynamic tyre load / road displacement| [N/m]. */
  tireLoad: number[];
}

/**
 * Frequency response magnitudes of body acceleration, suspension travel, damper relative
 * velocity and dynamic tyre load per unit road displacement.
 *
 * Method: {@link cornerTransfer} (closed-form transfer functions of the two-mass model).
 *
 * @param c corner parameters [kg, N/m, N·s/m]
 * @param freqsHz frequencies [Hz], each finite and ≥ 0
 * @returns magnitudes per metre of road amplitude
 * @example
 * frequencyResponse(corner, [0]).tireLoad[0]; // → 0 (no dynamic load from a static offset)
 */
export function frequencyResponse(c: CornerParams, freqsHz: number[]): FrequencyResponse {
  validateCorner(c);
  const out: FrequencyResponse = { freqsHz: [...freqsHz], bodyAccel: [], suspensionTravel: [], relativeVelocity: [], tireLoad: [] };
  for (const f of freqsHz) {
    requireInRange('freqsHz[]', f, 'Hz', 0, 1e5, false);
    const t = cornerTransfer(c, f);
    out.bodyAccel.push(Math.hypot(...t.bodyAccel));
    out.suspensionTravel.push(Math.hypot(...t.suspensionTravel));
    out.relativeVelocity.push(Math.hypot(...t.relativeVelocity));
    out.tireLoad.push(Math.hypot(...t.tireLoad));
  }
  return out;
}
