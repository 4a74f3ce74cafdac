/**
 * Test-lane damper check by the phase-shift method: the phase angle between plate displacement
 * and tyre contact force over the sweep, its minimum between body and wheel-hop resonance, the
 * commonly cited pass/fail line, and the inverse (present damping from a measured minimum).
 *
 * Method (docs/methods.md "Test-lane checks"; Tsymberov, SAE 960735, 1996): the plate moves `a·sin(2πft)`; the
 * dynamic contact force is `kt·(zr − zu)`, from the two-mass model's transfer function
 * ({@link cornerTransfer}); φ(f) = |arg(force / plate displacement)| in degrees, 180° at low
 * frequency (the masses' inertia pushes back in antiphase) falling to 0° above wheel hop. With no
 * damping the transfer is real and φ jumps between 0° and 180°; damping lifts the dip between the
 * two resonances, so its minimum φmin measures damping and depends on tyre stiffness far less than
 * adhesion does. The model is linear, so φ does not depend on the plate amplitude (as long as the
 * wheel stays on the plate). See docs/methods.md "Phase-shift method".
 *
 * @module
 */
import { goldenSectionMin } from './golden-section';
import { cornerTransfer, modes } from './quarter-car';
import { requireInRange, validateCorner, type CornerParams } from './types';

/** Commonly cited fail line of the phase-shift method: φmin below 35° (common practice, docs/methods.md "Test-lane checks"). */
export const PHASE_FAIL_BELOW_DEG = 35;

/** Result of a predicted phase-shift run. */
export interface PhaseShiftResult {
  /** Minimum phase angle between plate displacement and contact force between the resonances [°]. */
  minPhaseDeg: number;
  /** Frequency of that minimum [Hz]. */
  atHz: number;
}

/** φ(f) [°] of a corner (not validated). */
export function phaseDeg(c: CornerParams, fHz: number): number {
  const [re, im] = cornerTransfer(c, fHz).tireLoad;
  return (Math.abs(Math.atan2(im, re)) * 180) / Math.PI;
}

/**
 * Predicted minimum phase angle of a corner on a phase-shift test lane.
 *
 * Method: φ(f) on a grid of 600 log-spaced frequencies from the body-bounce to the wheel-hop
 * natural frequency ({@link modes}); the lowest interior local minimum (the dip between the
 * resonances), refined by golden-section search. A damper so stiff that the dip has closed
 * (φ falls monotonically through the band, beyond about 1.5–2× a usual damping) is read at the
 * flattest point of the curve; that figure no longer measures damping.
 *
 * @param c corner parameters [kg, N/m, N·s/m]
 * @returns minimum phase [°] and its frequency [Hz]
 * @example
 * phaseShift({ sprungMassKg: 400, unsprungMassKg: 45, springRateNPerM: 22000, dampingNsPerM: 1800,
 *   tireRateNPerM: 200000 }); // → { minPhaseDeg ≈ 72.8, atHz ≈ 2.0 }
 */
export function phaseShift(c: CornerParams): PhaseShiftResult {
  validateCorner(c);
  const m = modes(c);
  const lo = Math.max(0.05, m.bodyHz);
  const hi = Math.max(lo * 1.5, m.wheelHz);
  const n = 600;
  const r = Math.pow(hi / lo, 1 / (n - 1));
  const f = new Float64Array(n);
  const p = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    f[i] = lo * Math.pow(r, i);
    p[i] = phaseDeg(c, f[i]);
  }
  let best = -1;
  for (let i = 1; i < n - 1; i++) {
    if (p[i] <= p[i - 1] && p[i] <= p[i + 1] && (best < 0 || p[i] < p[best])) best = i;
  }
  if (best < 0) {
    // dip closed: the flattest point (least |dφ/d ln f|)
    let flat = 1;
    for (let i = 1; i < n - 1; i++) {
      if (Math.abs(p[i + 1] - p[i - 1]) < Math.abs(p[flat + 1] - p[flat - 1])) flat = i;
    }
    return { minPhaseDeg: p[flat], atHz: f[flat] };
  }
  // golden-section refinement within the neighbouring grid points
  const [a, b] = goldenSectionMin((x) => phaseDeg(c, x), f[best - 1], f[best + 1]);
  const fm = (a + b) / 2;
  const pm = phaseDeg(c, fm);
  return pm < p[best] ? { minPhaseDeg: pm, atHz: fm } : { minPhaseDeg: p[best], atHz: f[best] };
}

