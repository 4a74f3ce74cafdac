/**
 * International Roughness Index (IRI) by the golden-car method, and its conversion to and from
 * the ISO 8608 `Gd(n0)` of a `w = 2` road.
 *
 * Method: ASTM E1926 / World Bank Technical Paper 46 (Sayers, Gillespie & Queiroz 1986;
 * Sayers 1995): a reference quarter car normalised by sprung mass (`k1 = kt/ms = 653 s⁻²`,
 * `k2 = ks/ms = 63.3 s⁻²`, `c = cs/ms = 6.0 s⁻¹`, `μ = mu/ms = 0.15`) driven at 80 km/h over
 * the profile slope; IRI = mean |body − wheel slope| [m/m] × 1000 = m/km (physics.md §2).
 *
 * @module
 */
import { discretizeZoh, lyapunov } from './linalg';
import { ISO8608_N0 } from './iso8608';
import { PhysicsInputError, PhysicsNumericError, requireInRange } from './types';

/** Golden-car constants (ASTM E1926; Sayers et al. 1986, World Bank TP 46). */
export const GOLDEN_CAR = Object.freeze({
  /** Tyre rate / sprung mass [1/s²]. */
  k1: 653,
  /** Spring rate / sprung mass [1/s²]. */
  k2: 63.3,
  /** Damping / sprung mass [1/s]. */
  c: 6.0,
  /** Unsprung / sprung mass [1]. */
  mu: 0.15,
  /** Simulated speed [m/s] (80 km/h). */
  speedMps: 80 / 3.6,
  /** Moving-average base length [m]. */
  baseM: 0.25,
  /** Initialisation length [m]. */
  initM: 11,
});

/** Golden-car discrete coefficients for one sample interval. */
export interface GoldenCarCoefficients {
  /** State transition matrix ST, 4×4 row-major, state [zs, zs', zu, zu']. */
  ST: Float64Array;
  /** Input vector PR (profile input). */
  PR: Float64Array;
}

/**
 * Golden-car state-transition matrix ST and input vector PR for a sample interval, as in
 * Sayers' IRI program: `ST = exp(A·dt)`, `PR = A⁻¹(ST − I)·B`, `dt = dx / (80 km/h)`.
 *
 * Source: ASTM E1926; Sayers 1995 ("On the calculation of IRI from longitudinal road
 * profile", TRR 1501); published ST/PR for 0.25 m in physics.md §2 (reproduced by tests).
 *
 * @param dxM sample interval [m], 1 mm – 1 m
 * @returns ST and PR
 * @example
 * goldenCarST_PR(0.25).ST[0]; // → 0.9966071 (Sayers' ST(1,1) for 0.25 m)
 */
export function goldenCarST_PR(dxM: number): GoldenCarCoefficients {
  requireInRange('dxM', dxM, 'm', 0.001, 1, false);
  const { k1, k2, c, mu, speedMps } = GOLDEN_CAR;
  const a = new Float64Array([
    0, 1, 0, 0,
    -k2, -c, k2, c,
    0, 0, 0, 1,
    k2 / mu, c / mu, -(k1 + k2) / mu, -c / mu,
  ]);
  const b = new Float64Array([0, 0, 0, k1 / mu]);
  const { Ad, Bd } = discretizeZoh(a, b, 4, dxM / speedMps);
  return { ST: Ad, PR: Bd };
}

/** IRI of one segment of a profile. */
export interface IriSegment {
  /** Segment start [m]. */
  startM: number;
  /** Segment end [m]. */
  endM: number;
  /** IRI [m/km]. */
  iri: number;
}

/**
 * Run the golden car over a profile and return, per simulation step, the rectified slope
 * |body slope − wheel slope| [m/m] and the distance of the step's midpoint [m].
 */
