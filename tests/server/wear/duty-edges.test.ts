/**
 * The duty of a trip at its edges: positions and payload of more than two axles, the speed and
 * mass bands, stretches that are unrated or of no length, trips that cannot be computed, and the
 * wear a batch adds to each damper. Expected values are worked out here from the stated rules
 * (module doc of server/wear/duty.ts, docs/methods.md).
 */
import { describe, expect, it } from 'vitest';
import {
  axlePositions,
  computeVehicleDuty,
  cornerPayloadKg,
  damperOn,
  DutyCache,
  massBand,
  referenceDutyPerKm,
  speedBand,
  springSnCurve,
  type RouteInput,
  type SegmentInput,
  type VehicleWork,
} from '../../../server/wear/duty';
import { roadSeverity } from '../../../server/wear/life-law';
import { gdForClass, synthesizeProfile } from '../../../server/physics/iso8608';

const corner = { sprungMassKg: 430, unsprungMassKg: 46, springRateNPerM: 32000, dampingNsPerM: 2400, tireRateNPerM: 260000 };
const seg = (id: number, startM: number, endM: number, gdN0: number | null, speedKmh: number | null = null, profile: SegmentInput['profile'] = null): SegmentInput => ({ id, startM, endM, speedKmh, gdN0, profile });
const one = (segments: SegmentInput[], lengthM = 1000): Map<number, RouteInput> => new Map([[1, { id: 1, lengthM, segments }]]);
const work = (trips: Partial<VehicleWork['trips'][number]>[], axles = 1): VehicleWork => ({
  vehicleId: 1,
  axles: Array.from({ length: axles }, (_, i) => ({ axleIndex: i, corner, ratedDamperLifeKm: 90000 })),
  dampers: [
    { id: 10, position: 'FL', axleIndex: 0, installedAt: '2026-11-02', removedAt: null },
    { id: 9, position: 'FL', axleIndex: 0, installedAt: '2026-01-01', removedAt: '2026-11-02' },
    { id: 11, position: 'FR', axleIndex: 0, installedAt: '2026-01-01', removedAt: null },
  ],
  trips: trips.map((t, i) => ({ id: i + 1, routeId: 1, driverId: 5, tripDate: '2026-11-03', durationS: 90, distanceKm: 1, meanSpeedKmh: 80, payloadKg: null, ...t })),
});

describe('axles, payload and bands', () => {
  it('when a vehicle has three axles, then the middle one is L2/R2 and carries its share of the rear payload; a single axle carries it all', () => {
    expect(axlePositions(0, 3)).toEqual(['FL', 'FR']);
    expect(axlePositions(1, 3)).toEqual(['L2', 'R2']);
    expect(axlePositions(2, 3)).toEqual(['RL', 'RR']);
    expect(axlePositions(0, 1)).toEqual(['FL', 'FR']);
    // 30 % on the front axle, the other 70 % shared by the axles behind, half per corner
    expect(cornerPayloadKg(1000, 0, 3)).toBeCloseTo(150, 12);
    expect(cornerPayloadKg(1000, 1, 3)).toBeCloseTo(175, 12);
    expect(cornerPayloadKg(1000, 2, 3)).toBeCloseTo(175, 12);
    expect(cornerPayloadKg(1000, 0, 1)).toBe(500);
    expect(cornerPayloadKg(0, 0, 2)).toBe(0);
    expect(cornerPayloadKg(-5, 1, 2)).toBe(0);
    expect(cornerPayloadKg(Number.NaN, 1, 2)).toBe(0);
  });

  it('when speeds and masses are banded, then speed goes to the nearest 5 km/h (never below 5) and mass to the nearest power of 1.1 kg', () => {
    expect(speedBand(52.4)).toBe(50);
    expect(speedBand(52.5)).toBe(55);
    expect(speedBand(57.6)).toBe(60);
    expect(speedBand(1)).toBe(5);
    expect(speedBand(0)).toBe(5);
    // ln 430 / ln 1.1 = 63.62 → 1.1^64 = 445.0
    expect(massBand(430)).toBeCloseTo(1.1 ** 64, 9);
    // ln 400 / ln 1.1 = 62.86 → 1.1^63
    expect(massBand(400)).toBeCloseTo(1.1 ** 63, 9);
  });

  it('when the spring curve is built, then C = 2·10⁷ × static deflection⁵ with k = 5 (stated assumption, computed)', () => {
    const d = (430 * 9.80665) / 32000;
    const sn = springSnCurve(corner);
    expect(sn.k).toBe(5);
    expect(sn.C / (2e7 * d ** 5)).toBeCloseTo(1, 12);
  });

  it('when the reference duty is asked twice, then the same frozen answer is given', () => {
    const a = referenceDutyPerKm(corner);
    expect(referenceDutyPerKm({ ...corner })).toBe(a);
    expect(Object.isFrozen(a)).toBe(true);
    expect(a.energyJ).toBeGreaterThan(0);
    expect(a.springDamage).toBeGreaterThan(0);
  });
});

