import { describe, expect, it } from 'vitest';
import { estimateOpening, OPENING_MIN_RECORDED_KM } from '../../../server/wear/opening';
import { referenceDutyPerKm } from '../../../server/wear/duty';
import { dutyOnRoad, prepareDuty, ratedLifeEnergyJ } from '../../../server/physics/closed-form';
import { gdForClass, ISO8608_N0 } from '../../../server/physics/iso8608';

const front = { sprungMassKg: 430, unsprungMassKg: 46, springRateNPerM: 32000, dampingNsPerM: 2400, tireRateNPerM: 260000 };
const reference = { energyJ: 2000, springDamage: 1e-7 };

describe('opening wear (distance before the records)', () => {
  it('when the trips on record cover the odometer distance since fitting, then nothing is added', () => {
    const o = estimateOpening({ odometerKm: 51_000, installedOdometerKm: 50_000, recordedKm: 1_200, dutyKm: 1_200, dutyEnergyJ: 5e6, dutySpringDamage: 1e-4, reference });
    expect(o).toMatchObject({ km: 0, energyJ: 0, springDamage: 0 });
    expect(o.basis).toMatch(/cover/);
  });

  it("when enough duty is on record, then the unrecorded km are charged at the damper's own rate", () => {
    const o = estimateOpening({ odometerKm: 80_000, installedOdometerKm: 20_000, recordedKm: 4_000, dutyKm: 4_000, dutyEnergyJ: 4_000 * 3000, dutySpringDamage: 4_000 * 2e-7, reference });
    expect(o.km).toBe(56_000);
    expect(o.energyJ).toBeCloseTo(56_000 * 3000, 6);
    expect(o.springDamage).toBeCloseTo(56_000 * 2e-7, 12);
    expect(o.basis).toMatch(/own recorded rate \(3\.00 MJ per 1,000 km over 4,000 km\)/);
  });

  it("when too little duty is on record, then the spec's reference rate is used and said", () => {
    const o = estimateOpening({ odometerKm: 30_000, installedOdometerKm: 0, recordedKm: 500, dutyKm: OPENING_MIN_RECORDED_KM - 1, dutyEnergyJ: 9e9, dutySpringDamage: 1, reference });
    expect(o.km).toBe(29_500);
    expect(o.energyJ).toBeCloseTo(29_500 * reference.energyJ, 6);
    expect(o.springDamage).toBeCloseTo(29_500 * reference.springDamage, 15);
    expect(o.basis).toMatch(/reference rate .*class B at 80 km\/h/);
  });

  it('when the odometer reads less than the trips on record, then nothing is added (never negative)', () => {
    expect(estimateOpening({ odometerKm: 10_000, installedOdometerKm: 9_000, recordedKm: 2_500, dutyKm: 2_500, dutyEnergyJ: 1e7, dutySpringDamage: 0, reference }).km).toBe(0);
  });

  it("when a corner's reference duty per km is computed, then its energy is the rated life energy per rated km (both class B at 80 km/h, computed)", () => {
    const r = referenceDutyPerKm(front);
    expect(r.energyJ).toBeCloseTo(ratedLifeEnergyJ(front, { km: 90_000 }) / 90_000, 9);
    expect(r.springDamage).toBeGreaterThan(0);
  });

  it('when the reference energy per km is computed for different corners, then it is π²·kt·Gd(n0)·n0² per metre whatever the masses and damping (white road), less the little the road band removes', () => {
    // On a w = 2 road the road velocity is white noise (one-sided PSD 4π²·Gd·n0²·v per Hz); the
    // mean power a spring kt feeds from such an input into a damped system is kt·G/4, all of it
    // dissipated in the damper: P = π²·kt·Gd·n0²·v, so energy per km = π²·kt·Gd·n0²·1000,
    // independent of sprung and unsprung mass, spring and damping (computed; the independence
    // is a known property of white-noise velocity input, from memory).
    const gd = gdForClass('B');
    for (const c of [front, { ...front, sprungMassKg: 600 }, { ...front, unsprungMassKg: 90, dampingNsPerM: 4000 }, { ...front, springRateNPerM: 60000, tireRateNPerM: 520000 }]) {
      const expected = Math.PI ** 2 * c.tireRateNPerM * gd * ISO8608_N0 ** 2 * 1000;
      const white = dutyOnRoad(prepareDuty(c, 80 / 3.6, { maxCyclesPerM: 'unlimited' }), gd).damperEnergyJPerKm;
      expect(Math.abs(white / expected - 1)).toBeLessThan(1e-9);
      // the app's road band (wavelengths ≥ 0.6 m, 37 Hz at 80 km/h) takes off under 2 % (computed)
      const ratio = referenceDutyPerKm(c).energyJ / expected;
      expect(ratio).toBeGreaterThan(0.98);
      expect(ratio).toBeLessThan(1);
    }
  });
});
