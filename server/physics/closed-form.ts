/**
 * Closed-form damper duty and ride for ISO 8608 `w = 2` roads.
 *
 * With `w = 2` the road velocity seen at speed v is white noise with one-sided PSD
 * `G0 = 4π²·Gd(n0)·n0²·v` [(m/s)²/Hz] (physics.md §2). For a stable linear system
 * `x' = A·x + B·u` driven by it, the state covariance is `(G0/2)·P` with P solving the Lyapunov
 * equation `A·P + P·Aᵀ + B·Bᵀ = 0` (e.g. Newland, An Introduction to Random Vibrations, ch. 13;
 * Cebon 1999 ch. 4). One solve per (corner, speed) serves every road: variances scale with
 * `Gd(n0)`.
 *
 * @module
 */
import { lyapunov } from './linalg';
import { stateSpace } from './quarter-car';
import { appendWk } from './exposure';
import { ISO8608_N0, gdForClass } from './iso8608';
import { requireInRange, validateCorner, validateSpeed, type CornerParams } from './types';

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
 * Solve once per (corner, speed): the quarter car with the ISO 2631-1 `Wk` filter appended
 * (order 12), one Lyapunov solve, and the variance of each output per unit Gd(n0).
 *
 * Method: Lyapunov equation for white road velocity over the whole frequency range (no band
 * limit), physics.md §2; `Wk` realisation from {@link appendWk}.
 *
 * @param c corner parameters [kg, N/m, N·s/m]
 * @param speedMps speed [m/s]
 * @returns cached variances per unit Gd(n0)
 * @example
 * prepareDuty(corner, 80 / 3.6).speedMps; // → 22.22…
 */
export function prepareDuty(c: CornerParams, speedMps: number): PreparedDuty {
  validateCorner(c);
  validateSpeed(speedMps);
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

/**
 * Duty of a prepared (corner, speed) on a road of given `Gd(n0)`: square roots of the cached
 * variances scaled by Gd(n0). Cheap (no solve): tens of millions of evaluations per second.
 *
 * Source: physics.md §2 (variances linear in Gd(n0)·v), §3 (damper power cs·E[v²]).
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
 * class B at 80 km/h; service life from common practice, physics.md §6).
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