describe('which damper a record goes to', () => {
  it('when a damper is removed on a day, then a trip that day goes to the one fitted that day', () => {
    const w = work([]);
    expect(damperOn(w.dampers, 'FL', '2026-11-01')?.id).toBe(9);
    expect(damperOn(w.dampers, 'FL', '2026-11-02')?.id).toBe(10);
    expect(damperOn(w.dampers, 'FR', '2025-12-31')).toBeNull();
    expect(damperOn(w.dampers, 'RL', '2026-11-02')).toBeNull();
  });

  it('when trips are not in day order, then each damper\'s wear starts on its earliest trip day and sums the energy and spring damage of its records; a corner with no damper adds none', () => {
    const r = computeVehicleDuty(work([{ tripDate: '2026-11-05' }, { tripDate: '2026-11-03', distanceKm: 2 }, { tripDate: '2026-11-04' }]), one([seg(1, 0, 1000, gdForClass('C'))]), new DutyCache());
    expect(r.errors).toEqual([]);
    const fl = r.duties.filter((d) => d.position === 'FL');
    expect(fl.map((d) => d.damperId)).toEqual([10, 10, 10]);
    const w10 = r.wear.find((w) => w.damperId === 10)!;
    expect(w10.firstDay).toBe('2026-11-03');
    expect(w10.energyJ).toBeCloseTo(fl.reduce((s, d) => s + d.energyJ, 0), 9);
    expect(w10.springDamage).toBeCloseTo(fl.reduce((s, d) => s + d.springDamage, 0), 15);
    // the trip of twice the distance adds twice the duty
    expect(fl[1].energyJ / fl[0].energyJ).toBeCloseTo(2, 12);
    expect(fl[1].springDamage / fl[0].springDamage).toBeCloseTo(2, 12);
    expect(r.wear.map((w) => w.damperId).sort()).toEqual([10, 11]);
    // before damper 10 was fitted, front-left wear goes to the damper then fitted
    const early = computeVehicleDuty(work([{ tripDate: '2026-11-01' }]), one([seg(1, 0, 1000, gdForClass('C'))]), new DutyCache());
    expect(early.wear.map((w) => [w.damperId, w.firstDay])).toEqual([[9, '2026-11-01'], [11, '2026-11-01']]);
    expect(early.duties.map((d) => [d.position, d.damperId, d.driverId, d.durationS, d.axleIndex])).toEqual([['FL', 9, 5, 90, 0], ['FR', 11, 5, 90, 0]]);
  });
});

