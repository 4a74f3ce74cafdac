import { describe, it } from 'vitest';
import { Matrix, solve } from 'ml-matrix';
import { stateSpace, modes, frequencyResponse, cornerTransfer } from '../../server/physics/quarter-car';
import { PhysicsInputError, validateCorner, type CornerParams } from '../../server/physics/types';
import { checkClose, checkRange, checkThat, CAR } from './check';

describe('modes', () => {
  it('when a typical car corner is analysed, then its modes lie in the textbook ranges (docs/methods.md "Typical parameters", from memory: Gillespie 1992, Wong, Cebon 1999)', () => {
    const m = modes(CAR);
    checkRange(m.bodyHz, 1.0, 1.5, 'docs/methods.md "Typical parameters" body bounce 1.0–1.5 Hz (from memory)', CAR);
    checkRange(m.wheelHz, 10, 15, 'docs/methods.md "Typical parameters" wheel hop 10–15 Hz (from memory)', CAR);
    checkRange(m.bodyDampingRatio, 0.2, 0.4, 'docs/methods.md "Typical parameters" damping ratio 0.2–0.4 (from memory)', CAR);
  });

  it('when the wheel is rigidly held (kt → large) and damping tiny, then body frequency → √(ks/ms)/2π (analytic limit)', () => {
    const c: CornerParams = { ...CAR, tireRateNPerM: 1e8, dampingNsPerM: 1 };
    const m = modes(c);
    const exp = Math.sqrt(c.springRateNPerM / c.sprungMassKg) / (2 * Math.PI);
    checkClose(m.bodyHz, exp, { rel: 1e-3 }, 'analytic: single-mass limit', c);
    checkClose(m.bodyDampingRatio, 1 / (2 * Math.sqrt(c.springRateNPerM * c.sprungMassKg)), { rel: 1e-2 }, 'analytic: ζ = cs/(2√(ks·ms))', c);
  });

  it('when the corner is the published Hindawi ISRN 2015 (974020, Table 2) front corner with 350 kg body share, then modes are in range (docs/methods.md "Typical parameters")', () => {
    // ks, cs, kt, mu from the cited table; the sprung mass is our assumption (not in docs/methods.md)
    const c: CornerParams = { sprungMassKg: 350, unsprungMassKg: 40, springRateNPerM: 19960, dampingNsPerM: 1290, tireRateNPerM: 175500 };
    const m = modes(c);
    checkRange(m.bodyHz, 1.0, 1.5, 'docs/methods.md "Typical parameters" body bounce range (from memory)', c);
    checkRange(m.wheelHz, 10, 15, 'docs/methods.md "Typical parameters" wheel hop range (from memory)', c);
  });
});

describe('frequencyResponse', () => {
  it('when compared with C·(jωI − A)⁻¹·B·jω solved by ml-matrix, then the closed-form transfer functions agree (computed, independent library)', () => {
    const ss = stateSpace(CAR);
    const freqs = [0.3, 1.1, 3, 8, 11, 20, 60];
    const fr = frequencyResponse(CAR, freqs);
    freqs.forEach((f, k) => {
      const w = 2 * Math.PI * f;
      // real form of (jωI − A)(xr + j·xi) = B
      const m = Matrix.zeros(8, 8);
      for (let i = 0; i < 4; i++) {
        for (let j = 0; j < 4; j++) {
          m.set(i, j, -ss.A[i * 4 + j]);
          m.set(i + 4, j + 4, -ss.A[i * 4 + j]);
        }
        m.set(i, i + 4, -w);
        m.set(i + 4, i, w);
      }
      const rhs = Matrix.columnVector([...ss.B, 0, 0, 0, 0]);
      const x = solve(m, rhs).to1DArray();
      const out = (row: Float64Array): number => {
        let re = 0;
        let im = 0;
        for (let i = 0; i < 4; i++) {
          re += row[i] * x[i];
          im += row[i] * x[i + 4];
        }
        return w * Math.hypot(re, im); // × jω: road velocity per road displacement
      };
      const pairs: [number, number, string][] = [
        [fr.bodyAccel[k], out(ss.outputs.bodyAccel), 'bodyAccel'],
        [fr.suspensionTravel[k], out(ss.outputs.suspensionTravel), 'suspensionTravel'],
        [fr.relativeVelocity[k], out(ss.outputs.relativeVelocity), 'relativeVelocity'],
        [fr.tireLoad[k], out(ss.outputs.tireLoad), 'tireLoad'],
      ];
      for (const [v, ref, name] of pairs) checkClose(v, ref, { rel: 1e-9 }, 'computed: state space via ml-matrix', { f, name });
    });
  });

  it('when the road moves slowly, then the body follows (|Zs/Zr| → 1) and nothing deflects (analytic limit)', () => {
    const t = cornerTransfer(CAR, 1e-4);
    checkClose(Math.hypot(...t.suspensionTravel), 0, { abs: 1e-6 }, 'analytic: static limit', { f: 1e-4 });
    checkClose(frequencyResponse(CAR, [0]).tireLoad[0], 0, { abs: 1e-12 }, 'analytic: static limit', { f: 0 });
  });
});

describe('validation', () => {
  const bad: [keyof CornerParams, number, string][] = [
    ['sprungMassKg', -5, 'kg'],
    ['unsprungMassKg', Number.NaN, 'kg'],
    ['springRateNPerM', 0, 'N/m'],
    ['dampingNsPerM', Number.POSITIVE_INFINITY, 'N·s/m'],
    ['tireRateNPerM', -1, 'N/m'],
    ['unsprungMassKg', 500, 'kg'],
  ];
  for (const [name, value, unit] of bad) {
    it(`when ${name} is ${value}, then the error names ${name} and [${unit}] (house rule)`, () => {
      let err: unknown = null;
      try {
        validateCorner({ ...CAR, [name]: value });
      } catch (e) {
        err = e;
      }
      checkThat(err instanceof PhysicsInputError, 'house rule', `expected PhysicsInputError for ${name}=${value}, got ${String(err)}`);
      const msg = (err as Error).message;
      checkThat(msg.includes(name) && msg.includes(`[${unit}]`), 'house rule', `message "${msg}" should name ${name} and [${unit}]`);
    });
  }

  it('when frequencyResponse gets a negative frequency, then the error names freqsHz and Hz', () => {
    let msg = '';
    try {
      frequencyResponse(CAR, [-1]);
    } catch (e) {
      msg = (e as Error).message;
    }
    checkThat(msg.includes('freqsHz') && msg.includes('[Hz]'), 'house rule', `message "${msg}"`);
  });
});
