/**
 * The workshop's rules for one corner, free of storage: the findings and verdicts a mechanic
 * records, each fitted damper's predicted state and word, damping from lane readings, the
 * left-right check per axle and the chance of a replacement within a horizon.
 */
import { estimateFromLane } from '../physics/lane-estimate';
import type { CornerParams } from '../physics/types';
import { estimatedDamping } from '../wear/wear';
import { lifeKmAt, type LifeModel } from '../reliability/life-model';
import type { CornerState, LifeSource } from '../contracts/workshop';
import type { FittedCornerRow } from './repository';

export { FINDINGS, VERDICTS } from '../contracts/workshop';
/** The verdict "keep, check again soon": it sets the inspection's follow-up date. */
export const CHECK_AGAIN = 'monitor';
/** Days from the inspection to the follow-up when the mechanic gives no date (stated default). */
export const FOLLOW_UP_DEFAULT_DAYS = 30;
export const OPEN = ['scheduled', 'due', 'overdue'];

export type { CornerState, LifeSource } from '../contracts/workshop';

/** The corner's word: the same bands as the vehicle page (watch from ¾ of the inspection threshold, inspect from it). */
const stateOf = (u: number, threshold: number): CornerState['state'] => (u >= 1 ? 'past_life' : u >= threshold ? 'due' : u >= threshold * 0.75 - 1e-9 ? 'watch' : 'ok');

/** Each corner's predicted state from the nightly wear state, or a km estimate before it. */
export function cornerState(r: FittedCornerRow, models: Map<number, LifeModel>, threshold = 0.8): CornerState {
  const model = models.get(r.spec_id);
  const ratedRoadKm = model ? lifeKmAt(model, r.rated_damper_life_km, 1, 0.5) : r.rated_damper_life_km;
  const perKm = r.p_window_km && r.p_window_km > 0 && r.p_window_wear_km !== null ? r.p_window_wear_km / r.p_window_km : null;
  const lifeKm = r.p_life_wear_km !== null && perKm ? r.p_life_wear_km / perKm : ratedRoadKm;
  const km = Math.max(0, r.odometer_km - r.installed_odometer_km);
  const fromModel = r.wear_updated_at !== null;
  const u = fromModel ? r.life_used_fraction : km / lifeKm;
  const damping = fromModel && r.damping_ns_per_m !== null ? r.damping_ns_per_m : estimatedDamping(r.nominal_ns_per_m, u);
  return {
    damperId: r.damper_id,
    position: r.position,
    axleIndex: r.axle_index,
    partNumber: r.part_number,
    installedAt: r.installed_at,
    kmSinceFitted: km,
    lifeUsedFraction: u,
    dampingNsPerM: damping,
    nominalNsPerM: r.nominal_ns_per_m,
    basis: fromModel ? 'wear model' : 'km estimate',
    state: stateOf(u, threshold),
    thresholdDate: r.p_threshold_date,
    endOfLifeDate: r.p_end_date,
    endOfLifeP10Date: r.p_end_p10,
    endOfLifeP90Date: r.p_end_p90,
    openingShare: r.p_opening_share,
    lifeKm,
    // the stored source is one of the contract's words (the nightly job writes it)
    lifeSource: (r.p_source ?? model?.source ?? 'prior') as LifeSource,
  };
}

/** The corner's model parameters at its nominal damping, for the lane inverses. */
export const cornerParams = (r: FittedCornerRow): CornerParams => ({
  sprungMassKg: r.sprung_mass_kg,
  unsprungMassKg: r.unsprung_mass_kg,
  springRateNPerM: r.spring_rate_n_per_m,
  dampingNsPerM: r.nominal_ns_per_m,
  tireRateNPerM: r.tire_rate_n_per_m,
});

/**
 * Present damping from a corner's lane readings (adhesion %, minimum phase, or both) with the
 * engine's inverses; with both, the better-conditioned one, named (docs/methods.md
 * "Phase-shift method"). Null with the reason when no reading explains a damping.
 *
 * @param c corner with its nominal damping [N·s/m]
 * @param pct measured adhesion [%], null if not measured
 * @param plateAmplitudeMm plate amplitude (zero-to-peak) of the lane that measured it [mm]
 * @param phaseDeg measured minimum phase [°], null if not measured
 */
