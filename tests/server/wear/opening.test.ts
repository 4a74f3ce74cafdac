import { describe, expect, it } from 'vitest';
import { estimateOpening } from '../../../server/wear/wear';
import { referenceDutyPerKm } from '../../../server/wear/duty';
import { HEAT_FACTOR_MAX, heatFactor, roadSeverity, severityReference } from '../../../server/wear/life-law';
import { dutyOnRoad, prepareDuty, ratedLifeEnergyJ } from '../../../server/physics/closed-form';
import { gdForClass, ISO8608_N0 } from '../../../server/physics/iso8608';

const front = { sprungMassKg: 430, unsprungMassKg: 46, springRateNPerM: 32000, dampingNsPerM: 2400, tireRateNPerM: 260000 };

describe('opening wear (distance before the records), stated rule', () => {
  it('when the trips on record cover the distance since fitting, then nothing is added', () => {
    const o = estimateOpening({ untrackedKm: 0, recordedKm: 1_200, recordedWearKm: 2_400 });
    expect(o).toMatchObject({ km: 0, wearKm: 0 });
    expect(o.basis).toMatch(/cover/);
  });

  it('when the record is shorter than the untracked distance, then it never exceeds the prior share: the rated road rate, however rough the record', () => {
    for (const recordedPerKm of [0.5, 1, 3, 13]) {
      const o = estimateOpening({ untrackedKm: 11_661, recordedKm: 1_188, recordedWearKm: 1_188 * recordedPerKm });
      expect(o.wearKm).toBeCloseTo(11_661, 9);
      expect(o.perKm).toBe(1);
      // the range spans the two rates
      expect(o.lowWearKm).toBeCloseTo(11_661 * Math.min(1, recordedPerKm), 6);
      expect(o.highWearKm).toBeCloseTo(11_661 * Math.max(1, recordedPerKm), 6);
    }
  });

  it("when the damper's own record is at least as long as the untracked distance, then its own rate is used and said", () => {
    const o = estimateOpening({ untrackedKm: 4_000, recordedKm: 6_000, recordedWearKm: 6_000 * 1.6 });
    expect(o.wearKm).toBeCloseTo(4_000 * 1.6, 9);
    expect(o.basis).toMatch(/own recorded rate \(1\.60×/);
  });

  it('when the odometer reads less than the trips on record, then nothing is added (never negative)', () => {
    expect(estimateOpening({ untrackedKm: -1_500, recordedKm: 2_500, recordedWearKm: 2_500 }).km).toBe(0);
  });
});

describe('road severity (the damper duty measure)', () => {
  it('is 1 on the rated road: ISO 8608 class B at 80 km/h, unladen (stated convention)', () => {
    expect(roadSeverity(front, gdForClass('B'), 80)).toBeCloseTo(1, 9);
  });

  it('doubles per ISO class step at the same speed: rod sliding per km ∝ √Gd(n0) (docs/methods.md "Damper life model", computed)', () => {
    expect(roadSeverity(front, gdForClass('C'), 80)).toBeCloseTo(2, 6);
    expect(roadSeverity(front, gdForClass('D'), 80)).toBeCloseTo(4, 6);
  });

  it('rises at lower speed on the same road, by up to 1/√v (σ_rel ∝ √(Gd·v) on a white road, per km ÷ v; computed): less, as the road band (wavelengths ≥ 0.6 m) removes more at low speed', () => {
    const r = roadSeverity(front, gdForClass('B'), 20) / roadSeverity(front, gdForClass('B'), 80);
    expect(r).toBeGreaterThan(1.2);
    expect(r).toBeLessThanOrEqual(2 + 1e-9);
  });

  it('adds heat only above 16× the reference power, at most ×4 (stated assumption)', () => {
    const ref = severityReference(front).powerW;
    expect(heatFactor(16 * ref, ref)).toBe(1);
    expect(heatFactor(32 * ref, ref)).toBeCloseTo(2, 9);
    expect(heatFactor(1000 * ref, ref)).toBe(HEAT_FACTOR_MAX);
  });

  it('reference sliding distance is √(2/π)·σ_rel per metre travelled (mean |x| of a Gaussian, published identity)', () => {
    const r = severityReference(front);
    expect(r.slidingMPerKm).toBeGreaterThan(0);
    expect(r.powerW / front.dampingNsPerM).toBeCloseTo(((r.slidingMPerKm * (80 / 3.6)) / 1000 / Math.sqrt(2 / Math.PI)) ** 2, 9);
  });
});

describe('reference duty per km', () => {
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
