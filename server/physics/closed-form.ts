/**
 * Closed-form damper duty and ride for ISO 8608 `w = 2` roads.
 *
 * With `w = 2` the road velocity seen at speed v is white noise with one-sided PSD
 * `G0 = 4π²·Gd(n0)·n0²·v` [(m/s)²/Hz] (docs/methods.md "Road roughness"). For a stable linear system
 * `x' = A·x + B·u` driven by it, the state covariance is `(G0/2)·P` with P solving the Lyapunov
 * equation `A·P + P·Aᵀ + B·Bᵀ = 0` (e.g. Newland, An Introduction to Random Vibrations, ch. 13;
 * Cebon 1999 ch. 4). One solve per (corner, speed) serves every road: variances scale with
 * `Gd(n0)`.
 *
 * @module
 */
import { lyapunov } from './linalg';
import { cornerTransfer, stateSpace } from './quarter-car';
import type { SpectralMoments } from './fatigue';
import { appendWk, wkWeight } from './exposure';
import { ISO8608_N0, gdForClass } from './iso8608';
import { STANDARD_GRAVITY, requireInRange, validateCorner, validateSpeed, type CornerParams } from './types';

/** Variances per unit Gd(n0) for one (corner, speed), ready for {@link dutyOnRoad}. */
export interface PreparedDuty {
  /** Speed [m/s]. */
  speedMps: number;
  /** Damper coefficient [N·s/m]. */
  dampingNsPerM: number;
  /** Var(body acceleration) per unit Gd(n0) [(m/s²)²/m³]. */
  varBodyAccelPerGd: number;
  /** Var(Wk-weighted body acceleration) per unit Gd(n0) [(m/s²)²/m³]. */
  varWeightedAccelPerGd: number;
  /** Var(suspension travel) per unit Gd(n0) [m²/m³]. */
  varTravelPerGd: number;
  /** Var(relative velocity) per unit Gd(n0) [(m/s)²/m³]. */
  varRelVelPerGd: number;
  /** Var(dynamic tyre load / static load) per unit Gd(n0) [1/m³]. */
  varTireLoadRatioPerGd: number;
}

/** Duty and ride of a corner on a road, in SI units. */
export interface DutyResult {
  /** RMS body acceleration [m/s²]. */
  rmsBodyAccel: number;
  /** RMS ISO 2631-1 Wk-weighted body acceleration [m/s²] (floor, not seat). */
  rmsWeightedAccel: number;
  /** RMS suspension travel [m]. */
  rmsSuspensionTravel: number;
  /** RMS damper relative velocity [m/s]. */
  rmsRelativeVelocity: number;
  /** RMS dynamic tyre load / static wheel load [1]. */
  rmsTireLoadRatio: number;
  /** Mean damper power cs·E[v²] [W]. */
  damperPowerW: number;
  /** Damper energy per km travelled [J/km]. */
  damperEnergyJPerKm: number;
}

const quadForm = (p: Float64Array, r: Float64Array, n: number): number => {
  let s = 0;
  for (let i = 0; i < n; i++) {
    if (r[i] === 0) continue;
    for (let j = 0; j < n; j++) s += r[i] * p[i * n + j] * r[j];
  }
  return s;
};

/**
 * The road input every duty figure of the app is computed on, closed form and simulation alike:
 * an ISO 8608 road seen through wavelengths of at least 0.6 m (spatial frequencies up to
 * 1/0.6 = 1.667 cycles/m). That is the band every accepted survey carries (sample interval
 * ≤ 0.3 m, Nyquist 1.667 cycles/m), and waves shorter than about twice a tyre's contact length
 * are largely enveloped by the tyre (common practice, from memory). The same limit on both
 * methods makes a profiled segment and a classified segment of the same Gd(n0) read alike
 * (docs/methods.md "One road model for both methods").
 */
export const ROAD_BAND = Object.freeze({ maxCyclesPerM: 1 / 0.6 });

