/**
 * Opening wear: what a damper had already used when it entered the records.
 *
 * Trips are only on record from some day on; a damper fitted before that has driven distance
 * no trip covers. Its opening is that distance — the odometer since fitting (at removal, for a
 * removed damper) less the trips on record since fitting — at an energy rate per km:
 * - the damper's own recorded rate when it has at least {@link OPENING_MIN_RECORDED_KM} km of duty
 *   on record (its roads, loads and speeds, assumed unchanged before the records);
 * - otherwise its spec's reference rate, the road its rated life is stated on (ISO 8608 class B
 *   at 80 km/h).
 * The spring's fatigue damage is carried the same way. Estimated once, when the damper first
 * enters the wear records, and kept with the words it rests on (ASSUMPTION, stated in the app).
 *
 * @module
 */

import { formatKm } from './wear';

/** Recorded duty needed before a damper's own rate is used for its opening [km]. */
export const OPENING_MIN_RECORDED_KM = 1000;

export interface OpeningInput {
  /** Odometer now (or at removal) and at fitting [km]. */
  odometerKm: number;
  installedOdometerKm: number;
  /** Distance of the vehicle's trips on record since fitting [km]. */
  recordedKm: number;
  /** The damper's computed duty so far: distance [km], energy [J], spring damage [1]. */
  dutyKm: number;
  dutyEnergyJ: number;
  dutySpringDamage: number;
  /** Reference duty per km of its corner (class B, 80 km/h). */
  reference: { energyJ: number; springDamage: number };
}

export interface Opening {
  km: number;
  energyJ: number;
  springDamage: number;
  basis: string;
}


export function estimateOpening(i: OpeningInput): Opening {
  const km = Math.max(0, i.odometerKm - i.installedOdometerKm - i.recordedKm);
  if (!(km > 0)) return { km: 0, energyJ: 0, springDamage: 0, basis: 'none: the trips on record cover the odometer distance since fitting' };
  const own = i.dutyKm >= OPENING_MIN_RECORDED_KM && i.dutyEnergyJ > 0;
  const energyPerKm = own ? i.dutyEnergyJ / i.dutyKm : i.reference.energyJ;
  const springPerKm = own ? i.dutySpringDamage / i.dutyKm : i.reference.springDamage;
  const rate = `${((energyPerKm * 1000) / 1e6).toFixed(2)} MJ per 1,000 km`;
  return {
    km,
    energyJ: km * energyPerKm,
    springDamage: km * springPerKm,
    basis: own
      ? `${formatKm(km)} on the odometer since fitting that no trip on record covers, at this damper's own recorded rate (${rate} over ${formatKm(i.dutyKm)})`
      : `${formatKm(km)} on the odometer since fitting that no trip on record covers, at its spec's reference rate (${rate}: ISO 8608 class B at 80 km/h; fewer than ${formatKm(OPENING_MIN_RECORDED_KM)} on record)`,
  };
}
