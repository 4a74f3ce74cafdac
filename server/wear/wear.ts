/**
 * Wear accumulation and prediction: pure functions over a damper's daily duty. See
 * docs/methods.md, "Damper wear and prediction".
 *
 * - Wear km: each day's distance weighted by its road severity, Σ km·s^b, with b the spec's
 *   road sensitivity (server/reliability/life-model.ts): the distance at the rated road
 *   (ISO 8608 class B, 80 km/h) that does the same wear. Life used = wear km (recorded, plus the
 *   opening wear of the distance before the records) / the median life in wear km.
 * - The life comes from a resolver ({@link LifeResolver}): the spec's fitted life model (or
 *   its prior), times a damper's own test-lane calibration when it has one.
 * - Calendar limit: a damper is at end of life after {@link DEFAULT_CALENDAR_YEARS} years
 *   whatever its distance (configurable; common practice: dampers are replaced at 5–7 years).
 * - Present damping (ASSUMPTION, stated in the product): the coefficient fades linearly with
 *   life used from nominal to {@link DAMPING_AT_END_OF_LIFE} × nominal at end of life.
 * - Prediction: from the trailing {@link DUTY_WINDOW_DAYS}-day wear rate, the dates life used
 *   reaches the inspection threshold and end of life, with the end of life as a median and a
 *   P10–P90 range from the fitted Weibull scatter.
 *
 * @module
 */
import { addMonths as addMonthsFns } from 'date-fns';
import type { PredictionBasis, PredictionFigures } from '../contracts/wear';

/** Fraction of nominal damping left at end of life (ASSUMPTION: linear fade to 60 %). */
export const DAMPING_AT_END_OF_LIFE = 0.6;
/** Trailing window of the duty rate [days]. */
export const DUTY_WINDOW_DAYS = 30;
/** Calendar life of a damper [years] (common practice: 5–7 years). */
export const DEFAULT_CALENDAR_YEARS = 6;

/** The life a damper's wear is measured against. */
export interface LifeBasis {
  /** Road sensitivity b of the spec's model: wear km = Σ km·s^b. */
  b: number;
  /** Life in wear km at the median, P10 and P90 of the fitted scatter. */
  medianWearKm: number;
  p10WearKm: number;
  p90WearKm: number;
  /** 'prior', 'fleet' (fitted to removals) or 'test-lane' (calibrated on this damper). */
  source: string;
  /** One line on what it rests on. */
  note: string;
  /**
   * Wear km added to the damper's own so that its life used on the day of a test-lane result is
   * what the lane measured, where the calibration factor alone is bounded (0 otherwise).
   */
  offsetWearKm?: number;
}

/** Resolves the life of a damper from its spec, axle and rated km. */
export type LifeResolver = (input: { damperId: number; specId: number; axleIndex: number; ratedDamperLifeKm: number }) => LifeBasis;

/** A distance for the words the wear area writes: `12,345 km`. */
export const formatKm = (km: number) => `${Math.round(km).toLocaleString('en-GB')} km`;

/** Estimated present damping [N·s/m] from life used (linear fade, see module doc). */
export function estimatedDamping(nominalNsPerM: number, lifeUsedFraction: number): number {
  const u = Math.min(1, Math.max(0, lifeUsedFraction));
  return nominalNsPerM * (1 - (1 - DAMPING_AT_END_OF_LIFE) * u);
}

export interface DayDuty {
  day: string;
  distanceKm: number;
  energyJ: number;
  springDamage: number;
  /** Σ km·s^b of the day's trips. */
  wearKm: number;
}

export interface WearDayRow extends DayDuty {
  damperId: number;
  vehicleId: number;
  cumKm: number;
  cumEnergyJ: number;
  cumWearKm: number;
  cumSpringDamage: number;
  lifeWearKm: number;
  lifeUsedFraction: number;
  dampingNsPerM: number;
}

/**
 * Cumulative daily wear of the recorded duty, from a starting point (the last stored day
 * before the recomputed range, or zero) and the days' duty in date order. Opening wear is not
 * in these sums (it is revised as the records grow): `openingWearKm` only shifts life used.
 */
