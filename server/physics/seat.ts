/**
 * From the modelled floor to the driver's seat: the factors that turn one front corner's
 * `Wk`-weighted body acceleration into a screening estimate of the seat `a_w` (docs/methods.md "Whole-body vibration";
 * docs/methods.md "Exposure at the seat").
 *
 * @module
 */
import { requireInRange } from './types';

/**
 * Default floor-to-seat factor (SEAT value, seat effective amplitude transmissibility) by vehicle
 * class: the middle of the ranges in Griffin, Handbook of Human Vibration, 1990 (from memory,
 * docs/methods.md "Whole-body vibration"): conventional car and van seats 0.8–1.1, suspension seats of trucks and buses
 * 0.6–0.9. Editable per spec.
 */
export const SEAT_DEFAULTS: Readonly<Record<string, { seat: number; source: string }>> = Object.freeze({
  'passenger car': { seat: 0.95, source: 'conventional seat, SEAT 0.8–1.1 (typical textbook values, Griffin 1990)' },
  'light commercial': { seat: 0.95, source: 'conventional seat, SEAT 0.8–1.1 (typical textbook values, Griffin 1990)' },
  'heavy goods': { seat: 0.75, source: 'suspension seat, SEAT 0.6–0.9 (typical textbook values, Griffin 1990)' },
});

/**
 * Correlation assumed between the `Wk`-weighted body accelerations above the front axle's two
 * wheels (ours, stated): the two wheel tracks of a lane are strongly coherent at long wavelengths
 * and weakly below a few metres (Cebon, Handbook of Vehicle–Road Interaction, 1999, from memory);
 * the weighted floor acceleration lives mostly at 1–8 Hz, wavelengths of about 2–15 m at 50 km/h,
 * so a middle value of 0.5 is taken. The floor between the wheels moves as their mean, whose RMS
 * is `√((1 + ρ)/2)` of one corner's (0.87 at ρ = 0.5).
 */
export const FRONT_TRACK_CORRELATION = 0.5;

/** The factors from one front corner's floor to the seat, with what they rest on. */
export interface FloorToSeat {
  /** SEAT value used [1]. */
  seat: number;
  /** Where it comes from: 'spec' (entered) or the class default's source. */
  seatSource: string;
  /** Cab suspension transmissibility [1] (trucks; 1 = none entered). */
  cab: number;
  /** Left/right averaging factor √((1 + ρ)/2) [1]. */
  track: number;
  /** Product: a_w,seat = total · a_w,floor of one front corner. */
  total: number;
}

/**
 * Floor-to-seat factors of a spec.
 *
 * @param spec vehicle class, entered SEAT value (null = class default), entered cab factor (null = none)
 * @returns the factors and their product
 * @example
 * floorToSeat({ vehicleClass: 'light commercial', seatFactor: null, cabFactor: null }).total; // → ≈ 0.823 (0.95 × 0.866)
 */
export function floorToSeat(spec: { vehicleClass: string; seatFactor: number | null; cabFactor: number | null }): FloorToSeat {
  const def = SEAT_DEFAULTS[spec.vehicleClass] ?? SEAT_DEFAULTS['light commercial'];
  const seat = spec.seatFactor === null ? def.seat : requireInRange('seatFactor', spec.seatFactor, '1', 0.2, 2, false);
  const cab = spec.cabFactor === null ? 1 : requireInRange('cabFactor', spec.cabFactor, '1', 0.2, 1.5, false);
  const track = Math.sqrt((1 + FRONT_TRACK_CORRELATION) / 2);
  return { seat, seatSource: spec.seatFactor === null ? def.source : 'entered on the spec', cab, track, total: seat * cab * track };
}
