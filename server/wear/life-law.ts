/**
 * The damper's duty measure: road severity. See docs/methods.md, "Damper duty measure".
 *
 * Seal, rod-guide and bush wear follow the rod's sliding distance; on a Gaussian response the
 * mean absolute relative velocity is √(2/π)·σ_rel, so the sliding distance per km is
 * √(2/π)·σ_rel / v — on a `w = 2` road ∝ √(Gd(n0)/v), twice per ISO 8608 class step (docs/methods.md
 * §7). Oil and valve ageing speed up with heat, and heat matters only above the mean power a
 * damper sheds easily: above {@link HEAT_SHED_FACTOR} × its reference power, each further such
 * step of mean power is taken to double the wear rate (ASSUMPTION: the oil runs about 10 K
 * hotter per step and ageing rates commonly double per ~10 K, common practice), capped at
 * {@link HEAT_FACTOR_MAX}.
 *
 * Severity of a stretch = its sliding distance per km × heat factor, relative to the same
 * corner (unladen) on the road its rated life is stated on: ISO 8608 class B (mean) at
 * 80 km/h. Severity 1 is that road; class C at 80 km/h is about 2, class D about 4.
 *
 * @module
 */
import { dutyOnRoad, prepareDuty } from '../physics/closed-form';
import { gdForClass } from '../physics/iso8608';
import type { CornerParams } from '../physics/types';

/** Mean |x| / RMS of a zero-mean Gaussian: √(2/π). */
export const MEAN_ABS_PER_RMS = Math.sqrt(2 / Math.PI);
/** Mean power a damper sheds easily, as a multiple of its reference power (assumption). */
export const HEAT_SHED_FACTOR = 16;
/** Upper bound of the heat factor (assumption). */
export const HEAT_FACTOR_MAX = 4;
/** Reference road of the rated life. */
export const REFERENCE_GD = gdForClass('B');
export const REFERENCE_KMH = 80;

export interface SeverityReference {
  /** Rod sliding distance per km on the reference road [m/km]. */
  slidingMPerKm: number;
  /** Mean damper power on the reference road [W]. */
  powerW: number;
}

const refCache = new Map<string, SeverityReference>();

/** The reference sliding distance and power of an (unladen) corner. Cached per corner. */
export function severityReference(c: CornerParams): SeverityReference {
  const key = `${c.sprungMassKg}/${c.unsprungMassKg}/${c.springRateNPerM}/${c.dampingNsPerM}/${c.tireRateNPerM}`;
  let r = refCache.get(key);
  if (!r) {
    const v = REFERENCE_KMH / 3.6;
    const d = dutyOnRoad(prepareDuty(c, v), REFERENCE_GD);
    r = Object.freeze({ slidingMPerKm: (MEAN_ABS_PER_RMS * d.rmsRelativeVelocity * 1000) / v, powerW: c.dampingNsPerM * d.rmsRelativeVelocity ** 2 });
    if (refCache.size > 10_000) refCache.clear();
    refCache.set(key, r);
  }
  return r;
}

/** Heat factor of a stretch at mean damper power `powerW` for a damper whose reference power is `refPowerW`. */
export function heatFactor(powerW: number, refPowerW: number): number {
  const shed = HEAT_SHED_FACTOR * refPowerW;
  if (!(powerW > shed)) return 1;
  return Math.min(HEAT_FACTOR_MAX, Math.pow(2, (powerW - shed) / shed));
}

/** Rod sliding distance [m] over `seconds` at relative-velocity RMS `rms` [m/s]. */
export const slidingM = (rms: number, seconds: number) => MEAN_ABS_PER_RMS * rms * seconds;

/**
 * Severity of a whole-life road: a corner (as loaded) on a `w = 2` road of `gdN0` [m³] at
 * `speedKmh`, against the unladen corner's reference (closed form).
 */
export function roadSeverity(corner: CornerParams, gdN0: number, speedKmh: number, unladen: CornerParams = corner): number {
  const v = speedKmh / 3.6;
  const d = dutyOnRoad(prepareDuty(corner, v), gdN0);
  const ref = severityReference(unladen);
  const perKm = (MEAN_ABS_PER_RMS * d.rmsRelativeVelocity * 1000) / v;
  return (perKm / ref.slidingMPerKm) * heatFactor(corner.dampingNsPerM * d.rmsRelativeVelocity ** 2, ref.powerW);
}