/** Options of {@link prepareDuty}. */
export interface PrepareDutyOptions {
  /** Highest road spatial frequency [cycles/m], or 'unlimited' for the white-velocity road (default {@link ROAD_BAND}). */
  maxCyclesPerM?: number | 'unlimited';
}

/**
 * Solve once per (corner, speed): the variance of each output per unit Gd(n0).
 *
 * Method, band-limited road (the default, {@link ROAD_BAND}): each output's variance is
 * `∫ |H(f)|²·Gd(n0)·n0²·v/f² df` from 0.01 Hz to `f_max = n_max·v`, |H| from the closed-form
 * transfer functions of the two-mass model (as quarter-car.ts `cornerTransfer`) and, for the
 * weighted acceleration, the ISO 2631-1 `Wk` magnitude ({@link wkWeight}); trapezoid rule in
 * ln f, 400 points a decade (below 0.01 Hz every integrand vanishes as f²). Unlimited road: Lyapunov equation for white road velocity over the
 * whole frequency range, docs/methods.md "Road roughness", with the `Wk` realisation of {@link appendWk}.
 *
 * @param c corner parameters [kg, N/m, N·s/m]
 * @param speedMps speed [m/s]
 * @param opts road band (default {@link ROAD_BAND})
 * @returns cached variances per unit Gd(n0)
 * @example
 * prepareDuty(corner, 80 / 3.6).speedMps; // → 22.22…
 */
export function prepareDuty(c: CornerParams, speedMps: number, opts: PrepareDutyOptions = {}): PreparedDuty {
  validateCorner(c);
  validateSpeed(speedMps);
  const band = opts.maxCyclesPerM ?? ROAD_BAND.maxCyclesPerM;
  if (band !== 'unlimited') return prepareBandLimited(c, speedMps, requireInRange('maxCyclesPerM', band, 'cycles/m', 0.05, 1000, false));
  const ss = stateSpace(c);
  const aug = appendWk(ss.A, ss.B, 4, ss.outputs.bodyAccel);
  const n = aug.n;
  const q = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) q[i * n + j] = aug.B[i] * aug.B[j];
  const p = lyapunov(aug.A, q, n);
  const pad = (r: Float64Array): Float64Array => {
    const o = new Float64Array(n);
    o.set(r);
    return o;
  };
  // covariance = (G0/2)·P, G0 = 4π²·Gd·n0²·v
  const k = (4 * Math.PI * Math.PI * ISO8608_N0 * ISO8608_N0 * speedMps) / 2;
  return {
    speedMps,
    dampingNsPerM: c.dampingNsPerM,
    varBodyAccelPerGd: k * quadForm(p, pad(ss.outputs.bodyAccel), n),
    varWeightedAccelPerGd: k * quadForm(p, aug.weighted, n),
    varTravelPerGd: k * quadForm(p, pad(ss.outputs.suspensionTravel), n),
    varRelVelPerGd: k * quadForm(p, pad(ss.outputs.relativeVelocity), n),
    varTireLoadRatioPerGd: (k * quadForm(p, pad(ss.outputs.tireLoad), n)) / (ss.staticLoadN * ss.staticLoadN),
  };
}

/** Fixed log-frequency grid of the band-limited integrals: from 0.01 Hz in steps of ln(10)/400 (400 points a decade). */
const GRID_F0 = 0.01;
const GRID_LN_STEP = Math.LN10 / 400;
let wkSquaredGrid = new Float64Array(0);

/** |Wk|² on the grid up to index `n` (cached: it depends on frequency only). */
function wkSquared(n: number): Float64Array {
  if (wkSquaredGrid.length <= n) {
    const g = new Float64Array(n + 401);
    for (let i = 0; i < g.length; i++) g[i] = wkWeight(GRID_F0 * Math.exp(i * GRID_LN_STEP)) ** 2;
    wkSquaredGrid = g;
  }
  return wkSquaredGrid;
}

