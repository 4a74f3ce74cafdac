import { describe, it } from 'vitest';
import {
  PhysicsInputError,
  PhysicsNumericError,
  STANDARD_GRAVITY,
  requireInRange,
  validateCorner,
  validateSpeed,
  type CornerParams,
} from '../../server/physics/types';
import { checkThat, CAR, thrownBy } from './check';

const messageOf = (f: () => unknown): string => {
  const e = thrownBy(f);
  return e instanceof Error ? e.message : `no error (${String(e)})`;
};

describe('input errors', () => {
  it('when an input error is built, then it carries the parameter and unit and says "physics: <name> [<unit>] <what>" (definition: types.ts)', () => {
    const e = new PhysicsInputError('sprungMassKg', 'kg', 'must be > 0, got -1');
    checkThat(e instanceof Error && e.name === 'PhysicsInputError', 'definition', `${e.name}`);
    checkThat(e.parameter === 'sprungMassKg' && e.unit === 'kg', 'definition', `${e.parameter} ${e.unit}`);
    checkThat(e.message === 'physics: sprungMassKg [kg] must be > 0, got -1', 'definition', e.message);
  });

  it('when a numeric error is built, then it says "physics: non-finite <what>" (definition: types.ts example)', () => {
    const e = new PhysicsNumericError('state after step 12');
    checkThat(e instanceof Error && e.name === 'PhysicsNumericError', 'definition', e.name);
    checkThat(e.message === 'physics: non-finite state after step 12', 'definition', e.message);
  });

  it('standard gravity is 9.80665 m/s² (CGPM 1901, ISO 80000-3)', () => {
    checkThat(STANDARD_GRAVITY === 9.80665, 'CGPM 1901', String(STANDARD_GRAVITY));
  });
});

describe('requireInRange', () => {
  it('when the value lies in the range, then it is returned unchanged; both ends of [min, max] are accepted with an inclusive minimum (definition)', () => {
    checkThat(requireInRange('speedMps', 22.2, 'm/s', 0, 100) === 22.2, 'definition: types.ts example', '');
    checkThat(requireInRange('x', 0, 'm', 0, 5, false) === 0, 'definition: inclusive minimum', '');
    checkThat(requireInRange('x', 5, 'm', 0, 5, false) === 5, 'definition: max is inclusive', '');
    checkThat(requireInRange('x', 5, 'm', 0, 5) === 5, 'definition: max is inclusive', '');
  });

  it('when the minimum is exclusive (the default), then min itself is refused with "must be > min" and anything just above is accepted (definition)', () => {
    checkThat(messageOf(() => requireInRange('x', 0, 'm', 0, 5)) === 'physics: x [m] must be > 0, got 0', 'definition', messageOf(() => requireInRange('x', 0, 'm', 0, 5)));
    checkThat(requireInRange('x', 1e-9, 'm', 0, 5) === 1e-9, 'definition', '');
  });

  it('when the minimum is inclusive, then a value below it is refused with "must be ≥ min" (definition)', () => {
    const msg = messageOf(() => requireInRange('x', -0.5, 'm', 0, 5, false));
    checkThat(msg === 'physics: x [m] must be ≥ 0, got -0.5', 'definition', msg);
  });

  it('when the value is above the maximum, then it is refused with "must be ≤ max" (definition)', () => {
    const msg = messageOf(() => requireInRange('x', 5.5, 'm', 0, 5));
    checkThat(msg === 'physics: x [m] must be ≤ 5, got 5.5', 'definition', msg);
  });

  it('when the value is not a finite number, then it is refused as such, naming what it got (definition)', () => {
    for (const [v, shown] of [[Number.NaN, 'NaN'], [Number.POSITIVE_INFINITY, 'Infinity'], [Number.NEGATIVE_INFINITY, '-Infinity'], ['3', '3'], [undefined, 'undefined']] as const) {
      const e = thrownBy(() => requireInRange('x', v as unknown as number, 'm', -10, 10));
      checkThat(e instanceof PhysicsInputError && e.parameter === 'x' && e.unit === 'm', 'definition', String(e));
      checkThat((e as Error).message === `physics: x [m] must be a finite number, got ${shown}`, 'definition', (e as Error).message);
    }
  });
});

