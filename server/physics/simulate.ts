/**
 * Time-domain simulation of a corner over an evenly spaced road profile, using the exact
 * discrete form of the linear two-mass model (zero-order hold on road velocity).
 *
 * The road elevation is taken as linear between samples, so road velocity is constant over
 * each sample interval and the discrete recurrence `x[k+1] = Ad·x[k] + Bd·u[k]` is exact.
 *
 * The one simulation core of the app (the nightly job's buffer loops and the single-run
 * statistics alike), kept in one file of about 430 lines on purpose: the general loop and the two
 * specialised buffer loops (travel only; travel with the Wk filter) are the same recurrence written
 * out for speed, and keeping them side by side is what keeps them equal.
 *
 * @module
 */
import { discretizeZoh } from './linalg';
import { stateSpace } from './quarter-car';
import { appendWk } from './exposure';
import { PhysicsInputError, PhysicsNumericError, requireInRange, validateCorner, validateSpeed, type CornerParams } from './types';

/** A corner discretised for one sample interval, reusable over many profiles. */
export interface PreparedSimulation {
  /** Order of the simulated state (4, or 12 with the `Wk` filter). */
  n: number;
  /** Sample spacing along the road [m]. */
  dxM: number;
  /** Speed [m/s]. */
  speedMps: number;
  /** Time step dx/v [s]. */
  dtS: number;
  /** Damper coefficient [N·s/m]. */
  dampingNsPerM: number;
  /** Static wheel load [N]. */
  staticLoadN: number;
  /** exp(A·dt), n×n row-major. */
  Ad: Float64Array;
  /** ZOH input vector, length n. */
  Bd: Float64Array;
  /** Output rows, each length n. */
  rows: { bodyAccel: Float64Array; suspensionTravel: Float64Array; relativeVelocity: Float64Array; tireLoad: Float64Array; weightedAccel: Float64Array | null };
}

/**
 * Discretise a corner for simulation at a given sample spacing and speed.
 *
 * Method: exact zero-order-hold discretisation (docs/methods.md "The corner model"; {@link discretizeZoh}).
 *
 * @param c corner parameters [kg, N/m, N·s/m]
 * @param dxM profile sample spacing [m], 1 mm – 10 m
 * @param speedMps speed [m/s]
 * @param opts.weighted also carry the ISO 2631-1 `Wk` filter (state order 12) to get weighted body acceleration
 * @returns the prepared recurrence
 * @example
 * prepareSimulation(corner, 0.05, 20).dtS; // → 0.0025 [s]
 */
export function prepareSimulation(
  c: CornerParams,
  dxM: number,
  speedMps: number,
  opts: { weighted?: boolean } = {},
): PreparedSimulation {
  validateCorner(c);
  requireInRange('dxM', dxM, 'm', 0.001, 10, false);
  validateSpeed(speedMps);
  const ss = stateSpace(c);
  const dtS = dxM / speedMps;
  if (opts.weighted) {
    const aug = appendWk(ss.A, ss.B, 4, ss.outputs.bodyAccel);
    const { Ad, Bd } = discretizeZoh(aug.A, aug.B, aug.n, dtS);
    const pad = (r: Float64Array): Float64Array => {
      const o = new Float64Array(aug.n);
      o.set(r);
      return o;
    };
    return {
      n: aug.n, dxM, speedMps, dtS, dampingNsPerM: c.dampingNsPerM, staticLoadN: ss.staticLoadN, Ad, Bd,
      rows: {
        bodyAccel: pad(ss.outputs.bodyAccel),
        suspensionTravel: pad(ss.outputs.suspensionTravel),
        relativeVelocity: pad(ss.outputs.relativeVelocity),
        tireLoad: pad(ss.outputs.tireLoad),
        weightedAccel: aug.weighted,
      },
    };
  }
  const { Ad, Bd } = discretizeZoh(ss.A, ss.B, 4, dtS);
  return { n: 4, dxM, speedMps, dtS, dampingNsPerM: c.dampingNsPerM, staticLoadN: ss.staticLoadN, Ad, Bd, rows: { ...ss.outputs, weightedAccel: null } };
}

