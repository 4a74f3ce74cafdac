/**
 * Wear accumulation and prediction: pure functions over a damper's daily duty.
 *
 * - Consumed life = dissipated energy / life energy. The life energy comes from a resolver
 *   ({@link LifeResolver}); the default is the rated life (`ratedLifeEnergyJ(corner, { km:
 *   ratedDamperLifeKm })`: that many km of ISO 8608 class B at 80 km/h, product.md §3). The
 *   workshop issue can plug in a fleet-fitted life (Weibull) through the same resolver.
 * - Present damping (ASSUMPTION, stated in the product): the coefficient fades linearly with
 *   consumed life from the nominal value to {@link DAMPING_AT_END_OF_LIFE} × nominal at end of
 *   life, and stays there beyond it. A test-lane result (issue 6) replaces this estimate.
 * - Prediction: from the trailing {@link DUTY_WINDOW_DAYS}-day duty rate (energy per calendar
 *   day in the window, or since installation if shorter), the dates consumed life reaches the
 *   inspection threshold and end of life. The spring's Miner damage is predicted the same way.
 *
 * @module
 */
import { ratedLifeEnergyJ } from '../physics/closed-form';
import type { CornerParams } from '../physics/types';

/** Fraction of nominal damping left at end of life (ASSUMPTION: linear fade to 60 %). */
export const DAMPING_AT_END_OF_LIFE = 0.6;
/** Trailing window of the duty rate [days]. */
export const DUTY_WINDOW_DAYS = 30;

export interface LifeEnergy {
  /** Life energy of the damper [J]. */
  energyJ: number;
  /** Where it comes from: 'rated' (spec) or, later, 'fleet' (fitted from replacements). */
  source: string;
  /** One line on what it rests on. */
  note: string;
}

/** Resolves the life energy of a damper; issue 6 can wrap this to use a fleet-fitted life. */
export type LifeResolver = (input: { damperId: number; corner: CornerParams; ratedDamperLifeKm: number }) => LifeEnergy;

/** A distance for the words the wear area writes: `12,345 km`. */
export const formatKm = (km: number) => `${Math.round(km).toLocaleString('en-GB')} km`;

const ratedCache = new Map<string, LifeEnergy>();

/**
 * The default resolver: the spec's rated life as energy (class B, 80 km/h, rated km). Cached
 * per corner and rated distance: a night asks for it once per damper, and the Lyapunov solve
 * and the note's number formatting are the same for every damper of a spec's axle.
 */
export const ratedLife: LifeResolver = ({ corner, ratedDamperLifeKm }) => {
  const key = `${corner.sprungMassKg}/${corner.unsprungMassKg}/${corner.springRateNPerM}/${corner.dampingNsPerM}/${corner.tireRateNPerM}/${ratedDamperLifeKm}`;
  let life = ratedCache.get(key);
  if (!life) {
    life = Object.freeze({
      energyJ: ratedLifeEnergyJ(corner, { km: ratedDamperLifeKm }),
      source: 'rated',
      note: `rated life: energy dissipated over ${formatKm(ratedDamperLifeKm)} of ISO 8608 class B road at 80 km/h`,
    });
    ratedCache.set(key, life);
  }
  return life;
};

/** Estimated present damping [N·s/m] from consumed life (linear fade, see module doc). */
export function estimatedDamping(nominalNsPerM: number, lifeUsedFraction: number): number {
  const u = Math.min(1, Math.max(0, lifeUsedFraction));
  return nominalNsPerM * (1 - (1 - DAMPING_AT_END_OF_LIFE) * u);
}

export interface DayDuty {
  day: string;
  distanceKm: number;
  energyJ: number;
  springDamage: number;
}

export interface WearDayRow extends DayDuty {
  damperId: number;
  vehicleId: number;
  cumEnergyJ: number;
  cumSpringDamage: number;
  lifeEnergyJ: number;
  lifeUsedFraction: number;
  dampingNsPerM: number;
}

