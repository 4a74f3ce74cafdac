/**
 * International Roughness Index (IRI) by the golden-car method, and its conversion to and from
 * the ISO 8608 `Gd(n0)` of a `w = 2` road.
 *
 * Method: ASTM E1926 / World Bank Technical Paper 46 (Sayers, Gillespie & Queiroz 1986;
 * Sayers 1995): a reference quarter car normalised by sprung mass (`k1 = kt/ms = 653 s⁻²`,
 * `k2 = ks/ms = 63.3 s⁻²`, `c = cs/ms = 6.0 s⁻¹`, `μ = mu/ms = 0.15`) driven at 80 km/h over
 * the profile slope; IRI = mean |body − wheel slope| [m/m] × 1000 = m/km (docs/methods.md "Road roughness").
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
 * profile", TRR 1501); published ST/PR for 0.25 m in docs/methods.md "Road roughness" (reproduced by tests).
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
 * iri(Float64Array.from({ length: 4001 }, (_, i) => 0.005 * Math.sin(2 * Math.PI * i * 0.25 / 5)), 0.25); // → ≈ 4.65 (docs/methods.md "Road roughness", computed)
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

let continuousK: number | null = null;

/**
 * The constant K in `IRI = K·√Gd(n0)` of the golden car in continuous closed form: white
 * profile slope up to any frequency, no moving average, no sampling. Profiles processed by
 * {@link iri} read lower than this (see {@link iriPerSqrtGdForInterval}); it is kept as the
 * upper reference, not used for conversions.
 *
 * Derivation: on a `w = 2` road the profile slope is white with one-sided PSD in time
 * `G0/v²`, `G0 = 4π²·Gd(n0)·n0²·v`. The golden car's relative velocity is then Gaussian with
 * variance σ² = (G0/2)·(C·P·Cᵀ), P solving its Lyapunov equation (docs/methods.md "Road roughness"). For a
 * zero-mean Gaussian, E|x| = √(2/π)·σ, and IRI = E|zs' − zu'| / v × 1000.
 *
 * @returns K ≈ 554.7 [(m/km)/√m³]
 * @example
 * iriPerSqrtGdContinuous(); // → ≈ 554.7
 */
export function iriPerSqrtGdContinuous(): number {
  if (continuousK !== null) return continuousK;
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
  continuousK = (Math.sqrt(2 / Math.PI) * sigmaPerSqrtGd * 1000) / v;
  return continuousK;
}

/** |C·(zI − ST)⁻¹·PR|² for z = e^{jθ}, C = [1, 0, −1, 0] (4×4 complex Gaussian elimination). */
function goldenGainSquared(st: Float64Array, pr: Float64Array, theta: number): number {
  const cr = Math.cos(theta);
  const ci = Math.sin(theta);
  // augmented rows [re(M) | re(b)], [im(M) | im(b)], M = zI − ST, b = PR
  const re = new Float64Array(20);
  const im = new Float64Array(20);
  for (let i = 0; i < 4; i++) {
    for (let j = 0; j < 4; j++) re[i * 5 + j] = (i === j ? cr : 0) - st[i * 4 + j];
    im[i * 5 + i] = ci;
    re[i * 5 + 4] = pr[i];
  }
  for (let col = 0; col < 4; col++) {
    let piv = col;
    let best = -1;
    for (let r = col; r < 4; r++) {
      const m = Math.hypot(re[r * 5 + col], im[r * 5 + col]);
      if (m > best) {
        best = m;
        piv = r;
      }
    }
    if (piv !== col) {
      for (let j = 0; j < 5; j++) {
        [re[col * 5 + j], re[piv * 5 + j]] = [re[piv * 5 + j], re[col * 5 + j]];
        [im[col * 5 + j], im[piv * 5 + j]] = [im[piv * 5 + j], im[col * 5 + j]];
      }
    }
    const pr0 = re[col * 5 + col];
    const pi0 = im[col * 5 + col];
    const d = pr0 * pr0 + pi0 * pi0;
    for (let r = col + 1; r < 4; r++) {
      // f = M[r][col] / M[col][col]
      const ar = re[r * 5 + col];
      const ai = im[r * 5 + col];
      const fr = (ar * pr0 + ai * pi0) / d;
      const fi = (ai * pr0 - ar * pi0) / d;
      for (let j = col; j < 5; j++) {
        const br = re[col * 5 + j];
        const bi = im[col * 5 + j];
        re[r * 5 + j] -= fr * br - fi * bi;
        im[r * 5 + j] -= fr * bi + fi * br;
      }
    }
  }
  const xr = new Float64Array(4);
  const xi = new Float64Array(4);
  for (let r = 3; r >= 0; r--) {
    let sr = re[r * 5 + 4];
    let si = im[r * 5 + 4];
    for (let j = r + 1; j < 4; j++) {
      sr -= re[r * 5 + j] * xr[j] - im[r * 5 + j] * xi[j];
      si -= re[r * 5 + j] * xi[j] + im[r * 5 + j] * xr[j];
    }
    const pr0 = re[r * 5 + r];
    const pi0 = im[r * 5 + r];
    const d = pr0 * pr0 + pi0 * pi0;
    xr[r] = (sr * pr0 + si * pi0) / d;
    xi[r] = (si * pr0 - sr * pi0) / d;
  }
  const yr = xr[0] - xr[2];
  const yi = xi[0] - xi[2];
  return yr * yr + yi * yi;
}

const intervalK = new Map<number, number>();