/** Output series of a simulation, one value per profile sample (index 0 = initial state). */
export interface SimulationSeries {
  /** Body acceleration [m/s²]. */
  bodyAccel: Float64Array;
  /** Suspension travel zs − zu [m]. */
  suspensionTravel: Float64Array;
  /** Damper relative velocity [m/s]. */
  relativeVelocity: Float64Array;
  /** Dynamic tyre load [N]. */
  tireLoad: Float64Array;
  /** `Wk`-weighted body acceleration [m/s²] (only with `weighted`). */
  weightedAccel?: Float64Array;
}

/** Running statistics of a simulation (RMS about zero = the static equilibrium). */
export interface SimulationResult {
  /** Steps simulated (samples − 1). */
  steps: number;
  /** Steps that entered the statistics (after the warm-up). */
  countedSteps: number;
  /** Time step [s]. */
  dtS: number;
  /** RMS body acceleration [m/s²]. */
  rmsBodyAccel: number;
  /** RMS `Wk`-weighted body acceleration [m/s²], NaN unless `weighted`. */
  rmsWeightedAccel: number;
  /** RMS suspension travel [m]. */
  rmsSuspensionTravel: number;
  /** RMS damper relative velocity [m/s]. */
  rmsRelativeVelocity: number;
  /** RMS dynamic tyre load / static load [1]. */
  rmsTireLoadRatio: number;
  /** Mean damper power cs·E[v²] [W]. */
  damperPowerW: number;
  /** Damper energy over the counted distance [J]. */
  damperEnergyJ: number;
  /** Damper energy per km [J/km]. */
  damperEnergyJPerKm: number;
  /** Output series, when `series` was requested. */
  series?: SimulationSeries;
}

/** Options of {@link runSimulation} / {@link simulateProfile}. */
export interface SimulationOptions {
  /** Distance at the start excluded from statistics (transient) [m]; default 0. */
  warmupM?: number;
  /** Also return the output series (allocated once before the loop). */
  series?: boolean;
}

/**
 * Run a prepared corner over a profile. The vehicle starts at rest in static equilibrium on
 * the first sample (zero state). Statistics use the state at the end of each step.
 *
 * Hot loop: `Float64Array`s, unrolled for the 4-state case, no allocation per step; a
 * non-finite profile value or state throws a `physics: non-finite …` error.
 *
 * @param p prepared corner ({@link prepareSimulation})
 * @param elevationsM road elevation samples at spacing `p.dxM` [m], at least 2
 * @param opts warm-up distance [m] and whether to return series
 * @returns running statistics, and series when requested
 * @example
 * runSimulation(prepareSimulation(corner, 0.05, 20), new Float64Array(1000)).rmsBodyAccel; // → 0 (flat road)
 */
export function runSimulation(p: PreparedSimulation, elevationsM: Float64Array, opts: SimulationOptions = {}): SimulationResult {
  const len = elevationsM.length;
  if (len < 2) throw new PhysicsInputError('elevationsM', 'm', `needs at least 2 samples, got ${len}`);
  for (let i = 0; i < len; i++) {
    if (!Number.isFinite(elevationsM[i])) throw new PhysicsNumericError(`elevationsM[${i}] (value ${elevationsM[i]} m)`);
  }
  const warmupM = requireInRange('warmupM', opts.warmupM ?? 0, 'm', 0, Number.MAX_VALUE, false);
  const steps = len - 1;
  const firstCounted = Math.min(steps, Math.ceil(warmupM / p.dxM)); // step index (0-based) from which states are counted
  const series: SimulationSeries | undefined = opts.series
    ? {
        bodyAccel: new Float64Array(len),
        suspensionTravel: new Float64Array(len),
        relativeVelocity: new Float64Array(len),
        tireLoad: new Float64Array(len),
        ...(p.rows.weightedAccel ? { weightedAccel: new Float64Array(len) } : {}),
      }
    : undefined;
  // the nightly job's buffer loops are the core; the general loop only for series or other orders
  const sums =
    p.n === 4 && !series
      ? sumsOf(simulateTravel(p, elevationsM, firstCounted, null))
      : p.n === 12 && p.rows.weightedAccel && !series
        ? sumsOf(simulateWeighted(p, elevationsM, firstCounted, steps, null))
        : loopGeneral(p, elevationsM, firstCounted, series);
  const counted = steps - firstCounted;
  for (let i = 0; i < sums.length; i++) {
    if (!Number.isFinite(sums[i])) throw new PhysicsNumericError('state during simulation');
  }
  const inv = counted > 0 ? 1 / counted : NaN;
  const rmsRelativeVelocity = Math.sqrt(sums[2] * inv);
  const damperPowerW = p.dampingNsPerM * sums[2] * inv;
  const durationS = counted * p.dtS;
  return {
    steps,
    countedSteps: counted,
    dtS: p.dtS,
    rmsBodyAccel: Math.sqrt(sums[0] * inv),
    rmsWeightedAccel: p.rows.weightedAccel ? Math.sqrt(sums[4] * inv) : NaN,
    rmsSuspensionTravel: Math.sqrt(sums[1] * inv),
    rmsRelativeVelocity,
    rmsTireLoadRatio: Math.sqrt(sums[3] * inv) / p.staticLoadN,
    damperPowerW,
    damperEnergyJ: damperPowerW * durationS,
    damperEnergyJPerKm: (damperPowerW / p.speedMps) * 1000,
    series,
  };
}

