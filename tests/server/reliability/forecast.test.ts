/** The forecast's replacement chance (server/workshop/service.ts replacementChance); computed checks. */
import { describe, expect, it } from 'vitest';
import { replacementChance, type CornerState } from '../../../server/workshop/corners';
import type { FittedCornerRow } from '../../../server/workshop/repository';

const z = (p: number) => Math.log(-Math.log(1 - p));
/** A prediction row of a Weibull life with shape k and scale λ (in wear km), at wear w and rate r per day. */
function row(k: number, scale: number, w: number, rate: number, governed = 'distance'): FittedCornerRow {
  const q = (p: number) => scale * Math.exp(z(p) / k);
  return { p_life_wear_km: q(0.5), p_p10_wear_km: q(0.1), p_p90_wear_km: q(0.9), p_wear_km: w, p_rate: rate, p_governed: governed } as unknown as FittedCornerRow;
}
const st = { lifeUsedFraction: 0.5, endOfLifeDate: '2027-06-01', kmSinceFitted: 0 } as CornerState;

describe('replacement chance within the horizon', () => {
  it('is the conditional Weibull probability of failing in the next Δw given survival to w: 1 − exp(−((w+Δw)/λ)^k + (w/λ)^k)', () => {
    const k = 2.5, scale = 100_000, w = 60_000, rate = 100, days = 90;
    const expected = 1 - Math.exp(-(((w + rate * days) / scale) ** k) + (w / scale) ** k);
    expect(replacementChance(row(k, scale, w, rate), st, days, '2026-12-01', '2027-03-01', 0).chance).toBeCloseTo(expected, 9);
  });

  it('grows with the wear already used (wear-out, shape > 1)', () => {
    const a = replacementChance(row(3, 100_000, 20_000, 100), st, 90, '2026-12-01', '2027-03-01', 0).chance;
    const b = replacementChance(row(3, 100_000, 90_000, 100), st, 90, '2026-12-01', '2027-03-01', 0).chance;
    expect(b).toBeGreaterThan(a * 5);
  });

  it('is 1 when the calendar limit falls inside the horizon', () => {
    expect(replacementChance(row(3, 100_000, 1_000, 10, 'calendar'), { ...st, endOfLifeDate: '2027-01-15' }, 90, '2026-12-01', '2027-03-01', 0).chance).toBe(1);
  });
});