export function accumulateDays(
  ids: { damperId: number; vehicleId: number },
  start: { cumKm: number; cumEnergyJ: number; cumWearKm: number; cumSpringDamage: number } | null,
  days: DayDuty[],
  lifeWearKm: number,
  nominalDampingNsPerM: number,
  openingWearKm = 0,
): WearDayRow[] {
  let km = start?.cumKm ?? 0;
  let e = start?.cumEnergyJ ?? 0;
  let w = start?.cumWearKm ?? 0;
  let d = start?.cumSpringDamage ?? 0;
  return days.map((x) => {
    km += x.distanceKm;
    e += x.energyJ;
    w += x.wearKm;
    d += x.springDamage;
    const u = (w + openingWearKm) / lifeWearKm;
    return {
      damperId: ids.damperId,
      vehicleId: ids.vehicleId,
      day: x.day,
      distanceKm: x.distanceKm,
      energyJ: x.energyJ,
      springDamage: x.springDamage,
      wearKm: x.wearKm,
      cumKm: km,
      cumEnergyJ: e,
      cumWearKm: w,
      cumSpringDamage: d,
      lifeWearKm,
      lifeUsedFraction: u,
      dampingNsPerM: estimatedDamping(nominalDampingNsPerM, u),
    };
  });
}

export { plusDays, daysBetween } from '../lib/days';
import { plusDays, daysBetween } from '../lib/days';

/** `day` plus `n` calendar months (YYYY-MM-DD; the last day of a shorter month when the day does not exist). */
export function addMonths(day: string, n: number): string {
  return addMonthsFns(new Date(`${day}T00:00:00Z`), n).toISOString().slice(0, 10);
}

/** Opening wear: the distance a damper ran before the records, see {@link estimateOpening}. */
export interface OpeningInput {
  /** Distance since fitting no trip on record covers [km]. */
  untrackedKm: number;
  /** The damper's own recorded distance [km] and wear km. */
  recordedKm: number;
  recordedWearKm: number;
}

export interface Opening {
  km: number;
  wearKm: number;
  /** Range of the estimate: all of it at severity 1, or all at the damper's recorded rate. */
  lowWearKm: number;
  highWearKm: number;
  /** Wear km per km used (1 = the ordinary road the rating is stated on). */
  perKm: number;
  basis: string;
}

/**
 * Opening wear (stated rule): the untracked distance is charged at the prior's ordinary-road
 * rate (severity 1: ISO 8608 class B at 80 km/h) unless the damper's own record is at least as
 * long as the untracked distance, in which case at its own recorded wear per km. A short record
 * never extrapolates over a longer untracked distance. The range runs from the lower to the
 * higher of the two rates.
 */
export function estimateOpening(i: OpeningInput): Opening {
  const km = Math.max(0, i.untrackedKm);
  const own = i.recordedKm > 0 ? i.recordedWearKm / i.recordedKm : 1;
  if (!(km > 0)) return { km: 0, wearKm: 0, lowWearKm: 0, highWearKm: 0, perKm: 1, basis: 'none: the trips on record cover the distance since fitting' };
  const useOwn = i.recordedKm >= km && i.recordedKm > 0;
  const perKm = useOwn ? own : 1;
  return {
    km,
    wearKm: km * perKm,
    lowWearKm: km * Math.min(1, own),
    highWearKm: km * Math.max(1, own),
    perKm,
    basis: useOwn
      ? `${formatKm(km)} before the trips on record, at this damper's own recorded rate (${own.toFixed(2)}× the rated road, over ${formatKm(i.recordedKm)} on record)`
      : `${formatKm(km)} before the trips on record, at the rated road's rate (class B at 80 km/h): its ${formatKm(i.recordedKm)} on record are too short to say otherwise${i.recordedKm > 0 ? ` (they run at ${own.toFixed(2)}× that rate)` : ''}`,
  };
}

/**
 * What a prediction rests on, as of its day: the recorded duty in the trailing window, the
 * cumulative recorded wear on the last day with duty (on or before the as-of day), and the
 * first days the recorded wear reached the given levels (null while not reached).
 */
export interface WearSummary {
  windowWearKm: number;
  windowKm: number;
  windowSpringDamage: number;
  cumKm: number;
  cumWearKm: number;
  springDamage: number;
  /** First days recorded wear km reached each level of {@link levelsOf} (threshold, median, P10, P90 end of life). */
  levelDays: (string | null)[];
  springThresholdDay: string | null;
}

export interface PredictOptions {
  asOf: string;
  installedAt: string;
  life: LifeBasis;
  thresholdFraction: number;
  nominalDampingNsPerM: number;
  /** Untracked distance before the records [km] (0 when the records cover it). */
  untrackedKm: number;
  /** Calendar life [years]. */
  calendarYears?: number;
  /** Quantile of the life the inspection threshold is scheduled on (0.5 = median). */
  scheduleQuantile?: number;
  windowDays?: number;
}