function prepareBandLimited(c: CornerParams, v: number, nMax: number): PreparedDuty {
  const { sprungMassKg: ms, unsprungMassKg: mu, springRateNPerM: ks, dampingNsPerM: cs, tireRateNPerM: kt } = c;
  const f1 = nMax * v;
  // whole grid steps up to f1, then one partial step ending exactly at f1
  const last = Math.max(1, Math.floor(Math.log(f1 / GRID_F0) / GRID_LN_STEP));
  const wk2 = wkSquared(last + 1);
  const out = new Float64Array(5); // acc, weighted, travel, relvel, tyre load
  const prev = new Float64Array(5);
  const cur = new Float64Array(5);
  const at = (f: number, wkSq: number, into: Float64Array) => {
    // closed-form transfer magnitudes of quarter-car.ts cornerTransfer, inlined (no allocation)
    const w = 2 * Math.PI * f;
    const w2 = w * w;
    const dRe = ms * mu * w2 * w2 - (ms * (ks + kt) + mu * ks) * w2 + ks * kt;
    const dIm = -cs * (ms + mu) * w2 * w + cs * kt * w;
    const den = dRe * dRe + dIm * dIm;
    const zs2 = (kt * kt * (ks * ks + cs * cs * w2)) / den;
    const travel2 = (kt * ms * w2) ** 2 / den;
    const nr = kt * (ks - ms * w2);
    const ni = kt * cs * w;
    const zuRe = (nr * dRe + ni * dIm) / den;
    const zuIm = (ni * dRe - nr * dIm) / den;
    const tire2 = kt * kt * ((1 - zuRe) ** 2 + zuIm * zuIm);
    // integrand × f (integral in ln f); road displacement PSD per unit Gd(n0): n0²·v/f²
    const g = (ISO8608_N0 * ISO8608_N0 * v) / f;
    const acc2 = w2 * w2 * zs2;
    into[0] = acc2 * g;
    into[1] = acc2 * wkSq * g;
    into[2] = travel2 * g;
    into[3] = travel2 * w2 * g;
    into[4] = tire2 * g;
  };
  at(GRID_F0, wk2[0], prev);
  for (let i = 1; i <= last; i++) {
    at(GRID_F0 * Math.exp(i * GRID_LN_STEP), wk2[i], cur);
    for (let k = 0; k < 5; k++) {
      out[k] += 0.5 * GRID_LN_STEP * (prev[k] + cur[k]);
      prev[k] = cur[k];
    }
  }
  const fLast = GRID_F0 * Math.exp(last * GRID_LN_STEP);
  const h = Math.log(f1 / fLast);
  if (h > 0) {
    const frac = h / GRID_LN_STEP;
    at(f1, wk2[last] + (wk2[last + 1] - wk2[last]) * frac, cur);
    for (let k = 0; k < 5; k++) out[k] += 0.5 * h * (prev[k] + cur[k]);
  }
  const w = (ms + mu) * STANDARD_GRAVITY;
  return {
    speedMps: v,
    dampingNsPerM: cs,
    varBodyAccelPerGd: out[0],
    varWeightedAccelPerGd: out[1],
    varTravelPerGd: out[2],
    varRelVelPerGd: out[3],
    varTireLoadRatioPerGd: out[4] / (w * w),
  };
}

/**
 * Duty of a prepared (corner, speed) on a road of given `Gd(n0)`: square roots of the cached
 * variances scaled by Gd(n0). Cheap (no solve): tens of millions of evaluations per second.
 *
 * Source: docs/methods.md "Road roughness" (variances linear in Gd(n0)·v), §3 (damper power cs·E[v²]).
 *
 * @param p prepared solve from {@link prepareDuty}
 * @param gdN0 road displacement PSD at n0 = 0.1 cycles/m [m³]
 * @returns RMS responses, mean damper power [W] and energy per km [J/km]
 * @example
 * dutyOnRoad(prepareDuty(corner, 80 / 3.6), 64e-6).damperPowerW; // → ≈ 28.1 W for the 400/45 kg example corner on class B
 */
