import { describe, it } from 'vitest';
import { floorToSeat, SEAT_DEFAULTS, FRONT_TRACK_CORRELATION } from '../../server/physics/seat';
import { checkClose, checkRange, checkThat, errorOf } from './check';

describe('floor-to-seat factors', () => {
  it('when the class defaults are read, then conventional seats lie in SEAT 0.8–1.1 and suspension seats in 0.6–0.9 (Griffin 1990, from memory; docs/methods.md "Exposure at the seat")', () => {
    for (const cls of ['passenger car', 'light commercial']) checkRange(SEAT_DEFAULTS[cls].seat, 0.8, 1.1, 'Griffin 1990 conventional seat range, from memory', { cls });
    checkRange(SEAT_DEFAULTS['heavy goods'].seat, 0.6, 0.9, 'Griffin 1990 suspension seat range, from memory', {});
  });

  it('when a van uses its class defaults, then seat 0.95, cab 1, track √((1 + 0.5)/2) = 0.866 and total 0.823 (computed, docs/methods.md "Exposure at the seat")', () => {
    const f = floorToSeat({ vehicleClass: 'light commercial', seatFactor: null, cabFactor: null });
    checkClose(FRONT_TRACK_CORRELATION, 0.5, { abs: 0 }, 'docs/methods.md "Exposure at the seat": ρ = 0.5', {});
    checkClose(f.seat, 0.95, { abs: 0 }, 'docs/methods.md "Exposure at the seat"', {});
    checkClose(f.cab, 1, { abs: 0 }, 'docs/methods.md "Exposure at the seat": empty cab = 1', {});
    checkClose(f.track, Math.sqrt(0.75), { rel: 1e-15 }, 'computed: RMS of the mean of two corners with ρ = 0.5', {});
    checkClose(f.total, 0.95 * Math.sqrt(0.75), { rel: 1e-15 }, 'computed: 0.95 × 0.866 = 0.823', {});
    checkThat(f.seatSource === SEAT_DEFAULTS['light commercial'].source, 'definition: the class default names its source', f.seatSource);
  });

  it('when a truck uses its class default, then its floor is carried by 0.75 × 0.866 = 0.65 (computed, docs/methods.md "Exposure at the seat")', () => {
    const f = floorToSeat({ vehicleClass: 'heavy goods', seatFactor: null, cabFactor: null });
    checkClose(f.total, 0.65, { abs: 0.005 }, 'docs/methods.md "Exposure at the seat": truck 0.65', {});
    checkThat(f.seatSource.includes('suspension seat'), 'definition: the truck default is a suspension seat', f.seatSource);
  });

  it('when the vehicle class is unknown, then the light commercial default is used (definition)', () => {
    const f = floorToSeat({ vehicleClass: 'tractor', seatFactor: null, cabFactor: null });
    checkClose(f.seat, SEAT_DEFAULTS['light commercial'].seat, { abs: 0 }, 'definition', {});
    checkThat(f.seatSource === SEAT_DEFAULTS['light commercial'].source, 'definition', f.seatSource);
  });

  it('when SEAT and cab are entered on the spec, then they are used and multiply (definition: a_w,seat = SEAT · cab · √((1 + ρ)/2) · a_w,floor)', () => {
    const f = floorToSeat({ vehicleClass: 'heavy goods', seatFactor: 1.2, cabFactor: 0.7 });
    checkClose(f.seat, 1.2, { abs: 0 }, 'definition', {});
    checkClose(f.cab, 0.7, { abs: 0 }, 'definition', {});
    checkClose(f.total, 1.2 * 0.7 * Math.sqrt(0.75), { rel: 1e-15 }, 'computed', {});
    checkThat(f.seatSource === 'entered on the spec', 'definition', f.seatSource);
  });

  it('when an entered factor is outside SEAT 0.2–2 or cab 0.2–1.5, then the error names it; the bounds themselves are accepted', () => {
    for (const v of [0.1, 2.1]) checkThat(errorOf(() => floorToSeat({ vehicleClass: 'passenger car', seatFactor: v, cabFactor: null })).startsWith('physics: seatFactor'), 'house rule', `seat ${v}`);
    for (const v of [0.1, 1.6]) checkThat(errorOf(() => floorToSeat({ vehicleClass: 'passenger car', seatFactor: null, cabFactor: v })).startsWith('physics: cabFactor'), 'house rule', `cab ${v}`);
    checkClose(floorToSeat({ vehicleClass: 'passenger car', seatFactor: 0.2, cabFactor: 1.5 }).total, 0.2 * 1.5 * Math.sqrt(0.75), { rel: 1e-15 }, 'computed: bounds accepted', {});
    checkClose(floorToSeat({ vehicleClass: 'passenger car', seatFactor: 2, cabFactor: 0.2 }).total, 2 * 0.2 * Math.sqrt(0.75), { rel: 1e-15 }, 'computed: bounds accepted', {});
    for (const [seatFactor, cabFactor] of [[3, null], [null, 3]]) {
      checkThat(errorOf(() => floorToSeat({ vehicleClass: 'passenger car', seatFactor, cabFactor })).includes('[1]'), 'house rule: the error gives the unit, 1 for a ratio', errorOf(() => floorToSeat({ vehicleClass: 'passenger car', seatFactor, cabFactor })));
    }
  });
});
