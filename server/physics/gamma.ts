/** Γ, the gamma function: the spectral fatigue of the spring (Dirlik) and the mean of a Weibull life use it. */

/**
 * Gamma function for positive arguments (Lanczos approximation, g = 7, 9 terms; relative error
 * ~1e-15). Source: Lanczos 1964, coefficients as in Numerical Recipes (3rd ed.) §6.1 / common
 * practice.
 *
 * @param x argument, > 0
 * @returns Γ(x)
 * @example
 * gamma(5); // → 24
 */
export function gamma(x: number): number {
  const g = 7;
  const c = [
    0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059,
    12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7,
  ];
  if (x < 0.5) return Math.PI / (Math.sin(Math.PI * x) * gamma(1 - x));
  const z = x - 1;
  let a = c[0];
  const t = z + g + 0.5;
  for (let i = 1; i < 9; i++) a += c[i] / (z + i);
  return Math.sqrt(2 * Math.PI) * t ** (z + 0.5) * Math.exp(-t) * a;
}
