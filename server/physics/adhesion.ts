/**
 * Test-lane damper check (EUSAMA-style): predicted adhesion % of a corner on a sinusoidally
 * driven plate, and the inverse — the present damping that explains a measured adhesion %.
 *
 * Assumptions (ours, stated): the wheel stands on a plate moving `a·sin(2πft)` swept from
 * 25 Hz down to 3 Hz slowly enough to be steady state at each frequency; the two-mass model is
 * linear, so the contact force is `W − a·|F(f)|` at its minimum, with `F(f)` the dynamic tyre
 * load per metre of plate motion and `W = (ms + mu)·g` the static wheel load. Adhesion % =
 * min over the sweep of that force / W × 100 (docs/methods.md "Test-lane checks"). When the linear force would go
 * below zero the wheel leaves the plate: we clip at 0 % (the linear model says nothing more).
 *
 * @module
 */
import { goldenSectionMin } from './golden-section';
import { cornerTransfer } from './quarter-car';
import { STANDARD_GRAVITY, requireInRange, validateCorner, type CornerParams } from './types';

/**
 * Default plate amplitude (zero-to-peak) [m]: 3 mm. The EUSAMA method speaks of a 6 mm plate
 * stroke; a stroke is the total peak-to-peak travel, so the amplitude is half of it (our
 * reading, from memory; docs/methods.md "Test-lane checks"). At this amplitude new dampers on light vans read
 * 60–80 %, as new dampers commonly do (common practice); read as a 6 mm amplitude they would
 * read weak or fair. A lane whose rig moves differently sets its own amplitude
 * (docs/methods.md "Test-lane plate amplitude").
 */
export const DEFAULT_PLATE_AMPLITUDE_M = 0.003;

/** Sweep bounds [Hz] (docs/methods.md "Test-lane checks": from about 25 Hz down to a few Hz; common practice). */
export const SWEEP_HZ = Object.freeze({ from: 25, to: 3 });

/** Result of a predicted test-lane run. */
export interface AdhesionResult {
  /** Adhesion = minimum contact force / static load × 100 [%], clipped to 0–100. */
  adhesionPct: number;
  /** Frequency of the minimum contact force [Hz]. */
  atHz: number;
}

/** Options of {@link adhesionPct}. */
export interface AdhesionOptions {
  /** Plate amplitude (zero-to-peak) [m]; default {@link DEFAULT_PLATE_AMPLITUDE_M}. */
  amplitudeM?: number;
}

const tyreGain = (c: CornerParams, f: number): number => Math.hypot(...cornerTransfer(c, f).tireLoad);

/**
 * Predicted EUSAMA-style adhesion % of a corner.
 *
 * Method: |dynamic tyre load / plate displacement| from the two-mass model's transfer function
 * ({@link cornerTransfer}) scanned over 3–25 Hz on a 0.01 Hz grid, then the largest value refined
 * by golden-section search; minimum contact force = W − a·max|F|, clipped at 0 (see module note).
 * Source of the test: EUSAMA test-lane method (docs/methods.md "Test-lane checks").
 *
 * @param c corner parameters [kg, N/m, N·s/m]
 * @param opts plate amplitude [m], 0.1–20 mm
 * @returns adhesion [%] and the frequency of the minimum [Hz]
 * @example
 * adhesionPct({ sprungMassKg: 400, unsprungMassKg: 45, springRateNPerM: 22000, dampingNsPerM: 1800,
 *   tireRateNPerM: 200000 }); // → { adhesionPct ≈ 46.8, atHz ≈ 11.9 }
 */