/** Sums of squares [accel, travel, relvel, tyre load, weighted] back from the mean squares of the buffer loops. */
function sumsOf(m: TravelSums & { msWeightedAccel?: number }): Float64Array {
  const c = m.counted;
  return new Float64Array([m.msBodyAccel * c, m.msTravel * c, m.msRelVel * c, m.msTireLoad * c, (m.msWeightedAccel ?? 0) * c]);
}

/** General-order loop (weighted and/or series). */
function loopGeneral(p: PreparedSimulation, e: Float64Array, firstCounted: number, series: SimulationSeries | undefined): Float64Array {
  const n = p.n;
  const a = p.Ad;
  const b = p.Bd;
  const { bodyAccel: ra, suspensionTravel: rt, relativeVelocity: rv, tireLoad: rf } = p.rows;
  const rw = p.rows.weightedAccel ?? new Float64Array(n);
  let x = new Float64Array(n);
  let nx = new Float64Array(n);
  const invDt = 1 / p.dtS;
  const steps = e.length - 1;
  let sa = 0, st = 0, sv = 0, sf = 0, sw = 0;
  for (let k = 0; k < steps; k++) {
    const u = (e[k + 1] - e[k]) * invDt;
    for (let i = 0; i < n; i++) {
      let s = b[i] * u;
      const off = i * n;
      for (let j = 0; j < n; j++) s += a[off + j] * x[j];
      nx[i] = s;
    }
    const swap = x;
    x = nx;
    nx = swap;
    let ya = 0, yt = 0, yv = 0, yf = 0, yw = 0;
    for (let i = 0; i < n; i++) {
      const xi = x[i];
      ya += ra[i] * xi;
      yt += rt[i] * xi;
      yv += rv[i] * xi;
      yf += rf[i] * xi;
      yw += rw[i] * xi;
    }
    if (series) {
      series.bodyAccel[k + 1] = ya;
      series.suspensionTravel[k + 1] = yt;
      series.relativeVelocity[k + 1] = yv;
      series.tireLoad[k + 1] = yf;
      if (series.weightedAccel) series.weightedAccel[k + 1] = yw;
    }
    if (k >= firstCounted) {
      sa += ya * ya;
      st += yt * yt;
      sv += yv * yv;
      sf += yf * yf;
      sw += yw * yw;
    }
  }
  return new Float64Array([sa, st, sv, sf, sw]);
}

/**
 * Simulate a corner over an evenly spaced road profile at constant speed.
 *
 * Method: exact discrete (ZOH) recurrence of the two-mass model, road elevation linear
 * between samples (docs/methods.md "The corner model"). Convenience wrapper of {@link prepareSimulation} +
 * {@link runSimulation}.
 *
 * @param c corner parameters [kg, N/m, N·s/m]
 * @param elevationsM road elevation samples [m]
 * @param dxM sample spacing [m]
 * @param speedMps speed [m/s]
 * @param opts `weighted` adds the `Wk` filter; `series` returns the output series; `warmupM` [m]
 * @returns running statistics (and series)
 * @example
 * simulateProfile(corner, new Float64Array(100), 0.05, 20).damperPowerW; // → 0 (flat road)
 */
export function simulateProfile(
  c: CornerParams,
  elevationsM: Float64Array,
  dxM: number,
  speedMps: number,
  opts: SimulationOptions & { weighted?: boolean } = {},
): SimulationResult {
  return runSimulation(prepareSimulation(c, dxM, speedMps, { weighted: opts.weighted }), elevationsM, opts);
}

