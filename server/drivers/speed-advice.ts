/**
 * Speed advice per road segment and suspension spec: the highest speed at which the driver's
 * seat stays within a chosen ride limit and every axle's damper within a chosen multiple of its
 * own reference duty (docs/methods.md "Speed advice").
 *
 * - Ride limit: the seat's Wk-weighted acceleration `a_w = F · a_floor`, with `a_floor` the
 *   front axle's body acceleration (the driver sits over it; left and right corners equal in the
 *   model) and `F = SEAT · cab · √((1 + ρ)/2)` the spec's floor-to-seat factor — the same seat
 *   the drivers' exposure uses (server/physics/seat.ts). The limit is either the upper end of an
 *   ISO 2631-1:1997 Annex C comfort band or the daily exposure budget `0.5·√(8 h / T)` that
 *   keeps A(8) at the action value of Directive 2002/44/EC over `T` hours at that level.
 * - Damper limit: each axle's mean damper power at most `multiple ×` that axle's mean power on
 *   the wear model's reference road (ISO 8608 class B at 80 km/h, unladen; server/wear/life-law.ts),
 *   so a truck damper and a van damper are each judged against their own duty. An absolute
 *   limit in W may be given instead.
 * - Load: laden corners carry a payload shared over the axles as in the duty model
 *   (server/wear/duty.ts `cornerPayloadKg`); the reference power stays the unladen one.
 * - Below {@link MIN_ADVICE_KMH} no figure is given: the road needs attention instead.
 *
 * Method: closed form (server/physics/closed-form.ts) on the app's road band (wavelengths ≥ 0.6 m,
 * docs/methods.md "One road model for both methods"). Every variance is proportional to Gd(n0);
 * because the band's top frequency moves with speed, it is not exactly proportional to v,
 * so each axle is solved once per km/h on a grid from {@link GRID_FROM_KMH} to {@link GRID_TO_KMH}
 * and variances are interpolated linearly in speed between grid points (under 0.1 % from a fresh
 * solve, tested). The crossing speed of a limit is found on that interpolated curve, which rises
 * monotonically with speed.
 */
import { dutyOnRoad, prepareDuty, type PreparedDuty } from '../physics/closed-form';
import { EXPOSURE_ACTION_VALUE } from '../physics/exposure';
import type { CornerParams } from '../physics/types';
import { HEAT_SHED_FACTOR, REFERENCE_KMH, severityReference } from '../wear/life-law';
import { cornerPayloadKg } from '../wear/duty';

/** ISO 2631-1:1997 Annex C comfort reactions; the limit is the upper end of each band [m/s²]. */
export const COMFORT_BANDS = [
  { key: 'not-uncomfortable', label: 'Not uncomfortable', range: 'below 0.315 m/s²', limit: 0.315 },
  { key: 'a-little', label: 'A little uncomfortable', range: '0.315–0.63 m/s²', limit: 0.63 },
  { key: 'fairly', label: 'Fairly uncomfortable', range: '0.5–1 m/s²', limit: 1.0 },
  { key: 'uncomfortable', label: 'Uncomfortable', range: '0.8–1.6 m/s²', limit: 1.6 },
] as const;
/** The ride limit from the driver's daily exposure budget, offered beside the comfort bands. */
export const DAILY_EXPOSURE_KEY = 'daily-exposure';
export type ComfortKey = (typeof COMFORT_BANDS)[number]['key'] | typeof DAILY_EXPOSURE_KEY;
export const COMFORT_KEYS = [...COMFORT_BANDS.map((b) => b.key), DAILY_EXPOSURE_KEY] as unknown as [ComfortKey, ...ComfortKey[]];
export const DEFAULT_COMFORT: ComfortKey = 'fairly';

/**
 * Default damper limit: a multiple of the damper's mean power on class B at 80 km/h. The wear
 * model takes a damper to shed up to this multiple easily and counts heat above it
 * (life-law.ts HEAT_SHED_FACTOR, an assumption stated there); advice uses the same line so the
 * two never disagree about when a damper runs hot. It is class D at 80 km/h.
 */