/** Length of the prediction window [days] and its first day: the trailing window, or since installation if shorter. */
export function predictionWindow(opts: { asOf: string; installedAt: string; windowDays?: number }): { windowDays: number; windowStart: string } {
  const windowDays = Math.max(1, Math.min(opts.windowDays ?? DUTY_WINDOW_DAYS, daysBetween(opts.installedAt, opts.asOf) + 1));
  return { windowDays, windowStart: plusDays(opts.asOf, -(windowDays - 1)) };
}

/**
 * Life in wear km at quantile q from the basis' median, P10 and P90 (log-linear in the Weibull
 * log-quantile between them, exact at the three).
 */
export function lifeAtQuantile(life: LifeBasis, q: number): number {
  if (q === 0.5) return life.medianWearKm;
  // Weibull: ln L_q = ln scale + σ·ln(−ln(1−q)); σ and scale from P10 and P90
  const z = (p: number) => Math.log(-Math.log(1 - p));
  const sigma = (Math.log(life.p90WearKm) - Math.log(life.p10WearKm)) / (z(0.9) - z(0.1));
  return life.medianWearKm * Math.exp(sigma * (z(q) - z(0.5)));
}

/**
 * Recorded wear-km levels whose first days a prediction needs: the inspection threshold (at
 * the schedule quantile), end of life at the median, P10 and P90; each less the opening wear.
 */
export function levelsOf(opts: PredictOptions, openingWearKm: number): number[] {
  const q = opts.scheduleQuantile ?? 0.5;
  return [opts.thresholdFraction * lifeAtQuantile(opts.life, q), opts.life.medianWearKm, opts.life.p10WearKm, opts.life.p90WearKm].map((x) => x - openingWearKm);
}

/** The summary of a damper's daily wear rows (in date order; days after `asOf` ignored). */
export function summarizeWear(history: WearDayRow[], opts: PredictOptions, openingWearKm: number): WearSummary {
  const { windowStart } = predictionWindow(opts);
  const levels = levelsOf(opts, openingWearKm);
  const s: WearSummary = { windowWearKm: 0, windowKm: 0, windowSpringDamage: 0, cumKm: 0, cumWearKm: 0, springDamage: 0, levelDays: levels.map(() => null), springThresholdDay: null };
  for (const h of history) {
    if (h.day > opts.asOf) break;
    s.cumKm = h.cumKm;
    s.cumWearKm = h.cumWearKm;
    s.springDamage = h.cumSpringDamage;
    if (h.day >= windowStart) {
      s.windowWearKm += h.wearKm;
      s.windowKm += h.distanceKm;
      s.windowSpringDamage += h.springDamage;
    }
    levels.forEach((l, i) => {
      if (s.levelDays[i] === null && h.cumWearKm >= l) s.levelDays[i] = h.day;
    });
    if (s.springThresholdDay === null && h.cumSpringDamage >= opts.thresholdFraction) s.springThresholdDay = h.day;
  }
  return s;
}

/** A damper's prediction as the nightly job works it out and stores it (damper_predictions). */
export interface Prediction extends PredictionFigures {
  life: LifeBasis;
  /** Recorded plus opening wear km. */
  wearKm: number;
  lifeUsedFraction: number;
  opening: Opening;
  /** Opening wear as a share of life, with its range. */
  openingShare: number;
  openingShareLow: number;
  openingShareHigh: number;
  dampingNsPerM: number;
  springDamage: number;
  basis: PredictionBasis;
}

