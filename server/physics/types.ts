/**
 * Shared types, input validation and error classes of the suspension physics engine.
 *
 * Everything inside `server/physics/` works in SI units (kg, m, s, N); conversion happens at
 * the edges (CLI, services).
 *
 * @module
 */
import type { CornerParams } from '../contracts/specs';

/** Standard gravity [m/s²] (CGPM 1901, ISO 80000-3). */
export const STANDARD_GRAVITY = 9.80665;

/** Parameters of one vehicle corner for the two-mass model, kept with the contracts: the spec pages show the same. */
export type { CornerParams } from '../contracts/specs';

/**
 * Error thrown when an input to the physics engine is missing, non-finite or out of its
 * sensible range; the message names the parameter and its unit.
 *
 * @example
 * try { validateCorner({ ...corner, sprungMassKg: -1 }); }
 * catch (e) { (e as PhysicsInputError).parameter; } // → 'sprungMassKg'
 */
export class PhysicsInputError extends Error {
  /** Name of the offending parameter (e.g. `sprungMassKg`). */
  readonly parameter: string;
  /** Unit of the parameter as written in messages (e.g. `kg`). */
  readonly unit: string;

  /**
   * Build an input error.
   * @param parameter name of the parameter
   * @param unit unit of the parameter (`1` for dimensionless)
   * @param message what is wrong, without the prefix
   */
  constructor(parameter: string, unit: string, message: string) {
    super(`physics: ${parameter} [${unit}] ${message}`);
    this.name = 'PhysicsInputError';
    this.parameter = parameter;
    this.unit = unit;
  }
}

/**
 * Error thrown when a computation meets a non-finite value it cannot continue with
 * (message prefixed `physics: non-finite`).
 *
 * @example
 * new PhysicsNumericError('state after step 12').message; // → 'physics: non-finite state after step 12'
 */
export class PhysicsNumericError extends Error {
  /**
   * Build a numeric error.
   * @param what the quantity that became non-finite
   */
  constructor(what: string) {
    super(`physics: non-finite ${what}`);
    this.name = 'PhysicsNumericError';
  }
}

/**
 * Check that a value is a finite number and lies in `[min, max]` (or `(min, max]` when
 * `exclusiveMin` is set); throw a {@link PhysicsInputError} naming the parameter otherwise.
 *
 * @param name parameter name, used in the message
 * @param value the value to check [unit]
 * @param unit unit written in the message
 * @param min lower bound [unit]
 * @param max upper bound [unit]
 * @param exclusiveMin whether `min` itself is rejected (default true: strictly positive quantities)
 * @returns the value, for chaining
 * @example
 * requireInRange('speedMps', 22.2, 'm/s', 0, 100); // → 22.2
 */
export function requireInRange(
  name: string,
  value: number,
  unit: string,
  min: number,
  max: number,
  exclusiveMin = true,
): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new PhysicsInputError(name, unit, `must be a finite number, got ${String(value)}`);
  }
  if (exclusiveMin ? value <= min : value < min) {
    throw new PhysicsInputError(name, unit, `must be ${exclusiveMin ? '>' : '≥'} ${min}, got ${value}`);
  }
  if (value > max) {
    throw new PhysicsInputError(name, unit, `must be ≤ ${max}, got ${value}`);
  }
  return value;
}

/**
 * Validate a corner's parameters: finite, positive, within sensible ranges for road vehicles
 * (passenger car to heavy truck, docs/methods.md "Typical parameters" with generous margins), and unsprung mass
 * smaller than sprung mass. Throws {@link PhysicsInputError} naming the parameter and unit.
 *
 * Ranges (common practice, wide on purpose): sprung 1–20 000 kg, unsprung 0.5–5 000 kg,
 * spring 100 N/m–10 MN/m, damping 1 N·s/m–1 MN·s/m, tyre 1 kN/m–100 MN/m.
 *
 * @param c corner parameters (SI units)
 * @returns the same object, typed
 * @example
 * validateCorner({ sprungMassKg: 400, unsprungMassKg: 45, springRateNPerM: 22000,
 *   dampingNsPerM: 1800, tireRateNPerM: 200000 }); // → returns the corner unchanged
 */
export function validateCorner(c: CornerParams): CornerParams {
  if (c === null || typeof c !== 'object') {
    throw new PhysicsInputError('corner', '-', 'must be an object with sprungMassKg, unsprungMassKg, springRateNPerM, dampingNsPerM, tireRateNPerM');
  }
  requireInRange('sprungMassKg', c.sprungMassKg, 'kg', 1, 20_000, false);
  requireInRange('unsprungMassKg', c.unsprungMassKg, 'kg', 0.5, 5_000, false);
  requireInRange('springRateNPerM', c.springRateNPerM, 'N/m', 100, 1e7, false);
  requireInRange('dampingNsPerM', c.dampingNsPerM, 'N·s/m', 1, 1e6, false);
  requireInRange('tireRateNPerM', c.tireRateNPerM, 'N/m', 1e3, 1e8, false);
  if (c.unsprungMassKg >= c.sprungMassKg) {
    throw new PhysicsInputError(
      'unsprungMassKg',
      'kg',
      `must be smaller than sprungMassKg (${c.sprungMassKg} kg), got ${c.unsprungMassKg}`,
    );
  }
  return c;
}

/**
 * Validate a travel speed.
 * @param speedMps vehicle speed [m/s]; 0.1–100 m/s accepted
 * @returns the speed
 * @example
 * validateSpeed(80 / 3.6); // → 22.22…
 */
export function validateSpeed(speedMps: number): number {
  return requireInRange('speedMps', speedMps, 'm/s', 0.1, 100, false);
}