/** No damping value explains a measured minimum phase. */
export class NoDampingForPhaseError extends Error {
  /** Measured minimum phase [°]. */
  readonly measuredDeg: number;
  /** Highest minimum phase the model reaches for this corner [°]. */
  readonly maxDeg: number;

  /**
   * @param measuredDeg measured φmin [°]
   * @param maxDeg highest φmin the model reaches [°]
   * @param detail explanation
   */
  constructor(measuredDeg: number, maxDeg: number, detail: string) {
    super(`physics: no damping value explains a minimum phase of ${measuredDeg}°: ${detail}`);
    this.name = 'NoDampingForPhaseError';
    this.measuredDeg = measuredDeg;
    this.maxDeg = maxDeg;
  }
}

/**
 * Present damping of a corner from a measured minimum phase angle.
 *
 * Method: φmin rises with damping from 0° (undamped) to a first maximum, on the demo specs at
 * 1.1–1.6× nominal (beyond it the dip between the resonances closes and φmin stops measuring
 * damping); the root on that rising side is found by bisection on log damping after a 48-point
 * grid over 1 %–5× nominal (and a golden-section refinement) finds the first maximum. Computed,
 * see docs/methods.md "Phase-shift method".
 *
 * @param c corner parameters; `dampingNsPerM` is the nominal (new) damping [N·s/m]
 * @param measuredDeg measured minimum phase [°], 0–180
 * @returns the damping that explains it [N·s/m]
 * @throws NoDampingForPhaseError when the value is 0° or above what any damping gives
 * @example
 * dampingFromPhase(corner, phaseShift({ ...corner, dampingNsPerM: 900 }).minPhaseDeg); // → { dampingNsPerM ≈ 900 }
 */
export function dampingFromPhase(c: CornerParams, measuredDeg: number): { dampingNsPerM: number } {
  validateCorner(c);
  requireInRange('measuredDeg', measuredDeg, '°', 0, 180, false);
  const nominal = c.dampingNsPerM;
  const at = (cs: number): number => phaseShift({ ...c, dampingNsPerM: cs }).minPhaseDeg;
  const GRID = 48;
  const logMin = Math.log(Math.max(1, 0.01 * nominal));
  const logMax = Math.log(5 * nominal);
  // the rising side ends at the first maximum met going up in damping: beyond it the dip
  // flattens and closes and φmin no longer measures damping
  let bestI = 0;
  let bestV = at(Math.exp(logMin));
  for (let i = 1; i <= GRID; i++) {
    const v = at(Math.exp(logMin + ((logMax - logMin) * i) / GRID));
    if (v < bestV) break;
    bestV = v;
    bestI = i;
  }
  let top = logMin + ((logMax - logMin) * bestI) / GRID;
  if (bestI > 0 && bestI < GRID) {
    // refine the maximum by golden-section search between the neighbouring grid points
    let a = logMin + ((logMax - logMin) * (bestI - 1)) / GRID;
    let b = logMin + ((logMax - logMin) * (bestI + 1)) / GRID;
    const g = (Math.sqrt(5) - 1) / 2;
    for (let i = 0; i < 40; i++) {
      const x1 = b - g * (b - a);
      const x2 = a + g * (b - a);
      if (at(Math.exp(x1)) >= at(Math.exp(x2))) b = x2;
      else a = x1;
    }
    const v = at(Math.exp((a + b) / 2));
    if (v > bestV) {
      bestV = v;
      top = (a + b) / 2;
    }
  }
  if (measuredDeg > bestV) {
    throw new NoDampingForPhaseError(
      measuredDeg,
      bestV,
      `the model's highest minimum phase for this corner is ${bestV.toFixed(1)}° (at ${Math.exp(top).toFixed(0)} N·s/m); check the corner's parameters and the measurement`,
    );
  }
  if (measuredDeg <= 0) throw new NoDampingForPhaseError(measuredDeg, bestV, 'only an undamped corner reads 0°');
  let l = logMin;
  let h = top;
  if (at(Math.exp(l)) >= measuredDeg) {
    throw new NoDampingForPhaseError(measuredDeg, bestV, `below the model's ${at(Math.exp(l)).toFixed(1)}° at the lowest damping searched (${Math.exp(l).toFixed(0)} N·s/m)`);
  }
  for (let i = 0; i < 200 && h - l > 1e-10; i++) {
    const mid = (l + h) / 2;
    if (at(Math.exp(mid)) < measuredDeg) l = mid;
    else h = mid;
  }
  return { dampingNsPerM: Math.exp((l + h) / 2) };
}