/** Predicts from a {@link WearSummary}. */
export function predictFromSummary(s: WearSummary, opts: PredictOptions): Prediction {
  const { windowDays, windowStart } = predictionWindow(opts);
  const opening = estimateOpening({ untrackedKm: opts.untrackedKm, recordedKm: s.cumKm, recordedWearKm: s.cumWearKm });
  const q = opts.scheduleQuantile ?? 0.5;
  const years = opts.calendarYears ?? DEFAULT_CALENDAR_YEARS;
  const L = opts.life.medianWearKm;
  const W = s.cumWearKm + opening.wearKm + (opts.life.offsetWearKm ?? 0);
  const rate = s.windowWearKm / windowDays;
  const dRate = s.windowSpringDamage / windowDays;
  const th = opts.thresholdFraction;
  const calEnd = addMonths(opts.installedAt, Math.round(years * 12));
  const calendarDays = daysBetween(opts.installedAt, calEnd);
  const ageDays = Math.max(0, daysBetween(opts.installedAt, opts.asOf));
  // wear before the records (opening, and a test-lane offset): a level it alone reaches was
  // passed before the first trip on record; that day is estimated as if the damper's wear had
  // grown evenly from its fitting to today (stated in the basis), and is never later than the
  // first day on record (`firstDay`: for such a level, the first recorded day reaches it)
  const before = opening.wearKm + (opts.life.offsetWearKm ?? 0);
  let estimatedBefore = false;
  const reached = (level: number, cum: number, r: number, firstDay: string | null): string | null => {
    if (cum >= level) return firstDay ?? opts.asOf;
    if (!(r > 0)) return null;
    const days = Math.ceil((level - cum) / r);
    return days > 365 * 100 ? null : plusDays(opts.asOf, days);
  };
  const earlier = (a: string | null, b: string) => (a === null || b < a ? b : a);
  const levels = levelsOf(opts, 0);
  const reachedWear = (level: number, firstDay: string | null): string | null => {
    if (W >= level && level <= before && W > 0 && ageDays > 0) {
      estimatedBefore = true;
      const even = plusDays(opts.installedAt, Math.max(0, Math.floor((level / W) * ageDays)));
      return firstDay !== null && firstDay < even ? firstDay : even;
    }
    return reached(level, W, rate, firstDay);
  };
  const distTh = reachedWear(levels[0], s.levelDays[0]);
  const distEol = reachedWear(levels[1], s.levelDays[1]);
  const calTh = plusDays(opts.installedAt, Math.round(th * calendarDays));
  const endOfLifeDate = earlier(distEol, calEnd);
  const distanceLifeUsed = W / L;
  const calendarLifeUsed = ageDays / calendarDays;
  const u = Math.max(distanceLifeUsed, calendarLifeUsed);
  const pctOf = (x: number) => `${Math.round(x * 100)} %`;
  return {
    asOf: opts.asOf,
    windowDays,
    windowKm: s.windowKm,
    windowWearKm: s.windowWearKm,
    wearKmPerDay: rate,
    kmPerDay: s.windowKm / windowDays,
    life: opts.life,
    wearKm: W,
    lifeUsedFraction: u,
    distanceLifeUsed,
    calendarLifeUsed,
    opening,
    openingShare: opening.wearKm / L,
    openingShareLow: opening.lowWearKm / L,
    openingShareHigh: opening.highWearKm / L,
    dampingNsPerM: estimatedDamping(opts.nominalDampingNsPerM, u),
    thresholdFraction: th,
    scheduleQuantile: q,
    thresholdDate: earlier(distTh, calTh),
    endOfLifeDate,
    endOfLifeP10Date: earlier(reachedWear(levels[2], s.levelDays[2]), calEnd),
    endOfLifeP90Date: earlier(reachedWear(levels[3], s.levelDays[3]), calEnd),
    governedBy: distEol !== null && distEol <= calEnd ? 'distance' : 'calendar',
    springDamage: s.springDamage,
    springRatePerDay: dRate,
    springThresholdDate: reached(th, s.springDamage, dRate, s.springThresholdDay),
    basis: {
      method: `straight-line projection of the wear rate over the last ${windowDays} day(s) (${windowStart} to ${opts.asOf}); end of life as the median of the fitted scatter with its P10–P90 range; inspection threshold ${pctOf(th)} of the ${q === 0.5 ? 'median' : `P${Math.round(q * 100)}`} life`,
      life: opts.life.note,
      opening: estimatedBefore ? `${opening.basis}; levels it alone passes are dated as if the wear had grown evenly since fitting (before the trips on record)` : opening.basis,
      calendar: `calendar limit ${years} years from fitting (common practice: 5–7 years), reached ${calEnd}`,
      damping: `estimated present damping: linear fade from nominal to ${Math.round(DAMPING_AT_END_OF_LIFE * 100)} % at end of life (assumption)`,
      window: `${formatKm(s.windowKm)} driven in the window, ${formatKm(s.windowWearKm)} of wear at the rated road's rate`,
    },
  };
}

/** {@link predictFromSummary} over a damper's wear rows. */
export function predict(history: WearDayRow[], opts: PredictOptions): Prediction {
  // the opening depends on the record; the levels on the opening: one pass for each
  const pre = summarizeWear(history, opts, 0);
  const opening = estimateOpening({ untrackedKm: opts.untrackedKm, recordedKm: pre.cumKm, recordedWearKm: pre.cumWearKm });
  return predictFromSummary(summarizeWear(history, opts, opening.wearKm + (opts.life.offsetWearKm ?? 0)), opts);
}