export interface TravelSums {
  /** Mean squares over the counted steps. */
  msBodyAccel: number;
  msTravel: number;
  msRelVel: number;
  msTireLoad: number;
  /** Counted steps. */
  counted: number;
}

/**
 * Runs a prepared 4-state corner over `e` from rest, counting statistics from step
 * `firstCounted` on, and writes the travel after each counted step into `travelOut` (which
 * must hold `e.length − 1 − firstCounted` values).
 *
 * Method: the exact discrete recurrence `x[k+1] = Ad·x[k] + Bd·u[k]`, u = road velocity over
 * the step (docs/methods.md "The corner model"). `runSimulation` runs on it; the nightly job calls it
 * directly, hundreds of thousands of times a night, with a reused travel buffer for rainflow.
 *
 * @param p prepared simulation with n = 4
 * @param e elevations [m]
 * @param firstCounted first step index whose end state is counted
 * @param travelOut output buffer for travel [m], or null when only the statistics are wanted
 * @returns mean squares [SI units²]
 */
export function simulateTravel(p: PreparedSimulation, e: Float64Array, firstCounted: number, travelOut: Float64Array | null): TravelSums {
  if (p.n !== 4) throw new Error('simulateTravel: needs the 4-state model');
  const a = p.Ad;
  const b = p.Bd;
  const a00 = a[0], a01 = a[1], a02 = a[2], a03 = a[3];
  const a10 = a[4], a11 = a[5], a12 = a[6], a13 = a[7];
  const a20 = a[8], a21 = a[9], a22 = a[10], a23 = a[11];
  const a30 = a[12], a31 = a[13], a32 = a[14], a33 = a[15];
  const b0 = b[0], b1 = b[1], b2 = b[2], b3 = b[3];
  const ra = p.rows.bodyAccel;
  const c0 = ra[0], c1 = ra[1], c2 = ra[2], c3 = ra[3];
  const kt = -p.rows.tireLoad[2];
  const invDt = 1 / p.dtS;
  const steps = e.length - 1;
  let x0 = 0, x1 = 0, x2 = 0, x3 = 0;
  let sa = 0, st = 0, sv = 0, sf = 0;
  let j = 0;
  for (let k = 0; k < steps; k++) {
    const u = (e[k + 1] - e[k]) * invDt;
    const n0 = a00 * x0 + a01 * x1 + a02 * x2 + a03 * x3 + b0 * u;
    const n1 = a10 * x0 + a11 * x1 + a12 * x2 + a13 * x3 + b1 * u;
    const n2 = a20 * x0 + a21 * x1 + a22 * x2 + a23 * x3 + b2 * u;
    const n3 = a30 * x0 + a31 * x1 + a32 * x2 + a33 * x3 + b3 * u;
    x0 = n0; x1 = n1; x2 = n2; x3 = n3;
    if (k >= firstCounted) {
      const acc = c0 * x0 + c1 * x1 + c2 * x2 + c3 * x3;
      const rv = x1 - x3;
      sa += acc * acc;
      st += x0 * x0;
      sv += rv * rv;
      sf += x2 * x2;
      if (travelOut) travelOut[j] = x0;
      j++;
    }
  }
  if (!Number.isFinite(sa + st + sv + sf)) throw new Error('physics: non-finite state during simulation');
  const inv = j > 0 ? 1 / j : 0;
  return { msBodyAccel: sa * inv, msTravel: st * inv, msRelVel: sv * inv, msTireLoad: sf * kt * kt * inv, counted: j };
}

/** Mean squares of {@link simulateWeighted}, with the `Wk`-weighted body acceleration. */
export interface WeightedSums extends TravelSums {
  msWeightedAccel: number;
}

/**
 * As {@link simulateTravel} for the 12-state corner with the ISO 2631-1 `Wk` filter appended
 * (`prepareSimulation(…, { weighted: true })`), counting steps `firstCounted ≤ k < endCounted`,
 * so every output of a profiled segment, the weighted acceleration included, comes from the one
 * simulation (docs/methods.md "One road model for both methods"). The quarter car does not see
 * the filter's states (the augmented matrix is block lower-triangular), so its 4×4 block is
 * unrolled and only the filter rows run the full length.
 *
 * @param p prepared simulation with n = 12
 * @param e elevations [m]
 * @param firstCounted first step index whose end state is counted
 * @param endCounted step index after the last counted one
 * @param travelOut output buffer for travel [m] (at least endCounted − firstCounted values), or null
 * @returns mean squares [SI units²]
 */
