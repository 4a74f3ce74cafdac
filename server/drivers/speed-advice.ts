/**
 * Speed advice per road segment and suspension spec: the highest speed at which the
 * ISO 2631-1 Wk-weighted body acceleration over the front axle stays within a chosen comfort
 * band (ISO 2631-1:1997 Annex C) and every axle's mean damper power stays within a chosen limit.
 *
 * Method: closed form (server/physics/closed-form.ts) on the app's road band (wavelengths ≥ 0.6 m,
 * docs/methods.md "One road model for both methods"). Every variance is proportional to Gd(n0);
 * because the band's top frequency moves with speed, it is no longer exactly proportional to v,
 * so each axle is solved once per km/h on a grid from {@link GRID_FROM_KMH} to {@link GRID_TO_KMH}
 * and variances are interpolated linearly in speed between grid points (under 0.1 % from a fresh
 * solve, tested). The crossing speed of a limit is found on that interpolated curve, which rises
 * monotonically with speed.
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
/** Speed grid of the per-axle solves [km/h]. */
export const GRID_FROM_KMH = 1;
export const GRID_TO_KMH = 140;

export const SPEED_CAUTION =
  'Planning advice from a model of the suspension and the recorded roughness. Posted limits, the road and weather conditions, the load and the driver’s judgement always come first.';

export interface AxleCorner {
  axleIndex: number;
  label: string;
  corner: CornerParams;
}

export interface PreparedSpec {
  /** Per axle, one closed-form solve per grid speed (index i ↔ GRID_FROM_KMH + i km/h). */
  axles: { axleIndex: number; label: string; grid: PreparedDuty[] }[];
}

/** One closed-form solve per axle and grid speed. */
export function prepareSpec(axles: readonly AxleCorner[]): PreparedSpec {
  const speeds = Array.from({ length: GRID_TO_KMH - GRID_FROM_KMH + 1 }, (_, i) => (GRID_FROM_KMH + i) / 3.6);
  return { axles: axles.map((a) => ({ axleIndex: a.axleIndex, label: a.label, grid: speeds.map((v) => prepareDuty(a.corner, v)) })) };
}

/** An axle's variances per unit Gd(n0) at a speed, interpolated linearly between grid speeds. */
function preparedAt(grid: PreparedDuty[], speedKmh: number): PreparedDuty {
  const x = Math.min(GRID_TO_KMH, Math.max(GRID_FROM_KMH, speedKmh)) - GRID_FROM_KMH;
  const i = Math.min(grid.length - 2, Math.floor(x));
  const t = x - i;
  const a = grid[i];
  const b = grid[i + 1];
  const mix = (k: 'varBodyAccelPerGd' | 'varWeightedAccelPerGd' | 'varTravelPerGd' | 'varRelVelPerGd' | 'varTireLoadRatioPerGd') => a[k] + (b[k] - a[k]) * t;
  return {
    speedMps: speedKmh / 3.6,
    dampingNsPerM: a.dampingNsPerM,
    varBodyAccelPerGd: mix('varBodyAccelPerGd'),
    varWeightedAccelPerGd: mix('varWeightedAccelPerGd'),
    varTravelPerGd: mix('varTravelPerGd'),
    varRelVelPerGd: mix('varRelVelPerGd'),
    varTireLoadRatioPerGd: mix('varTireLoadRatioPerGd'),
  };
}

/** Front-axle weighted acceleration [m/s²] and the largest damper power of any axle [W] at a speed. */
export function dutyAtSpeed(p: PreparedSpec, gdN0: number, speedKmh: number) {
  const front = p.axles.reduce((a, b) => (b.axleIndex < a.axleIndex ? b : a));
  const f = dutyOnRoad(preparedAt(front.grid, speedKmh), gdN0);
  let power = 0;
  let powerAxle = front.label;
  for (const a of p.axles) {
    const w = dutyOnRoad(preparedAt(a.grid, speedKmh), gdN0).damperPowerW;
    if (w > power) {
      power = w;
      powerAxle = a.label;
    }
  }
  return { speedKmh, weightedAccel: f.rmsWeightedAccel, damperPowerW: power, powerAxle };
}

/**
 * The speed [km/h] at which a quantity rising with speed reaches `limit` on the interpolated
 * curve (GRID_TO_KMH when it stays below, GRID_FROM_KMH when it is already above there).
 */
function crossing(value: (kmh: number) => number, limit: number): number {
  if (value(GRID_FROM_KMH) >= limit) return GRID_FROM_KMH;
  if (value(GRID_TO_KMH) < limit) return GRID_TO_KMH;
  let lo = GRID_FROM_KMH;
  while (value(lo + 1) < limit) lo++;
  // linear in each grid cell for variances; the quantities here are a variance (power) or its root
  let a = lo;
  let b = lo + 1;
  for (let i = 0; i < 50; i++) {
    const m = (a + b) / 2;
    if (value(m) < limit) a = m;
    else b = m;
  }
  return (a + b) / 2;
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
  const comfortKmh = crossing((v) => dutyAtSpeed(p, gdN0, v).weightedAccel, awLimit);
  const powerKmh = crossing((v) => dutyAtSpeed(p, gdN0, v).damperPowerW, powerLimitW);
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