export function dutyOnRoad(p: PreparedDuty, gdN0: number): DutyResult {
  if (!(gdN0 >= 0 && gdN0 < 1)) requireInRange('gdN0', gdN0, 'm³', 0, 1, false);
  const power = p.dampingNsPerM * p.varRelVelPerGd * gdN0;
  return {
    rmsBodyAccel: Math.sqrt(p.varBodyAccelPerGd * gdN0),
    rmsWeightedAccel: Math.sqrt(p.varWeightedAccelPerGd * gdN0),
    rmsSuspensionTravel: Math.sqrt(p.varTravelPerGd * gdN0),
    rmsRelativeVelocity: Math.sqrt(p.varRelVelPerGd * gdN0),
    rmsTireLoadRatio: Math.sqrt(p.varTireLoadRatioPerGd * gdN0),
    damperPowerW: power,
    damperEnergyJPerKm: (power / p.speedMps) * 1000,
  };
}

/** Options of {@link ratedLifeEnergyJ}. */
export interface RatedLifeOptions {
  /** Rated distance [km] (default 90 000, common practice 80 000–100 000 km). */
  km?: number;
  /** Road Gd(n0) [m³] (default ISO 8608 class B geometric mean, 64e-6). */
  gdN0?: number;
  /** Speed [m/s] (default 80 km/h). */
  speedMps?: number;
}

/**
 * Rated damper life as dissipated energy: the energy the corner's damper dissipates over
 * `km` kilometres of a `Gd(n0)` road at `speedMps` (product.md §3 default: 90 000 km of ISO
 * class B at 80 km/h; service life from common practice, docs/methods.md "Typical parameters").
 *
 * @param c corner parameters [kg, N/m, N·s/m]
 * @param opts distance [km], Gd(n0) [m³], speed [m/s]
 * @returns rated life energy [J]
 * @example
 * ratedLifeEnergyJ(corner); // → ≈ 1.14e8 J for the 400/45 kg example corner (1263 J/km × 90 000 km)
 */
export function ratedLifeEnergyJ(c: CornerParams, opts: RatedLifeOptions = {}): number {
  const km = requireInRange('km', opts.km ?? 90_000, 'km', 0, 1e7, true);
  const gd = requireInRange('gdN0', opts.gdN0 ?? gdForClass('B'), 'm³', 0, 1, true);
  const v = opts.speedMps ?? 80 / 3.6;
  return dutyOnRoad(prepareDuty(c, v), gd).damperEnergyJPerKm * km;
}

/**
 * Spectral moments of suspension travel on a `w = 2` road of `gdN0` at speed v, from the
 * closed-form transfer function and the road's temporal PSD `G(f) = Gd(n0)·n0²·v / f²`,
 * trapezoid rule on a log grid from 0.01 Hz to the road band's top `ROAD_BAND·v` (600 points; m0
 * within 1 % of the closed form's travel variance, tested).
 *
 * @param c corner [kg, N/m, N·s/m]
 * @param speedMps speed [m/s]
 * @param gdN0 road Gd(n0) [m³]
 * @returns m0 [m²], m1 [m²·Hz], m2 [m²·Hz²], m4 [m²·Hz⁴]
 */
export function travelMoments(c: CornerParams, speedMps: number, gdN0: number): SpectralMoments {
  const n = 600;
  const f0 = 0.01, f1 = ROAD_BAND.maxCyclesPerM * speedMps;
  const r = Math.pow(f1 / f0, 1 / (n - 1));
  let m0 = 0, m1 = 0, m2 = 0, m4 = 0;
  let fp = 0, gp = 0;
  for (let i = 0; i < n; i++) {
    const f = f0 * Math.pow(r, i);
    const [re, im] = cornerTransfer(c, f).suspensionTravel;
    const g = (re * re + im * im) * ((gdN0 * ISO8608_N0 * ISO8608_N0 * speedMps) / (f * f));
    if (i > 0) {
      const df = f - fp;
      m0 += 0.5 * df * (gp + g);
      m1 += 0.5 * df * (fp * gp + f * g);
      m2 += 0.5 * df * (fp * fp * gp + f * f * g);
      m4 += 0.5 * df * (fp ** 4 * gp + f ** 4 * g);
    }
    fp = f;
    gp = g;
  }
  return { m0, m1, m2, m4 };
}