export function simulateWeighted(p: PreparedSimulation, e: Float64Array, firstCounted: number, endCounted: number, travelOut: Float64Array | null): WeightedSums {
  const n = p.n;
  if (n !== 12 || !p.rows.weightedAccel) throw new Error('simulateWeighted: needs the 12-state weighted model');
  const a = p.Ad;
  const b = p.Bd;
  const a00 = a[0], a01 = a[1], a02 = a[2], a03 = a[3];
  const a10 = a[n], a11 = a[n + 1], a12 = a[n + 2], a13 = a[n + 3];
  const a20 = a[2 * n], a21 = a[2 * n + 1], a22 = a[2 * n + 2], a23 = a[2 * n + 3];
  const a30 = a[3 * n], a31 = a[3 * n + 1], a32 = a[3 * n + 2], a33 = a[3 * n + 3];
  const b0 = b[0], b1 = b[1], b2 = b[2], b3 = b[3];
  const ra = p.rows.bodyAccel;
  const c0 = ra[0], c1 = ra[1], c2 = ra[2], c3 = ra[3];
  const rw = p.rows.weightedAccel;
  // the filter rows' coefficients as locals: row i of the filter (state 4 + i) reads the four
  // quarter-car states, the input and the filter states of its own and the earlier sections
  const f00 = a[4 * n + 0], f01 = a[4 * n + 1], f02 = a[4 * n + 2], f03 = a[4 * n + 3], fb0 = b[4], fw00 = a[4 * n + 4], fw01 = a[4 * n + 5];
  const f10 = a[5 * n + 0], f11 = a[5 * n + 1], f12 = a[5 * n + 2], f13 = a[5 * n + 3], fb1 = b[5], fw10 = a[5 * n + 4], fw11 = a[5 * n + 5];
  const f20 = a[6 * n + 0], f21 = a[6 * n + 1], f22 = a[6 * n + 2], f23 = a[6 * n + 3], fb2 = b[6], fw20 = a[6 * n + 4], fw21 = a[6 * n + 5], fw22 = a[6 * n + 6], fw23 = a[6 * n + 7];
  const f30 = a[7 * n + 0], f31 = a[7 * n + 1], f32 = a[7 * n + 2], f33 = a[7 * n + 3], fb3 = b[7], fw30 = a[7 * n + 4], fw31 = a[7 * n + 5], fw32 = a[7 * n + 6], fw33 = a[7 * n + 7];
  const f40 = a[8 * n + 0], f41 = a[8 * n + 1], f42 = a[8 * n + 2], f43 = a[8 * n + 3], fb4 = b[8], fw40 = a[8 * n + 4], fw41 = a[8 * n + 5], fw42 = a[8 * n + 6], fw43 = a[8 * n + 7], fw44 = a[8 * n + 8], fw45 = a[8 * n + 9];
  const f50 = a[9 * n + 0], f51 = a[9 * n + 1], f52 = a[9 * n + 2], f53 = a[9 * n + 3], fb5 = b[9], fw50 = a[9 * n + 4], fw51 = a[9 * n + 5], fw52 = a[9 * n + 6], fw53 = a[9 * n + 7], fw54 = a[9 * n + 8], fw55 = a[9 * n + 9];
  const f60 = a[10 * n + 0], f61 = a[10 * n + 1], f62 = a[10 * n + 2], f63 = a[10 * n + 3], fb6 = b[10], fw60 = a[10 * n + 4], fw61 = a[10 * n + 5], fw62 = a[10 * n + 6], fw63 = a[10 * n + 7], fw64 = a[10 * n + 8], fw65 = a[10 * n + 9], fw66 = a[10 * n + 10], fw67 = a[10 * n + 11];
  const f70 = a[11 * n + 0], f71 = a[11 * n + 1], f72 = a[11 * n + 2], f73 = a[11 * n + 3], fb7 = b[11], fw70 = a[11 * n + 4], fw71 = a[11 * n + 5], fw72 = a[11 * n + 6], fw73 = a[11 * n + 7], fw74 = a[11 * n + 8], fw75 = a[11 * n + 9], fw76 = a[11 * n + 10], fw77 = a[11 * n + 11];
  const r0 = rw[0], r1 = rw[1], r2 = rw[2], r3 = rw[3], rw0 = rw[4], rw1 = rw[5], rw2 = rw[6], rw3 = rw[7], rw4 = rw[8], rw5 = rw[9], rw6 = rw[10], rw7 = rw[11];
  let w0 = 0, w1 = 0, w2 = 0, w3 = 0, w4 = 0, w5 = 0, w6 = 0, w7 = 0;
  const kt = -p.rows.tireLoad[2];
  const invDt = 1 / p.dtS;
  const steps = Math.min(e.length - 1, endCounted);
  let x0 = 0, x1 = 0, x2 = 0, x3 = 0;
  let sa = 0, st = 0, sv = 0, sf = 0, sw = 0;
  let j = 0;
  for (let k = 0; k < steps; k++) {
    const u = (e[k + 1] - e[k]) * invDt;
    // filter rows from the old state (sums in the order of the matrix row, so the result is the
    // matrix product's to the last bit)
    const v0 = f00 * x0 + f01 * x1 + f02 * x2 + f03 * x3 + fb0 * u + fw00 * w0 + fw01 * w1;
    const v1 = f10 * x0 + f11 * x1 + f12 * x2 + f13 * x3 + fb1 * u + fw10 * w0 + fw11 * w1;
    const v2 = f20 * x0 + f21 * x1 + f22 * x2 + f23 * x3 + fb2 * u + fw20 * w0 + fw21 * w1 + fw22 * w2 + fw23 * w3;
    const v3 = f30 * x0 + f31 * x1 + f32 * x2 + f33 * x3 + fb3 * u + fw30 * w0 + fw31 * w1 + fw32 * w2 + fw33 * w3;
    const v4 = f40 * x0 + f41 * x1 + f42 * x2 + f43 * x3 + fb4 * u + fw40 * w0 + fw41 * w1 + fw42 * w2 + fw43 * w3 + fw44 * w4 + fw45 * w5;
    const v5 = f50 * x0 + f51 * x1 + f52 * x2 + f53 * x3 + fb5 * u + fw50 * w0 + fw51 * w1 + fw52 * w2 + fw53 * w3 + fw54 * w4 + fw55 * w5;
    const v6 = f60 * x0 + f61 * x1 + f62 * x2 + f63 * x3 + fb6 * u + fw60 * w0 + fw61 * w1 + fw62 * w2 + fw63 * w3 + fw64 * w4 + fw65 * w5 + fw66 * w6 + fw67 * w7;
    const v7 = f70 * x0 + f71 * x1 + f72 * x2 + f73 * x3 + fb7 * u + fw70 * w0 + fw71 * w1 + fw72 * w2 + fw73 * w3 + fw74 * w4 + fw75 * w5 + fw76 * w6 + fw77 * w7;
    w0 = v0; w1 = v1; w2 = v2; w3 = v3; w4 = v4; w5 = v5; w6 = v6; w7 = v7;
    const n0 = a00 * x0 + a01 * x1 + a02 * x2 + a03 * x3 + b0 * u;
    const n1 = a10 * x0 + a11 * x1 + a12 * x2 + a13 * x3 + b1 * u;
    const n2 = a20 * x0 + a21 * x1 + a22 * x2 + a23 * x3 + b2 * u;
    const n3 = a30 * x0 + a31 * x1 + a32 * x2 + a33 * x3 + b3 * u;
    x0 = n0; x1 = n1; x2 = n2; x3 = n3;
    if (k >= firstCounted) {
      const acc = c0 * x0 + c1 * x1 + c2 * x2 + c3 * x3;
      const yw = r0 * x0 + r1 * x1 + r2 * x2 + r3 * x3 + rw0 * w0 + rw1 * w1 + rw2 * w2 + rw3 * w3 + rw4 * w4 + rw5 * w5 + rw6 * w6 + rw7 * w7;
      const rv = x1 - x3;
      sa += acc * acc;
      st += x0 * x0;
      sv += rv * rv;
      sf += x2 * x2;
      sw += yw * yw;
      if (travelOut) travelOut[j] = x0;
      j++;
    }
  }
  if (!Number.isFinite(sa + st + sv + sf + sw)) throw new Error('physics: non-finite state during simulation');
  const inv = j > 0 ? 1 / j : 0;
  return { msBodyAccel: sa * inv, msTravel: st * inv, msRelVel: sv * inv, msTireLoad: sf * kt * kt * inv, msWeightedAccel: sw * inv, counted: j };
}