/**
 * The constant K in `IRI = K·√Gd(n0)` as {@link iri} itself computes IRI on a `w = 2` profile
 * sampled at `dxM` (band-limited to its Nyquist frequency 1/(2·dx), as survey profiles and the
 * app's synthesised profiles are).
 *
 * Derivation (computed, docs/methods.md "IRI and Gd(n0)"): {@link iri} feeds the discrete golden
 * car (ST, PR for dx) with the slope over k = round(0.25 m / dx) samples (the 250 mm moving
 * average; k = 1 at 0.25 m). That slope sequence has one-sided PSD
 * `S_u(n) = Gd(n0)·n0²/n² · 4·sin²(π·n·k·dx)/(k·dx)²` for 0 < n ≤ 1/(2dx); the rectified output
 * `zs − zu` has variance `σ² = ∫ |C(e^{j2πn·dx}I − ST)⁻¹PR|²·S_u(n) dn`, and IRI = √(2/π)·σ·1000.
 * Trapezoid rule on a log grid, 6000 points from 10⁻⁵ cycles/m to the Nyquist frequency.
 * Checked against golden-car runs over seeded profiles (tests).
 *
 * @param dxM sample interval [m], 1 mm – 0.3 m
 * @returns K [(m/km)/√m³]: ≈ 543 at 0.01–0.05 m, ≈ 532 at 0.25 m, ≈ 523 at 0.3 m
 * @example
 * iriPerSqrtGdForInterval(0.25); // → ≈ 532.3
 */
export function iriPerSqrtGdForInterval(dxM: number): number {
  requireInRange('dxM', dxM, 'm', 0.001, 0.3, false);
  const hit = intervalK.get(dxM);
  if (hit !== undefined) return hit;
  const { ST, PR } = goldenCarST_PR(dxM);
  const k = Math.max(1, Math.round(GOLDEN_CAR.baseM / dxM));
  const base = k * dxM;
  const nyq = 1 / (2 * dxM);
  const n0 = ISO8608_N0;
  const points = 6000;
  const lo = 1e-5;
  const r = Math.pow(nyq / lo, 1 / (points - 1));
  let variance = 0;
  let prevN = 0;
  let prevG = 0;
  for (let i = 0; i < points; i++) {
    const n = i === points - 1 ? nyq : lo * Math.pow(r, i);
    const s = Math.sin(Math.PI * n * base);
    const su = ((n0 * n0) / (n * n)) * (4 * s * s) / (base * base);
    const g = goldenGainSquared(ST, PR, 2 * Math.PI * n * dxM) * su;
    if (i === 0) variance += g * n; // 0 … lo: the integrand is flat there
    else variance += 0.5 * (n - prevN) * (g + prevG);
    prevN = n;
    prevG = g;
  }
  const kk = Math.sqrt(2 / Math.PI) * Math.sqrt(variance) * 1000;
  intervalK.set(dxM, kk);
  return kk;
}

/**
 * The reference sample interval of the IRI ↔ Gd(n0) conversion [m] when the profile behind an
 * IRI is not known (an IRI typed in, a class drawn as IRI): a finely sampled profile under
 * ASTM E1926's 250 mm moving average, the limit the standard's IRI tends to. K there ≈ 542.7;
 * it is ≈ 543 from 0.01 to 0.05 m and reads lower at coarser intervals (≈ 532 at 0.25 m,
 * ≈ 523 at 0.3 m), where the profile no longer carries the short waves the moving average
 * passes — conversions of an IRI the app measured on a survey use that survey's interval.
 */
export const IRI_CONVERSION_DX_M = 0.05;

/**
 * The constant K in `IRI = K·√Gd(n0)` used by every IRI ↔ Gd(n0) conversion in the app: the
 * golden car as {@link iri} computes it at {@link IRI_CONVERSION_DX_M}
 * ({@link iriPerSqrtGdForInterval}), so a road synthesised at Gd(n0) and measured by the app
 * reads back the same Gd(n0).
 *
 * @returns K ≈ 542.7 [(m/km)/√m³]
 * @example
 * iriPerSqrtGdConstant() * Math.sqrt(64e-6); // → ≈ 4.34 m/km, ISO 8608 class B geometric mean
 */
export function iriPerSqrtGdConstant(): number {
  return iriPerSqrtGdForInterval(IRI_CONVERSION_DX_M);
}

/**
 * IRI of an ISO 8608 `w = 2` road of given `Gd(n0)`, as the app's golden car reads it on a
 * profile sampled at `dxM` (see {@link iriPerSqrtGdForInterval}).
 *
 * @param gdN0 displacement PSD at n0 = 0.1 cycles/m [m³], ≥ 0
 * @param dxM sample interval of the profile the IRI is read on [m] (default {@link IRI_CONVERSION_DX_M})
 * @returns IRI [m/km]
 * @example
 * iriFromGd(256e-6); // → ≈ 8.68 m/km (class C mean; twice class B since IRI ∝ √Gd)
 */
export function iriFromGd(gdN0: number, dxM: number = IRI_CONVERSION_DX_M): number {
  requireInRange('gdN0', gdN0, 'm³', 0, 1, false);
  return iriPerSqrtGdForInterval(dxM) * Math.sqrt(gdN0);
}

/**
 * `Gd(n0)` of the ISO 8608 `w = 2` road with a given IRI (inverse of {@link iriFromGd}).
 *
 * @param iriMPerKm IRI [m/km], ≥ 0
 * @param dxM sample interval of the profile the IRI was read on [m] (default {@link IRI_CONVERSION_DX_M})
 * @returns Gd(n0) [m³]
 * @example
 * gdFromIri(iriFromGd(64e-6)); // → 64e-6
 */
export function gdFromIri(iriMPerKm: number, dxM: number = IRI_CONVERSION_DX_M): number {
  requireInRange('iri', iriMPerKm, 'm/km', 0, 1000, false);
  const k = iriPerSqrtGdForInterval(dxM);
  return (iriMPerKm / k) ** 2;
}