/**
 * Cumulative daily wear from a starting point (the last stored day before the recomputed
 * range, or zero) and the days' duty in date order.
 */
export function accumulateDays(
  ids: { damperId: number; vehicleId: number },
  start: { cumEnergyJ: number; cumSpringDamage: number } | null,
  days: DayDuty[],
  lifeEnergyJ: number,
  nominalDampingNsPerM: number,
): WearDayRow[] {
  let e = start?.cumEnergyJ ?? 0;
  let d = start?.cumSpringDamage ?? 0;
  return days.map((x) => {
    e += x.energyJ;
    d += x.springDamage;
    const u = e / lifeEnergyJ;
    // explicit fields, not spreads: this runs once per damper-day of the night
    return {
      damperId: ids.damperId,
      vehicleId: ids.vehicleId,
      day: x.day,
      distanceKm: x.distanceKm,
      energyJ: x.energyJ,
      springDamage: x.springDamage,
      cumEnergyJ: e,
      cumSpringDamage: d,
      lifeEnergyJ,
      lifeUsedFraction: u,
      dampingNsPerM: estimatedDamping(nominalDampingNsPerM, u),
    };
  });
}

export interface Prediction {
  asOf: string;
  windowDays: number;
  windowEnergyJ: number;
  windowKm: number;
  rateJPerDay: number;
  lifeEnergyJ: number;
  lifeSource: string;
  energyJ: number;
  lifeUsedFraction: number;
  dampingNsPerM: number;
  thresholdFraction: number;
  thresholdDate: string | null;
  endOfLifeDate: string | null;
  springDamage: number;
  springRatePerDay: number;
  springThresholdDate: string | null;
  basis: {
    method: string;
    life: string;
    damping: string;
    window: string;
  };
}

const DAY_MS = 86_400_000;
const dayMs = (s: string) => Date.UTC(Number(s.slice(0, 4)), Number(s.slice(5, 7)) - 1, Number(s.slice(8, 10)));
/** `day` plus `n` calendar days (YYYY-MM-DD, UTC arithmetic on dates). */
export const plusDays = (day: string, n: number) => new Date(dayMs(day) + n * DAY_MS).toISOString().slice(0, 10);
/** Calendar days from `from` to `to` (YYYY-MM-DD). */
export const daysBetween = (from: string, to: string) => Math.round((dayMs(to) - dayMs(from)) / DAY_MS);

/**
 * What a prediction rests on, as of its day: the duty in the trailing window, the cumulative
 * wear on the last day with duty (on or before the as-of day), and the first days the levels
 * were reached (null while not reached).
 */
export interface WearSummary {
  windowEnergyJ: number;
  windowKm: number;
  windowSpringDamage: number;
  /** Cumulative damper energy [J] and spring damage [1] at the last day with duty. */
  energyJ: number;
  springDamage: number;
  /** First days cumulative energy reached threshold × life energy, and the life energy. */
  thresholdDay: string | null;
  endOfLifeDay: string | null;
  /** First day the spring's cumulative damage reached the threshold fraction. */
  springThresholdDay: string | null;
}

export interface PredictOptions {
  asOf: string;
  installedAt: string;
  life: LifeEnergy;
  thresholdFraction: number;
  nominalDampingNsPerM: number;
  windowDays?: number;
}

/** Length of the prediction window [days] and its first day: the trailing window, or since installation if shorter. */
export function predictionWindow(opts: { asOf: string; installedAt: string; windowDays?: number }): { windowDays: number; windowStart: string } {
  const windowDays = Math.max(1, Math.min(opts.windowDays ?? DUTY_WINDOW_DAYS, daysBetween(opts.installedAt, opts.asOf) + 1));
  return { windowDays, windowStart: plusDays(opts.asOf, -(windowDays - 1)) };
}

