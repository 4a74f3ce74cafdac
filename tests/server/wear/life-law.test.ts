// Road severity where the heat factor acts (server/wear/life-law.ts; docs/methods.md, "Damper duty
// measure"). At one speed σ_rel ∝ √Gd(n0) and the mean damper power c·σ_rel² ∝ Gd(n0) (closed form),
// so on a road of k × the reference Gd(n0) at 80 km/h the sliding per km is √k × the reference and
// the power k × the reference power (computed).
import { describe, expect, it } from 'vitest';
import { HEAT_FACTOR_MAX, HEAT_SHED_FACTOR, heatFactor, REFERENCE_GD, REFERENCE_KMH, roadSeverity, severityReference, slidingM } from '../../../server/wear/life-law';
import { dutyOnRoad, prepareDuty } from '../../../server/physics/closed-form';
import { gdForClass } from '../../../server/physics/iso8608';

// a corner used by no other test, so its reference is computed here and not read from the cache
const corner = { sprungMassKg: 455, unsprungMassKg: 51, springRateNPerM: 35_500, dampingNsPerM: 2_650, tireRateNPerM: 255_000 };

describe('the reference of a corner', () => {
  it('when the reference is computed, then its power is c·σ_rel² and its sliding √(2/π)·σ_rel per metre, on class B at 80 km/h (mean |x| of a Gaussian, published identity)', () => {
    const v = REFERENCE_KMH / 3.6;
    const rms = dutyOnRoad(prepareDuty(corner, v), REFERENCE_GD).rmsRelativeVelocity;
    const r = severityReference(corner);
    expect(r.powerW).toBeCloseTo(corner.dampingNsPerM * rms ** 2, 9);
    expect(r.slidingMPerKm).toBeCloseTo((Math.sqrt(2 / Math.PI) * rms * 1000) / v, 9);
    // the same corner again: the same reference
    expect(severityReference({ ...corner })).toEqual(r);
  });

  it('when the sliding distance of a stretch is asked, then it is √(2/π)·σ_rel·t (computed)', () => {
    expect(slidingM(0.2, 100)).toBeCloseTo(Math.sqrt(2 / Math.PI) * 20, 12);
  });
});

describe('road severity with heat', () => {
  it('when the mean power is 24× the reference, then heat adds 2^((24−16)/16) = √2 to the √24 of sliding (computed)', () => {
    expect(roadSeverity(corner, 24 * REFERENCE_GD, 80)).toBeCloseTo(Math.sqrt(24) * Math.SQRT2, 6);
  });

  it('when the road is class E (power 64× the reference), then heat is capped at ×4 on sliding ×8: severity 32 (computed)', () => {
    expect(roadSeverity(corner, gdForClass('E'), 80)).toBeCloseTo(8 * HEAT_FACTOR_MAX, 6);
  });

  it('when the power is at or below 16× the reference, then there is no heat: class D at 80 km/h is sliding alone, 4 (computed)', () => {
    expect(HEAT_SHED_FACTOR).toBe(16);
    expect(roadSeverity(corner, gdForClass('D'), 80)).toBeCloseTo(4, 6);
    expect(heatFactor(15, 1)).toBe(1);
    expect(heatFactor(20, 1)).toBeCloseTo(2 ** 0.25, 12);
  });

  it('when the corner is laden, then it is measured against the unladen corner’s reference road', () => {
    const laden = { ...corner, sprungMassKg: corner.sprungMassKg + 300 };
    const v = REFERENCE_KMH / 3.6;
    const ladenRms = dutyOnRoad(prepareDuty(laden, v), REFERENCE_GD).rmsRelativeVelocity;
    const unladenRms = dutyOnRoad(prepareDuty(corner, v), REFERENCE_GD).rmsRelativeVelocity;
    expect(roadSeverity(laden, REFERENCE_GD, 80, corner)).toBeCloseTo(ladenRms / unladenRms, 9);
    expect(roadSeverity(laden, REFERENCE_GD, 80)).toBeCloseTo(1, 9);
  });
});