function rectifiedSlopes(profileM: ArrayLike<number>, dxM: number): { rs: Float64Array; midM: Float64Array } {
  requireInRange('dxM', dxM, 'm', 0.001, 1, false);
  const len = profileM.length;
  for (let i = 0; i < len; i++) {
    if (!Number.isFinite(profileM[i])) throw new PhysicsNumericError(`profileM[${i}] (value ${profileM[i]} m)`);
  }
  // ASTM E1926: intervals finer than 250 mm are smoothed by a 250 mm moving average; the
  // moving-average slope over the base is (y[i+k] − y[i]) / (k·dx).
  const k = Math.max(1, Math.round(GOLDEN_CAR.baseM / dxM));
  const i11 = Math.round(GOLDEN_CAR.initM / dxM);
  if (len < Math.max(i11, k) + 2) {
    throw new PhysicsInputError('profileM', 'm', `needs more than ${GOLDEN_CAR.initM} m of samples (at least ${Math.max(i11, k) + 2} at dx ${dxM} m), got ${len}`);
  }
  const { ST, PR } = goldenCarST_PR(dxM);
  const [s00, s01, s02, s03, s10, s11, s12, s13, s20, s21, s22, s23, s30, s31, s32, s33] = ST;
  const [p0, p1, p2, p3] = PR;
  // start rule: body and wheel slope = profile slope over the first 11 m, velocities zero
  let z0 = (profileM[i11] - profileM[0]) / (i11 * dxM);
  let z1 = 0;
  let z2 = z0;
  let z3 = 0;
  const steps = len - k;
  const rs = new Float64Array(steps);
  const midM = new Float64Array(steps);
  const inv = 1 / (k * dxM);
  for (let i = 0; i < steps; i++) {
    const yp = (profileM[i + k] - profileM[i]) * inv;
    const n0 = s00 * z0 + s01 * z1 + s02 * z2 + s03 * z3 + p0 * yp;
    const n1 = s10 * z0 + s11 * z1 + s12 * z2 + s13 * z3 + p1 * yp;
    const n2 = s20 * z0 + s21 * z1 + s22 * z2 + s23 * z3 + p2 * yp;
    const n3 = s30 * z0 + s31 * z1 + s32 * z2 + s33 * z3 + p3 * yp;
    z0 = n0;
    z1 = n1;
    z2 = n2;
    z3 = n3;
    rs[i] = Math.abs(z0 - z2);
    midM[i] = (i + k / 2) * dxM;
  }
  return { rs, midM };
}

/**
 * IRI of a whole evenly spaced profile.
 *
 * Method: ASTM E1926 golden car (Sayers 1995 algorithm): 250 mm moving average when the
 * interval is finer, ST/PR for the actual interval, 11 m initialisation. ASTM E1926 asks for
 * intervals ≤ 250 mm; coarser intervals are accepted (≤ 1 m) but read low.
 *
 * @param profileM elevations [m], evenly spaced, more than 11 m long
 * @param dxM sample interval [m]
 * @returns IRI [m/km]
 * @example
 * iri(Float64Array.from({ length: 4001 }, (_, i) => 0.005 * Math.sin(2 * Math.PI * i * 0.25 / 5)), 0.25); // → ≈ 4.65 (physics.md §2, computed)
 */
export function iri(profileM: ArrayLike<number>, dxM: number): number {
  const { rs } = rectifiedSlopes(profileM, dxM);
  let sum = 0;
  for (let i = 0; i < rs.length; i++) sum += rs[i];
  return (sum / rs.length) * 1000;
}

/**
 * IRI per fixed-length segment of a profile. The golden car runs continuously over the whole
 * profile (initialised once, ASTM E1926), and each segment averages the steps whose midpoint
 * falls in it; the last segment may be shorter.
 *
 * @param profileM elevations [m], evenly spaced
 * @param dxM sample interval [m]
 * @param segmentM segment length [m], ≥ 1 m
 * @param opts.startM distance of the first sample [m] (default 0), added to segment bounds
 * @returns segments with start, end [m] and IRI [m/km]
 * @example
 * iriSegments(profile, 0.25, 100); // → [{ startM: 0, endM: 100, iri: … }, { startM: 100, endM: 200, iri: … }, …]
 */
