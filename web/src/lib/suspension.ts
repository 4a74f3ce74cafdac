/**
 * Shared vocabulary of suspension specs (as the API sends them) and the quick, derived figures
 * an engineer reads a spec by. All inputs in SI units.
 */

import type { CornerParams } from '@contracts/specs';

export type { CornerParams } from '@contracts/specs';

export interface SpecAxle {
  /** 0 for the front axle, counting rearwards. */
  axleIndex: number;
  /** `front`, `rear`, `middle`… */
  label: string;
  corner: CornerParams;
  /** Rated damper life on this axle [km]. */
  ratedDamperLifeKm: number;
  /** The corner's modes from the server's two-mass model (the spec editor shows the same). */
  modes?: CornerModes;
}

/** Natural frequencies [Hz] and damping ratios [1] of the two-mass corner's two modes. */
export interface CornerModes {
  bodyHz: number;
  bodyDampingRatio: number;
  wheelHz: number;
  wheelDampingRatio: number;
}

export interface SuspensionSpec {
  id: number;
  name: string;
  vehicleClass: string;
  description: string | null;
  /** Floor-to-seat factors for drivers' exposure: entered (null = class default / none) and used. */
  seat?: { seatFactor: number | null; cabFactor: number | null; used: { seat: number; seatSource: string; cab: number; track: number; total: number } };
  axles: SpecAxle[];
}

const TWO_PI = 2 * Math.PI;

/**
 * Body bounce frequency [Hz], from the ride rate (spring and tyre in series) on the sprung mass:
 * f = √(kr/ms) / 2π with kr = ks·kt / (ks + kt). The one-mass approximation of the two-mass model's
 * lower mode (Gillespie 1992, ch. 5). Example: ms 400 kg, ks 40 kN/m, kt 300 kN/m → 1.50 Hz.
 */
export function bodyBounceHz(c: CornerParams): number {
  const kr = (c.springRateNPerM * c.tireRateNPerM) / (c.springRateNPerM + c.tireRateNPerM);
  return Math.sqrt(kr / c.sprungMassKg) / TWO_PI;
}

/**
 * Wheel hop frequency [Hz]: the unsprung mass between spring and tyre, f = √((ks + kt)/mu) / 2π
 * (Gillespie 1992, ch. 5). Example: mu 60 kg, ks 40 kN/m, kt 300 kN/m → 12.0 Hz.
 */
export function wheelHopHz(c: CornerParams): number {
  return Math.sqrt((c.springRateNPerM + c.tireRateNPerM) / c.unsprungMassKg) / TWO_PI;
}

/**
 * Body damping ratio [–] (fraction of critical): ζ = cs / (2·√(ks·ms)).
 * Example: cs 3000 N·s/m, ks 40 kN/m, ms 400 kg → 0.375.
 */
export function dampingRatio(c: CornerParams): number {
  return c.dampingNsPerM / (2 * Math.sqrt(c.springRateNPerM * c.sprungMassKg));
}

const axleNames: Record<string, string> = { front: 'Front', rear: 'Rear', middle: 'Middle', mid: 'Middle' };

export function axleLabel(axle: string): string {
  return axleNames[axle.toLowerCase()] ?? axle.charAt(0).toUpperCase() + axle.slice(1);
}