/**
 * The summary of a damper's daily wear rows (in date order; days after `asOf` ignored) that
 * {@link predictFromSummary} needs. The nightly job gets the same figures from one SQL
 * aggregate per chunk of dampers instead.
 */
export function summarizeWear(history: WearDayRow[], opts: PredictOptions): WearSummary {
  const { windowStart } = predictionWindow(opts);
  const L = opts.life.energyJ;
  const th = opts.thresholdFraction;
  const s: WearSummary = { windowEnergyJ: 0, windowKm: 0, windowSpringDamage: 0, energyJ: 0, springDamage: 0, thresholdDay: null, endOfLifeDay: null, springThresholdDay: null };
  for (const h of history) {
    if (h.day > opts.asOf) break;
    s.energyJ = h.cumEnergyJ;
    s.springDamage = h.cumSpringDamage;
    if (h.day >= windowStart) {
      s.windowEnergyJ += h.energyJ;
      s.windowKm += h.distanceKm;
      s.windowSpringDamage += h.springDamage;
    }
    if (s.thresholdDay === null && h.cumEnergyJ >= th * L) s.thresholdDay = h.day;
    if (s.endOfLifeDay === null && h.cumEnergyJ >= L) s.endOfLifeDay = h.day;
    if (s.springThresholdDay === null && h.cumSpringDamage >= th) s.springThresholdDay = h.day;
  }
  return s;
}

/**
 * Predicts when a damper's consumed life reaches the threshold and end of life, and when its
 * spring's Miner damage reaches the threshold, from the trailing duty rate.
 *
 * @param history the damper's daily wear rows in date order (any days after `asOf` ignored)
 * @param opts as-of day, installation day, life energy [J], threshold fraction [1], nominal damping [N·s/m]
 */
export function predict(history: WearDayRow[], opts: PredictOptions): Prediction {
  return predictFromSummary(summarizeWear(history, opts), opts);
}

/** {@link predict} from a {@link WearSummary}. */
export function predictFromSummary(s: WearSummary, opts: PredictOptions): Prediction {
  const { windowDays, windowStart } = predictionWindow(opts);
  const L = opts.life.energyJ;
  const E = s.energyJ;
  const D = s.springDamage;
  const wE = s.windowEnergyJ;
  const wKm = s.windowKm;
  const rate = wE / windowDays;
  const dRate = s.windowSpringDamage / windowDays;
  const th = opts.thresholdFraction;
  const reached = (level: number, cum: number, r: number, firstDay: string | null): string | null => {
    if (cum >= level) return firstDay ?? opts.asOf;
    if (!(r > 0)) return null;
    const days = Math.ceil((level - cum) / r);
    return days > 365 * 100 ? null : plusDays(opts.asOf, days);
  };
  const u = E / L;
  return {
    asOf: opts.asOf,
    windowDays,
    windowEnergyJ: wE,
    windowKm: wKm,
    rateJPerDay: rate,
    lifeEnergyJ: L,
    lifeSource: opts.life.source,
    energyJ: E,
    lifeUsedFraction: u,
    dampingNsPerM: estimatedDamping(opts.nominalDampingNsPerM, u),
    thresholdFraction: th,
    thresholdDate: reached(th * L, E, rate, s.thresholdDay),
    endOfLifeDate: reached(L, E, rate, s.endOfLifeDay),
    springDamage: D,
    springRatePerDay: dRate,
    springThresholdDate: reached(th, D, dRate, s.springThresholdDay),
    basis: {
      method: `straight-line projection of the duty rate over the last ${windowDays} day(s) (${windowStart} to ${opts.asOf})`,
      life: opts.life.note,
      damping: `estimated present damping: linear fade from nominal to ${Math.round(DAMPING_AT_END_OF_LIFE * 100)} % at end of life (assumption)`,
      window: `${Math.round(wKm)} km and ${(wE / 1e6).toFixed(2)} MJ in the window`,
    },
  };
}
