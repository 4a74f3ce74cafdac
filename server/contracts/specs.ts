/** Request bodies of the suspension spec endpoints, shared with the spec editor, and a corner's parameters. */
import { z } from 'zod';
import { noHiddenChars } from './common';

export const VEHICLE_CLASSES = ['passenger car', 'light commercial', 'heavy goods'] as const;
export type VehicleClass = (typeof VEHICLE_CLASSES)[number];

/**
 * Parameters of one vehicle corner for the two-mass (quarter-car) model, SI units: what the physics
 * engine computes with (server/physics) and what the spec pages show.
 *
 * Source of the model: docs/methods.md "The corner model" (textbook two-mass model, e.g. Gillespie 1992; Wong;
 * Cebon 1999).
 *
 * @example
 * const corner: CornerParams = { sprungMassKg: 400, unsprungMassKg: 45,
 *   springRateNPerM: 22000, dampingNsPerM: 1800, tireRateNPerM: 200000 };
 */
export interface CornerParams {
  /** Body share carried by this corner [kg]. */
  sprungMassKg: number;
  /** Wheel, hub, brake and axle share of this corner [kg]. */
  unsprungMassKg: number;
  /** Suspension spring rate at the wheel [N/m]. */
  springRateNPerM: number;
  /** Damper coefficient at the wheel (linear) [N·s/m]. */
  dampingNsPerM: number;
  /** Tyre vertical stiffness [N/m]. */
  tireRateNPerM: number;
}

const num = (unit: string) => z.number({ message: `must be a number in ${unit}` }).finite(`must be a finite number in ${unit}`);

/** One axle's corner parameters (SI units) and the damper's rated life; the server checks the physical limits beyond this shape. */
export const axleBody = z.object({
  label: z.string({ message: 'is required' }).trim().min(1, 'is required').max(40, 'must be 40 characters or fewer'),
  sprungMassKg: num('kg'),
  unsprungMassKg: num('kg'),
  springRateNPerM: num('N/m'),
  dampingNsPerM: num('N·s/m'),
  tireRateNPerM: num('N/m'),
  ratedDamperLifeKm: num('km').default(90_000),
});
export type AxleBody = z.output<typeof axleBody>;

export const vehicleClass = z.enum(VEHICLE_CLASSES, { message: `must be one of ${VEHICLE_CLASSES.join(', ')}` });
const axles = z.array(axleBody, { message: 'must be a list of axles' }).min(1, 'needs at least one axle').max(6, 'at most 6 axles');

export const specBody = z
  .object({
    name: z.string({ message: 'is required' }).trim().min(2, 'must be at least 2 characters').max(120).refine(...noHiddenChars),
    vehicleClass,
    description: z.string().trim().max(2000).nullish(),
    seatFactor: z.number({ message: 'must be a number' }).min(0.2, 'must be 0.2–2 (SEAT value)').max(2, 'must be 0.2–2 (SEAT value)').nullish(),
    cabFactor: z.number({ message: 'must be a number' }).min(0.2, 'must be 0.2–1.5').max(1.5, 'must be 0.2–1.5').nullish(),
    axles,
  })
  .strict();
export type SpecBody = z.output<typeof specBody>;

export const specPreviewBody = z.object({ vehicleClass, axles }).strict();