describe('validateCorner', () => {
  // documented ranges (types.ts validateCorner: sprung 1–20 000 kg, unsprung 0.5–5 000 kg, spring 100 N/m–10 MN/m,
  // damping 1 N·s/m–1 MN·s/m, tyre 1 kN/m–100 MN/m), each end inclusive
  const RANGES: [keyof CornerParams, string, number, number][] = [
    ['sprungMassKg', 'kg', 1, 20_000],
    ['unsprungMassKg', 'kg', 0.5, 5_000],
    ['springRateNPerM', 'N/m', 100, 1e7],
    ['dampingNsPerM', 'N·s/m', 1, 1e6],
    ['tireRateNPerM', 'N/m', 1e3, 1e8],
  ];
  /** A corner that is valid except for the parameter under test (unsprung kept below sprung). */
  const around = (name: keyof CornerParams, value: number): CornerParams =>
    name === 'sprungMassKg' ? { ...CAR, sprungMassKg: value, unsprungMassKg: Math.min(CAR.unsprungMassKg, value / 2) }
      : name === 'unsprungMassKg' ? { ...CAR, unsprungMassKg: value, sprungMassKg: Math.max(CAR.sprungMassKg, Math.min(20_000, 2 * value)) }
        : { ...CAR, [name]: value };

  it('when a parameter sits at either end of its documented range, then the corner is accepted and returned as it is (definition)', () => {
    for (const [name, , lo, hi] of RANGES) {
      for (const v of [lo, hi]) {
        const c = around(name, v);
        checkThat(validateCorner(c) === c, 'definition: documented range, inclusive', `${name} = ${v}`);
      }
    }
  });

  it('when a parameter is just outside its documented range, then the error names it and its unit and says which bound (definition)', () => {
    for (const [name, unit, lo, hi] of RANGES) {
      const below = thrownBy(() => validateCorner(around(name, lo * 0.999)));
      checkThat(below instanceof PhysicsInputError && below.parameter === name && (below as Error).message.startsWith(`physics: ${name} [${unit}] must be ≥ ${lo}, got`), 'definition', String(below));
      const above = thrownBy(() => validateCorner(around(name, hi * 1.001)));
      checkThat(above instanceof PhysicsInputError && above.parameter === name && (above as Error).message.startsWith(`physics: ${name} [${unit}] must be ≤ ${hi}, got`), 'definition', String(above));
    }
  });

  it('when the unsprung mass equals or exceeds the sprung mass, then it is refused naming both; just below is accepted (definition)', () => {
    for (const mu of [400, 401]) {
      const e = thrownBy(() => validateCorner({ ...CAR, unsprungMassKg: mu }));
      checkThat(e instanceof PhysicsInputError && e.parameter === 'unsprungMassKg' && e.unit === 'kg', 'definition', String(e));
      checkThat((e as Error).message === `physics: unsprungMassKg [kg] must be smaller than sprungMassKg (400 kg), got ${mu}`, 'definition', (e as Error).message);
    }
    checkThat(validateCorner({ ...CAR, unsprungMassKg: 399.9 }).unsprungMassKg === 399.9, 'definition', '');
  });

  it('when the corner is not an object, then the error lists the parameters it needs (definition)', () => {
    for (const c of [null, undefined, 5, 'corner']) {
      const e = thrownBy(() => validateCorner(c as unknown as CornerParams));
      checkThat(e instanceof PhysicsInputError && e.parameter === 'corner' && e.unit === '-', 'definition', String(e));
      checkThat((e as Error).message === 'physics: corner [-] must be an object with sprungMassKg, unsprungMassKg, springRateNPerM, dampingNsPerM, tireRateNPerM', 'definition', (e as Error).message);
    }
  });
});

describe('validateSpeed', () => {
  it('when the speed is 0.1–100 m/s, then it is returned; outside, the error names speedMps [m/s] (definition)', () => {
    for (const v of [0.1, 80 / 3.6, 100]) checkThat(validateSpeed(v) === v, 'definition: 0.1–100 m/s', String(v));
    checkThat(messageOf(() => validateSpeed(0.099)) === 'physics: speedMps [m/s] must be ≥ 0.1, got 0.099', 'definition', messageOf(() => validateSpeed(0.099)));
    checkThat(messageOf(() => validateSpeed(100.1)) === 'physics: speedMps [m/s] must be ≤ 100, got 100.1', 'definition', messageOf(() => validateSpeed(100.1)));
  });
});