export const DEFAULT_DAMPER_MULTIPLE = HEAT_SHED_FACTOR;
export const DAMPER_MULTIPLE_RANGE = [1, 50] as const;
/** Default hours a day at the advised level for the daily-exposure limit: the whole 8 h reference day (conservative). */
export const DEFAULT_EXPOSURE_HOURS = 8;
/** Below this speed no advice is given: the road needs attention [km/h] (walking-pace advice is no advice a driver can follow on a through road). */
export const MIN_ADVICE_KMH = 20;
export const MAX_ADVICE_KMH = 130;
/** Speed grid of the per-axle solves [km/h]. */
export const GRID_FROM_KMH = 1;
export const GRID_TO_KMH = 140;

export const SPEED_CAUTION =
  'Planning advice from a model of the suspension and the recorded roughness. Posted limits, the road and weather conditions, the load and the driver’s judgement always come first.';

export const ROAD_ATTENTION = `Road needs attention: the limits are not met even at ${MIN_ADVICE_KMH} km/h. Report the segment for inspection or repair rather than driving it slower.`;

/** The ride limit at the seat [m/s²] that keeps A(8) at the action value over `hours` at that level: 0.5·√(8/T). */
export function dailyExposureLimit(hours: number): number {
  return EXPOSURE_ACTION_VALUE * Math.sqrt(8 / hours);
}

export interface AxleCorner {
  axleIndex: number;
  label: string;
  /** Unladen corner. */
  corner: CornerParams;
}

export interface PreparedSpec {
  /** Per axle, one closed-form solve per grid speed (index i ↔ GRID_FROM_KMH + i km/h) and its reference damper power. */
  axles: { axleIndex: number; label: string; refPowerW: number; grid: PreparedDuty[] }[];
  /** Floor-to-seat factor applied to the front axle's weighted acceleration [1]. */
  seatFactor: number;
  /** Payload carried [kg] (0 = unladen). */
  payloadKg: number;
}

/**
 * One closed-form solve per axle and grid speed, with the payload shared over the axles as in
 * the duty model, and each axle's reference power from its unladen corner.
 */
