/**
 * Allocation-free hot loops for the nightly run's profiled segments: the 4-state exact ZOH
 * recurrence of server/physics/simulate.ts (same matrices, same statistics) writing suspension
 * travel into a reused buffer, and rainflow damage summed on the fly. They exist because the
 * nightly job runs them hundreds of thousands of times; tests check them against the physics
 * engine's `runSimulation` and `rainflow` + `minerDamage`.
 *
 * @module
 */
import type { PreparedSimulation } from '../physics/simulate';

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
 * the step (docs/methods.md "The corner model"), as `runSimulation`.
 *
 * @param p prepared simulation with n = 4
 * @param e elevations [m]
 * @param firstCounted first step index whose end state is counted
 * @param travelOut output buffer for travel [m]
 * @returns mean squares [SI units²]
 */
export function simulateTravel(p: PreparedSimulation, e: Float64Array, firstCounted: number, travelOut: Float64Array): TravelSums {
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
      travelOut[j++] = x0;
    }
  }
  if (!Number.isFinite(sa + st + sv + sf)) throw new Error('physics: non-finite state during simulation');
  const inv = j > 0 ? 1 / j : 0;
  return { msBodyAccel: sa * inv, msTravel: st * inv, msRelVel: sv * inv, msTireLoad: sf * kt * kt * inv, counted: j };
}

let stack = new Float64Array(1024);

/**
 * Miner damage `Σ n·Sᵏ / C` of the rainflow cycles of `x[0..len)`, counted as ASTM E1049-85
 * §5.4.4 (three-point method with half cycles, as server/physics/fatigue.ts `rainflow`), without
 * building the cycle list.
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
 * @param travelOut output buffer for travel [m] (at least endCounted − firstCounted values)
 * @returns mean squares [SI units²]
 */
export function simulateWeighted(p: PreparedSimulation, e: Float64Array, firstCounted: number, endCounted: number, travelOut: Float64Array): WeightedSums {
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
  const kt = -p.rows.tireLoad[2];
  const invDt = 1 / p.dtS;
  const steps = Math.min(e.length - 1, endCounted);
  let x0 = 0, x1 = 0, x2 = 0, x3 = 0;
  const w = new Float64Array(8);
  const nw = new Float64Array(8);
  let sa = 0, st = 0, sv = 0, sf = 0, sw = 0;
  let j = 0;
  for (let k = 0; k < steps; k++) {
    const u = (e[k + 1] - e[k]) * invDt;
    // filter rows (4…11) from the old state; the Wk sections are in series, so filter row i
    // reads only the states of its own and the earlier sections (lower block-triangular)
    for (let i = 0; i < 8; i++) {
      const off = (i + 4) * n;
      let s = a[off] * x0 + a[off + 1] * x1 + a[off + 2] * x2 + a[off + 3] * x3 + b[i + 4] * u;
      const lim = ((i >> 1) + 1) * 2;
      for (let m = 0; m < lim; m++) s += a[off + 4 + m] * w[m];
      nw[i] = s;
    }
    const n0 = a00 * x0 + a01 * x1 + a02 * x2 + a03 * x3 + b0 * u;
    const n1 = a10 * x0 + a11 * x1 + a12 * x2 + a13 * x3 + b1 * u;
    const n2 = a20 * x0 + a21 * x1 + a22 * x2 + a23 * x3 + b2 * u;
    const n3 = a30 * x0 + a31 * x1 + a32 * x2 + a33 * x3 + b3 * u;
    x0 = n0; x1 = n1; x2 = n2; x3 = n3;
    w.set(nw);
    if (k >= firstCounted) {
      const acc = c0 * x0 + c1 * x1 + c2 * x2 + c3 * x3;
      let yw = rw[0] * x0 + rw[1] * x1 + rw[2] * x2 + rw[3] * x3;
      for (let m = 0; m < 8; m++) yw += rw[4 + m] * w[m];
      const rv = x1 - x3;
      sa += acc * acc;
      st += x0 * x0;
      sv += rv * rv;
      sf += x2 * x2;
      sw += yw * yw;
      travelOut[j++] = x0;
    }
  }
  if (!Number.isFinite(sa + st + sv + sf + sw)) throw new Error('physics: non-finite state during simulation');
  const inv = j > 0 ? 1 / j : 0;
  return { msBodyAccel: sa * inv, msTravel: st * inv, msRelVel: sv * inv, msTireLoad: sf * kt * kt * inv, msWeightedAccel: sw * inv, counted: j };
}
