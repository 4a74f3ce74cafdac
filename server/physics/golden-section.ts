/**
 * Golden-section search for the minimum of a function of one variable that is unimodal on [a, b]:
 * each step keeps the part of the interval that holds the smaller of two inner points placed at
 * the golden ratio, so the interval shrinks by 0.618 a step at one new evaluation each.
 *
 * @module
 */

/**
 * The interval [a, b] narrowed `steps` times around the minimum of `fn` (40 steps shrink it by
 * about 4·10⁻⁹). For a maximum, pass `-fn`.
 */
export function goldenSectionMin(fn: (x: number) => number, a: number, b: number, steps = 40): [number, number] {
  const g = (Math.sqrt(5) - 1) / 2;
  let x1 = b - g * (b - a);
  let x2 = a + g * (b - a);
  let p1 = fn(x1);
  let p2 = fn(x2);
  for (let i = 0; i < steps; i++) {
    if (p1 < p2) {
      b = x2;
      x2 = x1;
      p2 = p1;
      x1 = b - g * (b - a);
      p1 = fn(x1);
    } else {
      a = x1;
      x1 = x2;
      p1 = p2;
      x2 = a + g * (b - a);
      p2 = fn(x2);
    }
  }
  return [a, b];
}
