/**
 * Present damping from a test-lane result that may carry an adhesion %, a minimum phase angle,
 * or both: each is inverted on the two-mass model, and where both are given the estimate takes
 * the better-conditioned one — the one whose stated repeatability moves the damping least — and
 * says which (docs/methods.md "Phase-shift method").
 *
 * @module
 */
import { adhesionPct, dampingFromAdhesion, NoDampingSolutionError } from './adhesion';
import { dampingFromPhase, phaseShift, NoDampingForPhaseError } from './phase-shift';
import type { CornerParams } from './types';

/**
 * Repeatability assumed for a lane reading (ours, stated, not published): ±3 points of adhesion,
 * ±3° of minimum phase. Only their ratio matters for the choice; the spread shown with an
 * estimate uses them as they are.
 */
export const LANE_REPEATABILITY = Object.freeze({ adhesionPoints: 3, phaseDeg: 3 });

export type LaneMethod = 'adhesion' | 'phase';

/** One method's inversion. */
export interface LaneInversion {
  method: LaneMethod;
  /** Damping that explains the reading [N·s/m], null when none does. */
  dampingNsPerM: number | null;
  /** Relative spread of that damping from the stated repeatability [1] (Infinity when the reading barely moves with damping). */
  relSpread: number | null;
  /** Why there is no estimate, when there is none. */
  note: string | null;
}

/** The estimate of a corner from its lane readings. */
export interface LaneEstimate {
  /** The chosen damping [N·s/m], null when no reading gives one. */
  dampingNsPerM: number | null;
  /** The method it comes from. */
  method: LaneMethod | null;
  /** What was done, in words (which method, and why). */
  note: string | null;
  /** Each reading's own inversion. */
  inversions: LaneInversion[];
}

const reason = (e: unknown): string => (e instanceof Error ? e.message.replace(/^physics: /, '') : String(e));

/** Relative damping spread of a reading `value(cs)` with repeatability `rep` at cs: rep / |d value / d ln cs|. */
function spread(value: (cs: number) => number, cs: number, rep: number): number {
  const h = 0.02;
  const d = (value(cs * Math.exp(h)) - value(cs * Math.exp(-h))) / (2 * h);
  return Math.abs(d) > 1e-9 ? rep / Math.abs(d) : Infinity;
}

/**
 * Estimate a corner's present damping from its lane readings.
 *
 * @param c corner with its nominal damping [N·s/m]
 * @param readings adhesion [%] and/or minimum phase [°] (null = not measured), and the plate amplitude [m]
 * @returns the chosen damping, its method and note, and each method's inversion
 * @example
 * estimateFromLane(corner, { adhesionPct: 52, phaseDeg: 47, amplitudeM: 0.003 }); // → { method: 'phase', dampingNsPerM: …, note: 'from the phase shift: …' }
 */
export function estimateFromLane(c: CornerParams, readings: { adhesionPct: number | null; phaseDeg: number | null; amplitudeM: number }): LaneEstimate {
  const inversions: LaneInversion[] = [];
  if (readings.adhesionPct !== null) {
    try {
      const cs = dampingFromAdhesion(c, readings.adhesionPct, { amplitudeM: readings.amplitudeM }).dampingNsPerM;
      const rel = spread((x) => adhesionPct({ ...c, dampingNsPerM: x }, { amplitudeM: readings.amplitudeM }).adhesionPct, cs, LANE_REPEATABILITY.adhesionPoints);
      inversions.push({ method: 'adhesion', dampingNsPerM: cs, relSpread: rel, note: null });
    } catch (e) {
      inversions.push({ method: 'adhesion', dampingNsPerM: null, relSpread: null, note: e instanceof NoDampingSolutionError ? reason(e) : `no estimate: ${reason(e)}` });
    }
  }
  if (readings.phaseDeg !== null) {
    try {
      const cs = dampingFromPhase(c, readings.phaseDeg).dampingNsPerM;
      const rel = spread((x) => phaseShift({ ...c, dampingNsPerM: x }).minPhaseDeg, cs, LANE_REPEATABILITY.phaseDeg);
      inversions.push({ method: 'phase', dampingNsPerM: cs, relSpread: rel, note: null });
    } catch (e) {
      inversions.push({ method: 'phase', dampingNsPerM: null, relSpread: null, note: e instanceof NoDampingForPhaseError ? reason(e) : `no estimate: ${reason(e)}` });
    }
  }
  const usable = inversions.filter((i) => i.dampingNsPerM !== null);
  if (!usable.length) {
    const note = inversions.map((i) => `${i.method === 'phase' ? 'phase shift' : 'adhesion'}: ${i.note}`).join('; ');
    return { dampingNsPerM: null, method: null, note: note || null, inversions };
  }
  usable.sort((a, b) => (a.relSpread ?? Infinity) - (b.relSpread ?? Infinity));
  const best = usable[0];
  const pct = (r: number | null) => (r === null || !Number.isFinite(r) ? 'unbounded' : `±${Math.round(r * 100)} %`);
  const name = (m: LaneMethod) => (m === 'phase' ? 'the phase shift' : 'adhesion');
  let note = `from ${name(best.method)} (${pct(best.relSpread)} for ${best.method === 'phase' ? `±${LANE_REPEATABILITY.phaseDeg}°` : `±${LANE_REPEATABILITY.adhesionPoints} points`})`;
  const other = inversions.find((i) => i !== best);
  if (other) {
    note += other.dampingNsPerM !== null
      ? `; ${name(other.method)} gives ${Math.round(other.dampingNsPerM)} N·s/m (${pct(other.relSpread)}), less well conditioned`
      : `; ${name(other.method)}: ${other.note}`;
  }
  return { dampingNsPerM: best.dampingNsPerM, method: best.method, note, inversions };
}