export function adhesionPct(c: CornerParams, opts: AdhesionOptions = {}): AdhesionResult {
  validateCorner(c);
  const a = requireInRange('amplitudeM', opts.amplitudeM ?? DEFAULT_PLATE_AMPLITUDE_M, 'm', 0.0001, 0.02, false);
  const w = (c.sprungMassKg + c.unsprungMassKg) * STANDARD_GRAVITY;
  const step = 0.01;
  let best = -1;
  let bestF: number = SWEEP_HZ.to;
  for (let f = SWEEP_HZ.to; f <= SWEEP_HZ.from + 1e-9; f += step) {
    const g = tyreGain(c, f);
    if (g > best) {
      best = g;
      bestF = f;
    }
  }
  // golden-section refinement of the maximum within ±1 grid step (kept inside the sweep)
  const [lo, hi] = goldenSectionMin((f) => -tyreGain(c, f), Math.max(SWEEP_HZ.to, bestF - step), Math.min(SWEEP_HZ.from, bestF + step));
  const fMid = (lo + hi) / 2;
  const gMid = tyreGain(c, fMid);
  if (gMid > best) {
    best = gMid;
    bestF = fMid;
  }
  const minForce = w - a * best;
  return { adhesionPct: Math.min(100, Math.max(0, (minForce / w) * 100)), atHz: bestF };
}

/**
 * Error thrown when no damping value on the worn side explains a measured adhesion %.
 * Carries the measured value and the range the model can explain.
 *
 * @example
 * err.message; // → 'physics: no damping value explains 85 % adhesion: …'
 */
export class NoDampingSolutionError extends Error {
  /** Measured adhesion [%]. */
  readonly measuredPct: number;
  /** Highest adhesion the model reaches on the searched side [%]. */
  readonly maxPct: number;
  /** Damping at which that highest value occurs [N·s/m]. */
  readonly atDampingNsPerM: number;

  /**
   * @param measuredPct measured adhesion [%]
   * @param maxPct highest explainable adhesion [%]
   * @param atDampingNsPerM damping of that highest value [N·s/m]
   * @param detail explanation
   */
  constructor(measuredPct: number, maxPct: number, atDampingNsPerM: number, detail: string) {
    super(`physics: no damping value explains ${measuredPct} % adhesion: ${detail}`);
    this.name = 'NoDampingSolutionError';
    this.measuredPct = measuredPct;
    this.maxPct = maxPct;
    this.atDampingNsPerM = atDampingNsPerM;
  }
}

/** Options of {@link dampingFromAdhesion}. */
export interface DampingFromAdhesionOptions extends AdhesionOptions {
  /** Lowest damping searched [N·s/m]; default max(1, 1 % of nominal). */
  minDampingNsPerM?: number;
}

/**
 * Estimate a damper's present damping from a measured test-lane adhesion %.
 *
 * Adhesion is not monotonic in damping over all values: it rises from 0 % (undamped wheel hop)
 * to a peak and then falls again when the damper is so stiff it couples the body into wheel
 * hop. A worn damper loses damping, so we search the rising side only: from the minimum
 * damping up to the damping of peak adhesion (found by golden-section search on log damping),
 * where adhesion rises monotonically. A reading above what the nominal damping predicts is
 * explained by a damping above nominal — a damper at least as good as new (a new damper within
 * its maker's tolerance, or a corner a little heavier than the spec) — not refused. The root is
 * found by bisection on log damping (bracket first, then halve to 1e-10 relative).
 *
 * @param c corner parameters; `dampingNsPerM` is the nominal (new) damping [N·s/m]
 * @param measuredPct measured adhesion [%], 0–100
 * @param opts plate amplitude [m], minimum damping [N·s/m]
 * @returns the damping that explains the measurement [N·s/m]
 * @throws NoDampingSolutionError when the measurement is above the model's peak adhesion,
 *   or 0 % (explained by every damping below a threshold)
 * @example
 * dampingFromAdhesion(corner, adhesionPct({ ...corner, dampingNsPerM: 900 }).adhesionPct); // → { dampingNsPerM ≈ 900 }
 */