export function iriSegments(profileM: ArrayLike<number>, dxM: number, segmentM: number, opts: { startM?: number } = {}): IriSegment[] {
  requireInRange('segmentM', segmentM, 'm', 1, 1e7, false);
  const startM = requireInRange('startM', opts.startM ?? 0, 'm', -1e9, 1e9, false);
  const { rs, midM } = rectifiedSlopes(profileM, dxM);
  const totalM = (profileM.length - 1) * dxM;
  const nSeg = Math.max(1, Math.ceil(totalM / segmentM - 1e-9));
  const sums = new Float64Array(nSeg);
  const counts = new Float64Array(nSeg);
  for (let i = 0; i < rs.length; i++) {
    const s = Math.min(nSeg - 1, Math.floor(midM[i] / segmentM));
    sums[s] += rs[i];
    counts[s] += 1;
  }
  const out: IriSegment[] = [];
  for (let s = 0; s < nSeg; s++) {
    if (counts[s] === 0) continue;
    out.push({ startM: startM + s * segmentM, endM: startM + Math.min((s + 1) * segmentM, totalM), iri: (sums[s] / counts[s]) * 1000 });
  }
  return out;
}

let iriPerSqrtGd: number | null = null;

/**
 * The constant K in `IRI = K·√Gd(n0)` for `w = 2` roads [ (m/km)/√m³ ], from the golden car in
 * closed form.
 *
 * Derivation: on a `w = 2` road the profile slope is white with one-sided PSD in time
 * `G0/v²`, `G0 = 4π²·Gd(n0)·n0²·v`. The golden car's relative velocity is then Gaussian with
 * variance σ² = (G0/2)·(C·P·Cᵀ), P solving its Lyapunov equation (physics.md §2). For a
 * zero-mean Gaussian, E|x| = √(2/π)·σ, and IRI = E|zs' − zu'| / v × 1000.
 * Profiles processed by {@link iri} read slightly lower than this: ASTM's 250 mm moving average
 * (and, at 250 mm sampling, the missing content above 2 cycles/m) removes short-wavelength
 * slope that the white-slope model keeps — about 2 % at 50 mm sampling and 4 % at 250 mm on
 * synthesised roads (computed, see tests).
 *
 * @returns K ≈ 554.7 [(m/km)/√m³]
 * @example
 * iriPerSqrtGdConstant() * Math.sqrt(64e-6); // → ≈ 4.44 m/km, ISO 8608 class B geometric mean
 */
export function iriPerSqrtGdConstant(): number {
  if (iriPerSqrtGd !== null) return iriPerSqrtGd;
  const { k1, k2, c, mu, speedMps: v } = GOLDEN_CAR;
  // state [zs − zu, zs', zu − zr, zu'], input road velocity
  const a = new Float64Array([
    0, 1, 0, -1,
    -k2, -c, 0, c,
    0, 0, 0, 1,
    k2 / mu, c / mu, -k1 / mu, -c / mu,
  ]);
  const q = new Float64Array(16);
  q[2 * 4 + 2] = 1; // B = [0, 0, −1, 0]
  const p = lyapunov(a, q, 4);
  const relVar = p[1 * 4 + 1] - 2 * p[1 * 4 + 3] + p[3 * 4 + 3];
  const g0PerGd = 4 * Math.PI * Math.PI * ISO8608_N0 * ISO8608_N0 * v;
  const sigmaPerSqrtGd = Math.sqrt((g0PerGd / 2) * relVar);
  iriPerSqrtGd = (Math.sqrt(2 / Math.PI) * sigmaPerSqrtGd * 1000) / v;
  return iriPerSqrtGd;
}

/**
 * IRI of an ISO 8608 `w = 2` road of given `Gd(n0)` (see {@link iriPerSqrtGdConstant}).
 *
 * @param gdN0 displacement PSD at n0 = 0.1 cycles/m [m³], ≥ 0
 * @returns IRI [m/km]
 * @example
 * iriFromGd(256e-6); // → ≈ 8.88 m/km (class C mean; twice class B since IRI ∝ √Gd)
 */
export function iriFromGd(gdN0: number): number {
  requireInRange('gdN0', gdN0, 'm³', 0, 1, false);
  return iriPerSqrtGdConstant() * Math.sqrt(gdN0);
}

/**
 * `Gd(n0)` of the ISO 8608 `w = 2` road with a given IRI (inverse of {@link iriFromGd}).
 *
 * @param iriMPerKm IRI [m/km], ≥ 0
 * @returns Gd(n0) [m³]
 * @example
 * gdFromIri(iriFromGd(64e-6)); // → 64e-6
 */
export function gdFromIri(iriMPerKm: number): number {
  requireInRange('iri', iriMPerKm, 'm/km', 0, 1000, false);
  const k = iriPerSqrtGdConstant();
  return (iriMPerKm / k) ** 2;
}
