/**
 * Assertion helpers for the physics tests: every check states its source and prints the
 * inputs, the value, the expectation and the tolerance when it fails.
 */
import { expect } from 'vitest';

/** Where an expected value comes from. */
export type Source = string;

/** Format inputs for a failure message. */
function fmt(inputs: unknown): string {
  return JSON.stringify(inputs, (_k, v: unknown) => (typeof v === 'number' && !Number.isFinite(v) ? String(v) : v));
}

/**
 * Check |value − expected| ≤ absTol + relTol·|expected|.
 * @param value computed value
 * @param expected expected value
 * @param tol absolute and/or relative tolerance
 * @param source where the expectation comes from (published source, "computed", …)
 * @param inputs inputs of the computation, printed on failure
 */
export function checkClose(
  value: number,
  expected: number,
  tol: { abs?: number; rel?: number },
  source: Source,
  inputs: unknown = {},
): void {
  const allowed = (tol.abs ?? 0) + (tol.rel ?? 0) * Math.abs(expected);
  const err = Math.abs(value - expected);
  const ok = Number.isFinite(value) && err <= allowed;
  expect(
    ok,
    `[${source}] inputs ${fmt(inputs)}: got ${value}, expected ${expected}, |error| ${err.toExponential(3)} > tolerance ${allowed.toExponential(3)} (abs ${tol.abs ?? 0}, rel ${tol.rel ?? 0})`,
  ).toBe(true);
}

/**
 * Check lo ≤ value ≤ hi.
 * @param value computed value
 * @param lo lower bound
 * @param hi upper bound
 * @param source where the range comes from
 * @param inputs inputs, printed on failure
 */
export function checkRange(value: number, lo: number, hi: number, source: Source, inputs: unknown = {}): void {
  expect(
    Number.isFinite(value) && value >= lo && value <= hi,
    `[${source}] inputs ${fmt(inputs)}: got ${value}, expected within [${lo}, ${hi}]`,
  ).toBe(true);
}

/**
 * Check a boolean condition with a descriptive message.
 * @param ok the condition
 * @param source where the expectation comes from
 * @param message what was expected, with values
 */
export function checkThat(ok: boolean, source: Source, message: string): void {
  expect(ok, `[${source}] ${message}`).toBe(true);
}

/** What `f` throws, or null when it returns. */
export function thrownBy(f: () => unknown): unknown {
  try {
    f();
  } catch (e) {
    return e;
  }
  return null;
}

/** The message of the error `f` throws, or '' when it returns (for checking a refusal's wording). */
export function errorOf(f: () => unknown): string {
  const e = thrownBy(f);
  return e === null ? '' : (e as Error).message;
}

/** A typical passenger-car corner (demo values in the docs/methods.md "Typical parameters" ranges). */
export const CAR = Object.freeze({
  sprungMassKg: 400,
  unsprungMassKg: 45,
  springRateNPerM: 22000,
  dampingNsPerM: 1800,
  tireRateNPerM: 200000,
});

/** Unladen corners of the demo fleet's specs (server/demo/seed.ts), for checks on what the fleet would read. */
export const DEMO_CORNERS = Object.freeze({
  courierVanFront: { sprungMassKg: 430, unsprungMassKg: 46, springRateNPerM: 32000, dampingNsPerM: 2400, tireRateNPerM: 260000 },
  courierVanRear: { sprungMassKg: 360, unsprungMassKg: 55, springRateNPerM: 38000, dampingNsPerM: 2500, tireRateNPerM: 270000 },
  longVanFront: { sprungMassKg: 600, unsprungMassKg: 58, springRateNPerM: 45000, dampingNsPerM: 3200, tireRateNPerM: 300000 },
  longVanRear: { sprungMassKg: 520, unsprungMassKg: 76, springRateNPerM: 56000, dampingNsPerM: 3300, tireRateNPerM: 320000 },
  truckFront: { sprungMassKg: 2400, unsprungMassKg: 450, springRateNPerM: 600000, dampingNsPerM: 28000, tireRateNPerM: 1600000 },
  truckRear: { sprungMassKg: 2100, unsprungMassKg: 650, springRateNPerM: 260000, dampingNsPerM: 20000, tireRateNPerM: 1800000 },
});
