import { expect } from 'vitest';

/**
 * Checks a Γ function against exact identities: Γ(1) = 1, Γ(10) = 9!, Γ(3.5) = 15√π/8 and
 * Γ(x + 1) = x·Γ(x) for x below ½ (where a Lanczos form reflects), each to 12–13 digits.
 */
export function expectGammaIdentities(gamma: (x: number) => number) {
  expect(gamma(1)).toBeCloseTo(1, 13);
  expect(gamma(10) / 362880).toBeCloseTo(1, 12);
  expect(gamma(3.5)).toBeCloseTo((15 * Math.sqrt(Math.PI)) / 8, 12);
  for (const x of [0.1, 0.3, 0.45]) expect(gamma(x) / (gamma(x + 1) / x)).toBeCloseTo(1, 12);
}