export function estimateDamping(
  c: CornerParams,
  pct: number | null,
  plateAmplitudeMm: number,
  phaseDeg: number | null = null,
): { dampingNsPerM: number | null; method: 'adhesion' | 'phase' | null; note: string | null } {
  if (pct === null && phaseDeg === null) return { dampingNsPerM: null, method: null, note: null };
  try {
    const e = estimateFromLane(c, { adhesionPct: pct, phaseDeg, amplitudeM: plateAmplitudeMm / 1000 });
    // one reading alone: no need to say which it came from unless it failed
    const note = e.dampingNsPerM !== null && e.inversions.length === 1 ? null : e.note;
    return { dampingNsPerM: e.dampingNsPerM, method: e.method, note };
  } catch (e) {
    return { dampingNsPerM: null, method: null, note: `no estimate: ${(e as Error).message}` };
  }
}

/** Left–right adhesion difference per axle [points], flagged above the configured limit. */
export function axleDifferences(corners: { position: string; axleIndex: number; adhesionPct: number | null }[], limit: number) {
  const axles = [...new Set(corners.map((c) => c.axleIndex))].sort();
  return axles.map((axleIndex) => {
    const on = corners.filter((c) => c.axleIndex === axleIndex && c.adhesionPct !== null);
    const l = on.find((c) => c.position.endsWith('L'));
    const r = on.find((c) => c.position.endsWith('R'));
    const diff = l && r ? Math.abs(l.adhesionPct! - r.adhesionPct!) : null;
    return { axleIndex, differencePoints: diff, flagged: diff !== null && diff > limit, limitPoints: limit };
  });
}

/** Dampers less likely than this to need replacing within the horizon are left out of the forecast list. */
export const FORECAST_MIN_CHANCE = 0.02;

/**
 * Chance a damper reaches end of life within the horizon, given it has lasted so far: its
 * Weibull life in wear km (from the prediction's median and P10–P90) conditioned on the wear
 * km it has used, at its recent wear rate; 1 when its calendar limit falls inside the horizon.
 * Before the nightly job has run, the km estimate of its spec's model at the vehicle's
 * distance per day (severity 1).
 */
export function replacementChance(r: FittedCornerRow, st: CornerState, days: number, from: string, to: string, kmPerDay: number, model?: LifeModel): { chance: number; basis: string } {
  if (st.endOfLifeDate !== null && st.endOfLifeDate <= to && r.p_governed === 'calendar') return { chance: 1, basis: `calendar limit reached on ${st.endOfLifeDate}` };
  const z = (p: number) => Math.log(-Math.log(1 - p));
  if (r.p_life_wear_km !== null && r.p_p10_wear_km !== null && r.p_p90_wear_km !== null && r.p_wear_km !== null) {
    const sigma = (Math.log(r.p_p90_wear_km) - Math.log(r.p_p10_wear_km)) / (z(0.9) - z(0.1));
    const scale = r.p_life_wear_km / Math.pow(Math.log(2), sigma);
    const h = (w: number) => Math.pow(Math.max(0, w) / scale, 1 / sigma);
    const dw = (r.p_rate ?? 0) * days;
    const chance = 1 - Math.exp(-(h(r.p_wear_km + dw) - h(r.p_wear_km)));
    return { chance, basis: `wear model: ${Math.round(st.lifeUsedFraction * 100)} % of expected life used, ${Math.round(chance * 100)} % chance of reaching end of life by ${to}` };
  }
  if (!model) return { chance: 0, basis: 'no prediction yet' };
  const scale = r.rated_damper_life_km * Math.exp(model.beta0);
  const h = (km: number) => Math.pow(Math.max(0, km) / scale, model.shape);
  const chance = 1 - Math.exp(-(h(st.kmSinceFitted + kmPerDay * days) - h(st.kmSinceFitted)));
  return { chance, basis: `km estimate from ${from}: ${Math.round(kmPerDay)} km/day on its spec's life at the rated road (${Math.round(chance * 100)} %)` };
}