export function prepareSpec(axles: readonly AxleCorner[], opts: { seatFactor?: number; payloadKg?: number } = {}): PreparedSpec {
  const payloadKg = opts.payloadKg ?? 0;
  const speeds = Array.from({ length: GRID_TO_KMH - GRID_FROM_KMH + 1 }, (_, i) => (GRID_FROM_KMH + i) / 3.6);
  return {
    seatFactor: opts.seatFactor ?? 1,
    payloadKg,
    axles: axles.map((a) => {
      const loaded = { ...a.corner, sprungMassKg: a.corner.sprungMassKg + cornerPayloadKg(payloadKg, a.axleIndex, axles.length) };
      return { axleIndex: a.axleIndex, label: a.label, refPowerW: severityReference(a.corner).powerW, grid: speeds.map((v) => prepareDuty(loaded, v)) };
    }),
  };
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

const frontOf = (p: PreparedSpec) => p.axles.reduce((a, b) => (b.axleIndex < a.axleIndex ? b : a));

/**
 * Duty at a speed: the seat's weighted acceleration [m/s²], the front floor's, and the damper of
 * any axle with the largest power against its own reference (its power [W] and that ratio [1]).
 */
export function dutyAtSpeed(p: PreparedSpec, gdN0: number, speedKmh: number) {
  const f = dutyOnRoad(preparedAt(frontOf(p).grid, speedKmh), gdN0);
  let ratio = 0;
  let power = 0;
  let powerAxle = p.axles[0].label;
  for (const a of p.axles) {
    const w = dutyOnRoad(preparedAt(a.grid, speedKmh), gdN0).damperPowerW;
    if (w / a.refPowerW > ratio) {
      ratio = w / a.refPowerW;
      power = w;
      powerAxle = a.label;
    }
  }
  return { speedKmh, seatWeightedAccel: f.rmsWeightedAccel * p.seatFactor, floorWeightedAccel: f.rmsWeightedAccel, damperPowerW: power, damperPowerRatio: ratio, powerAxle };
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
  let a = lo;
  let b = lo + 1;
  for (let i = 0; i < 50; i++) {
    const m = (a + b) / 2;
    if (value(m) < limit) a = m;
    else b = m;
  }
  return (a + b) / 2;
}

/** The damper limit: a multiple of each axle's own reference power, or one absolute figure for every damper. */
export type DamperLimit = { multiple: number } | { absoluteW: number };

export interface AdviceLimits {
  /** Ride limit at the seat, Wk-weighted RMS [m/s²]. */
  seatAwLimit: number;
  /** What the ride limit is, for `limitedBy`. */
  rideLabel: 'comfort' | 'daily exposure';
  damper: DamperLimit;
}

export interface Advice {
  /** Advised speed [km/h], whole km/h rounded down; null without roughness or below the floor. */
  advisedKmh: number | null;
  rideKmh: number | null;
  powerKmh: number | null;
  limitedBy: 'comfort' | 'daily exposure' | 'damper power' | 'top of range' | 'no roughness on record';
  /** Axle whose damper limits first (null without roughness). */
  powerAxle: string | null;
  /** True when the limits are not met at {@link MIN_ADVICE_KMH}: the road needs attention. */
  belowMinimum: boolean;
}

/** The damper-power speed of one axle: its power reaches its own limit. */
function axlePowerKmh(p: PreparedSpec, axle: PreparedSpec['axles'][number], gdN0: number, damper: DamperLimit): number {
  const limitW = 'multiple' in damper ? damper.multiple * axle.refPowerW : damper.absoluteW;
  return crossing((v) => dutyOnRoad(preparedAt(axle.grid, v), gdN0).damperPowerW, limitW);
}

/**
 * The highest speed within both limits, capped at {@link MAX_ADVICE_KMH}; none below
 * {@link MIN_ADVICE_KMH}.
 * @param gdN0 road Gd(n0) [m³] (null when unknown)
 */
export function adviseSpeed(p: PreparedSpec, gdN0: number | null, limits: AdviceLimits): Advice {
  if (gdN0 === null || !(gdN0 > 0)) return { advisedKmh: null, rideKmh: null, powerKmh: null, limitedBy: 'no roughness on record', powerAxle: null, belowMinimum: false };
  const front = frontOf(p);
  const rideKmh = crossing((v) => dutyOnRoad(preparedAt(front.grid, v), gdN0).rmsWeightedAccel * p.seatFactor, limits.seatAwLimit);
  let powerKmh = Infinity;
  let powerAxle = p.axles[0].label;
  for (const a of p.axles) {
    const s = axlePowerKmh(p, a, gdN0, limits.damper);
    if (s < powerKmh) {
      powerKmh = s;
      powerAxle = a.label;
    }
  }
  const best = Math.min(rideKmh, powerKmh);
  const advised = Math.min(MAX_ADVICE_KMH, best);
  const belowMinimum = advised < MIN_ADVICE_KMH;
  return {
    advisedKmh: belowMinimum ? null : Math.floor(advised),
    rideKmh,
    powerKmh,
    limitedBy: best >= MAX_ADVICE_KMH ? 'top of range' : rideKmh <= powerKmh ? limits.rideLabel : 'damper power',
    powerAxle,
    belowMinimum,
  };
}

/** Duty against speed on a grid, for the chart. */
export function dutyCurve(p: PreparedSpec, gdN0: number, stepKmh = 5) {
  const out = [];
  for (let v = 10; v <= MAX_ADVICE_KMH + 1e-9; v += stepKmh) out.push(dutyAtSpeed(p, gdN0, v));
  return out;
}

/** Reference road of the damper limit, in words. */
export const DAMPER_REFERENCE_TEXT = `its own mean power on ISO 8608 class B at ${REFERENCE_KMH} km/h, unladen (the road the damper's rated life is stated on)`;