export function dampingFromAdhesion(
  c: CornerParams,
  measuredPct: number,
  opts: DampingFromAdhesionOptions = {},
): { dampingNsPerM: number } {
  validateCorner(c);
  requireInRange('measuredPct', measuredPct, '%', 0, 100, false);
  const nominal = c.dampingNsPerM;
  const csMin = requireInRange('minDampingNsPerM', opts.minDampingNsPerM ?? Math.max(1, 0.01 * nominal), 'N·s/m', 1, nominal, false);
  const at = (cs: number): number => adhesionPct({ ...c, dampingNsPerM: cs }, opts).adhesionPct;

  // Peak of adhesion over [csMin, 5·nominal] (log scale). Adhesion is flat at 0 % below the
  // damping at which the wheel leaves the plate, so a golden-section search started over the whole
  // range can settle on that flat part: bracket the peak on a coarse grid first, then refine.
  const GRID = 48;
  const logMin = Math.log(csMin);
  const logMax = Math.log(5 * nominal);
  let best = 0;
  let bestA = -Infinity;
  for (let i = 0; i <= GRID; i++) {
    const a = at(Math.exp(logMin + ((logMax - logMin) * i) / GRID));
    if (a > bestA) {
      bestA = a;
      best = i;
    }
  }
  let lo = logMin + ((logMax - logMin) * Math.max(0, best - 1)) / GRID;
  let hi = logMin + ((logMax - logMin) * Math.min(GRID, best + 1)) / GRID;
  const r = (Math.sqrt(5) - 1) / 2;
  let x1 = hi - r * (hi - lo);
  let x2 = lo + r * (hi - lo);
  let a1 = at(Math.exp(x1));
  let a2 = at(Math.exp(x2));
  for (let i = 0; i < 50 && hi - lo > 1e-6; i++) {
    if (a1 >= a2) {
      hi = x2;
      x2 = x1;
      a2 = a1;
      x1 = hi - r * (hi - lo);
      a1 = at(Math.exp(x1));
    } else {
      lo = x1;
      x1 = x2;
      a1 = a2;
      x2 = lo + r * (hi - lo);
      a2 = at(Math.exp(x2));
    }
  }
  const upper = Math.exp((lo + hi) / 2);
  const aUpper = at(upper);
  if (measuredPct > aUpper) {
    throw new NoDampingSolutionError(
      measuredPct,
      aUpper,
      upper,
      `the model's highest adhesion for this corner is ${aUpper.toFixed(1)} % (at ${upper.toFixed(0)} N·s/m, ${(upper / nominal).toFixed(1)}× nominal); check the corner's parameters, the plate amplitude and the measurement`,
    );
  }
  const aMin = at(csMin);
  if (measuredPct <= aMin) {
    if (aMin === 0) {
      // 0 % measured where the lowest damping searched also gives 0 %: find the threshold below
      // which adhesion is 0 % for the message (when the lowest damping searched gives more than
      // 0 %, every damping searched is above that threshold and the message below says so)
      let l = Math.log(csMin);
      let h = Math.log(upper);
      for (let i = 0; i < 60; i++) {
        const m = (l + h) / 2;
        if (at(Math.exp(m)) > 0) h = m;
        else l = m;
      }
      throw new NoDampingSolutionError(
        measuredPct,
        aUpper,
        upper,
        `every damping up to ${Math.exp(h).toFixed(0)} N·s/m predicts 0 % (wheel leaves the plate); the damper is at most that`,
      );
    }
    throw new NoDampingSolutionError(measuredPct, aUpper, upper, `below the model's ${aMin.toFixed(1)} % at the minimum damping searched (${csMin} N·s/m)`);
  }
  // bisection on log damping: at(l) < measured ≤ at(h)
  let l = Math.log(csMin);
  let h = Math.log(upper);
  for (let i = 0; i < 200 && h - l > 1e-10; i++) {
    const m = (l + h) / 2;
    if (at(Math.exp(m)) < measuredPct) l = m;
    else h = m;
  }
  return { dampingNsPerM: Math.exp((l + h) / 2) };
}

/**
 * Commonly cited EUSAMA adhesion bands (common practice, docs/methods.md "Test-lane checks"): ≥ 60 good, 40–59 fair,
 * 20–39 weak, < 20 poor.
 *
 * @param pct adhesion [%]
 * @returns band name
 * @example
 * adhesionBand(45); // → 'fair'
 */
export function adhesionBand(pct: number): 'good' | 'fair' | 'weak' | 'poor' {
  requireInRange('pct', pct, '%', 0, 100, false);
  if (pct >= 60) return 'good';
  if (pct >= 40) return 'fair';
  if (pct >= 20) return 'weak';
  return 'poor';
}

