/**
 * Speed advice per road segment and suspension spec (issue 7): the highest speed at which the
 * ISO 2631-1 Wk-weighted body acceleration over the front axle stays within a chosen comfort
 * band (ISO 2631-1:1997 Annex C) and every axle's mean damper power stays within a chosen limit.
 *
 * Method: closed form (server/physics/closed-form.ts). On an ISO 8608 `w = 2` road the road
 * velocity is white with PSD ∝ Gd(n0)·v, and the system matrix does not depend on speed, so every
 * variance is exactly proportional to Gd(n0)·v (physics.md §2). With one Lyapunov solve per axle
 * at a reference speed, `a_w(v) = a_w(v_ref)·√(v/v_ref)` and `P(v) = P(v_ref)·v/v_ref`, so the
 * bisection for the crossing speed has a closed-form answer: `v = v_ref·(a_lim/a_w,ref)²`,
 * `v = v_ref·P_lim/P_ref`. The speed-grid chart uses the same scaling.
 */
import { dutyOnRoad, prepareDuty, type PreparedDuty } from '../physics/closed-form';
import type { CornerParams } from '../physics/types';

/** ISO 2631-1:1997 Annex C comfort reactions; the limit is the upper end of each band [m/s²]. */
export const COMFORT_BANDS = [
  { key: 'not-uncomfortable', label: 'Not uncomfortable', range: 'below 0.315 m/s²', limit: 0.315 },
  { key: 'a-little', label: 'A little uncomfortable', range: '0.315–0.63 m/s²', limit: 0.63 },
  { key: 'fairly', label: 'Fairly uncomfortable', range: '0.5–1 m/s²', limit: 1.0 },
  { key: 'uncomfortable', label: 'Uncomfortable', range: '0.8–1.6 m/s²', limit: 1.6 },
] as const;
export type ComfortKey = (typeof COMFORT_BANDS)[number]['key'];
export const COMFORT_KEYS = COMFORT_BANDS.map((b) => b.key) as [ComfortKey, ...ComfortKey[]];
export const DEFAULT_COMFORT: ComfortKey = 'fairly';
/** Default limit of mean power per damper [W] (our planning default; a damper sheds a few hundred W at most in steady running, common practice). */
export const DEFAULT_POWER_LIMIT_W = 150;
/** Advice is given between these speeds [km/h]. */
export const MIN_ADVICE_KMH = 10;
export const MAX_ADVICE_KMH = 130;
const V_REF = 10; // m/s

export const SPEED_CAUTION =
  'Planning advice from a model of the suspension and the recorded roughness. Posted limits, the road and weather conditions, the load and the driver’s judgement always come first.';

export interface AxleCorner {
  axleIndex: number;
  label: string;
  corner: CornerParams;
}

export interface PreparedSpec {
  axles: { axleIndex: number; label: string; prep: PreparedDuty }[];
}

/** One Lyapunov solve per axle at the reference speed. */
export function prepareSpec(axles: readonly AxleCorner[]): PreparedSpec {
  return { axles: axles.map((a) => ({ axleIndex: a.axleIndex, label: a.label, prep: prepareDuty(a.corner, V_REF) })) };
}

/** Front-axle weighted acceleration [m/s²] and the largest damper power of any axle [W] at a speed. */
export function dutyAtSpeed(p: PreparedSpec, gdN0: number, speedKmh: number) {
  const s = speedKmh / 3.6 / V_REF;
  const front = p.axles.reduce((a, b) => (b.axleIndex < a.axleIndex ? b : a));
  const f = dutyOnRoad(front.prep, gdN0);
  let power = 0;
  let powerAxle = front.label;
  for (const a of p.axles) {
    const w = dutyOnRoad(a.prep, gdN0).damperPowerW * s;
    if (w > power) {
      power = w;
      powerAxle = a.label;
    }
  }
  return { speedKmh, weightedAccel: f.rmsWeightedAccel * Math.sqrt(s), damperPowerW: power, powerAxle };
}

export interface Advice {
  advisedKmh: number | null;
  comfortKmh: number | null;
  powerKmh: number | null;
  limitedBy: 'comfort' | 'damper power' | 'top of range' | 'no roughness on record';
  belowMinimum: boolean;
}

/**
 * The highest speed within both limits, capped at {@link MAX_ADVICE_KMH}.
 * @param gdN0 road Gd(n0) [m³] (null when unknown)
 * @param awLimit comfort limit, Wk-weighted RMS [m/s²]
 * @param powerLimitW mean damper power limit [W]
 */
export function adviseSpeed(p: PreparedSpec, gdN0: number | null, awLimit: number, powerLimitW: number): Advice {
  if (gdN0 === null || !(gdN0 > 0)) return { advisedKmh: null, comfortKmh: null, powerKmh: null, limitedBy: 'no roughness on record', belowMinimum: false };
  const ref = dutyAtSpeed(p, gdN0, V_REF * 3.6);
  const comfortKmh = V_REF * 3.6 * (awLimit / ref.weightedAccel) ** 2;
  const powerKmh = V_REF * 3.6 * (powerLimitW / ref.damperPowerW);
  const best = Math.min(comfortKmh, powerKmh);
  const advised = Math.min(MAX_ADVICE_KMH, best);
  return {
    advisedKmh: Math.floor(advised),
    comfortKmh,
    powerKmh,
    limitedBy: best >= MAX_ADVICE_KMH ? 'top of range' : comfortKmh <= powerKmh ? 'comfort' : 'damper power',
    belowMinimum: advised < MIN_ADVICE_KMH,
  };
}

/** Duty against speed on a grid, for the chart. */
export function dutyCurve(p: PreparedSpec, gdN0: number, stepKmh = 5) {
  const out = [];
  for (let v = MIN_ADVICE_KMH; v <= MAX_ADVICE_KMH + 1e-9; v += stepKmh) out.push(dutyAtSpeed(p, gdN0, v));
  return out;
}