describe('stretches and trips at the edges', () => {
  it('when half the distance is unrated, then severity counts it as 1 and the rated half at its own severity; energy and RMS come from the rated half alone (stated rule, computed)', () => {
    const gd = gdForClass('D');
    const full = computeVehicleDuty(work([{}]), one([seg(1, 0, 1000, gd)]), new DutyCache()).duties[0];
    const half = computeVehicleDuty(work([{}]), one([seg(1, 0, 500, gd), seg(2, 500, 1000, null)]), new DutyCache()).duties[0];
    // class D at 80 km/h on the unladen corner: severity 4 (life-law.ts, sliding per km ∝ √Gd)
    const sD = roadSeverity({ ...corner, sprungMassKg: massBand(430) }, gd, 80, corner);
    expect(full.severity).toBeCloseTo(sD, 9);
    expect(sD).toBeGreaterThan(3.5);
    expect(half.severity).toBeCloseTo((sD * 0.5 + 1 * 0.5) / 1, 9);
    expect(half.energyJ).toBeCloseTo(full.energyJ / 2, 6);
    // RMS over the rated time: the same road, the same RMS
    expect(half.rmsWeightedAccel).toBeCloseTo(full.rmsWeightedAccel, 12);
    expect(half.meanPowerW).toBeCloseTo(full.meanPowerW, 9);
    // mean power = energy / time on the rated stretches: 1 km at 80 km/h is 45 s
    expect(full.meanPowerW).toBeCloseTo(full.energyJ / 45, 9);
    expect(half.slidingM).toBeCloseTo(full.slidingM / 2, 9);
    expect([half.segments, half.unratedSegments, half.profiledSegments]).toEqual([2, 1, 0]);
  });

  it('when no stretch is rated or has a length, then severity is 1 and every RMS and the power are 0', () => {
    const r = computeVehicleDuty(work([{}, {}]), one([seg(1, 0, 1000, null)]), new DutyCache()).duties[0];
    expect(r).toMatchObject({ severity: 1, energyJ: 0, meanPowerW: 0, rmsRelativeVelocity: 0, rmsWeightedAccel: 0, rmsBodyAccel: 0, rmsSuspensionTravel: 0, rmsTireLoadRatio: 0, springDamage: 0, slidingM: 0, unratedSegments: 1 });
    // a stretch of no length is skipped, not counted as unrated
    const empty = computeVehicleDuty(work([{}]), one([seg(1, 500, 500, gdForClass('B'))]), new DutyCache()).duties[0];
    expect(empty).toMatchObject({ severity: 1, energyJ: 0, unratedSegments: 0, segments: 1 });
  });

  it('when the route has no length, then its stretches count at their own length whatever the trip distance', () => {
    const a = computeVehicleDuty(work([{ distanceKm: 7 }]), one([seg(1, 0, 1000, gdForClass('C'))], 0), new DutyCache()).duties[0];
    const b = computeVehicleDuty(work([{ distanceKm: 1 }]), one([seg(1, 0, 1000, gdForClass('C'))], 1000), new DutyCache()).duties[0];
    expect(a.energyJ).toBeCloseTo(b.energyJ, 9);
    expect(a.distanceKm).toBe(7);
  });

  it('when a stretch has its own speed, then it is computed at that speed, not the trip\'s', () => {
    const own = computeVehicleDuty(work([{ meanSpeedKmh: 80 }]), one([seg(1, 0, 1000, gdForClass('C'), 40)]), new DutyCache()).duties[0];
    const at40 = computeVehicleDuty(work([{ meanSpeedKmh: 40 }]), one([seg(1, 0, 1000, gdForClass('C'))]), new DutyCache()).duties[0];
    expect(own.energyJ).toBe(at40.energyJ);
    expect(own.meanPowerW).toBe(at40.meanPowerW);
  });

  it('when a trip has no positive mean speed or a non-finite duty (a stretch without end), then it is reported and the other trips are computed', () => {
    const w = work([{ meanSpeedKmh: 0 }, { meanSpeedKmh: Number.NaN }, {}]);
    const r = computeVehicleDuty(w, one([seg(1, 0, 1000, gdForClass('B'))]), new DutyCache());
    expect(r.errors).toEqual([
      { tripId: 1, message: 'mean speed 0 km/h is not positive' },
      { tripId: 2, message: 'mean speed NaN km/h is not positive' },
    ]);
    expect(r.duties.map((d) => d.tripId)).toEqual([3, 3]);
    expect(r.segments).toBe(1);
    const inf = computeVehicleDuty(work([{}, {}]), new Map([[1, { id: 1, lengthM: 1000, segments: [seg(1, 0, Number.POSITIVE_INFINITY, gdForClass('B'))] }]]), new DutyCache());
    expect(inf.errors).toEqual([{ tripId: 1, message: 'non-finite duty on FL' }, { tripId: 2, message: 'non-finite duty on FL' }]);
    expect(inf.duties).toEqual([]);
    expect(inf.wear).toEqual([]);
    expect(inf.segments).toBe(0);
  });

  it('when a profile does not cover a stretch, then the stretch is computed on its stated class; without one it is unrated', () => {
    const gd = gdForClass('C');
    const profile = { surveyId: 3, dxM: 0.25, startM: 2000, elevationsM: synthesizeProfile({ gdN0: gd, lengthM: 400, dxM: 0.25, seed: 5 }) };
    const cache = new DutyCache();
    const off = computeVehicleDuty(work([{}]), one([seg(1, 0, 1000, gd, null, profile)]), cache).duties[0];
    const plain = computeVehicleDuty(work([{}]), one([seg(1, 0, 1000, gd)]), new DutyCache()).duties[0];
    expect(off.energyJ).toBe(plain.energyJ);
    expect(off.profiledSegments).toBe(0);
    expect(cache.simulations).toBe(0);
    const none = computeVehicleDuty(work([{}]), one([seg(1, 0, 1000, null, null, profile)]), new DutyCache()).duties[0];
    expect(none).toMatchObject({ unratedSegments: 1, energyJ: 0, severity: 1 });
    // a profile that ends a quarter metre into the stretch (fewer than 4 samples on it) does not cover it either
    const short = { ...profile, startM: -100, elevationsM: profile.elevationsM.subarray(0, 402) };
    expect(computeVehicleDuty(work([{}]), one([seg(1, 0, 1000, gd, null, short)]), new DutyCache()).duties[0].profiledSegments).toBe(0);
  });

  it('when a profiled stretch is driven again, then its simulation is reused; a second corner or speed simulates again', () => {
    const gd = gdForClass('C');
    const profile = { surveyId: 4, dxM: 0.25, startM: 0, elevationsM: synthesizeProfile({ gdN0: gd, lengthM: 1100, dxM: 0.25, seed: 9 }) };
    const cache = new DutyCache();
    const r = computeVehicleDuty(work([{}, {}, { meanSpeedKmh: 50 }]), one([seg(1, 0, 1000, gd, null, profile)]), cache);
    expect(r.duties.map((d) => d.profiledSegments)).toEqual([1, 1, 1, 1, 1, 1]);
    // FL and FR share the corner: 80 km/h once, 50 km/h once
    expect(cache.simulations).toBe(2);
    expect(r.duties[2].energyJ).toBe(r.duties[0].energyJ);
    expect(r.duties[4].energyJ).not.toBe(r.duties[0].energyJ);
    expect(cache.solves).toBe(2);
  });
});
