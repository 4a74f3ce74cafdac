import { describe, it } from 'vitest';
import { Matrix, solve } from 'ml-matrix';
import { stateSpace, modes, frequencyResponse, cornerTransfer } from '../../server/physics/quarter-car';
import { PhysicsInputError, validateCorner, type CornerParams } from '../../server/physics/types';
import { checkClose, checkRange, checkThat, CAR, errorOf, thrownBy } from './check';

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
      const err = thrownBy(() => validateCorner({ ...CAR, [name]: value }));
      checkThat(err instanceof PhysicsInputError, 'house rule', `expected PhysicsInputError for ${name}=${value}, got ${String(err)}`);
      const msg = (err as Error).message;
      checkThat(msg.includes(name) && msg.includes(`[${unit}]`), 'house rule', `message "${msg}" should name ${name} and [${unit}]`);
    });
  }

  it('when frequencyResponse gets a negative frequency, then the error names freqsHz and Hz', () => {
    const msg = errorOf(() => frequencyResponse(CAR, [-1]));
    checkThat(msg.includes('freqsHz') && msg.includes('[Hz]'), 'house rule', `message "${msg}"`);
  });
});

/** Roots of the undamped characteristic equation ms·mu·ω⁴ − (ms(ks+kt) + mu·ks)·ω² + ks·kt = 0 [rad/s]. */
function undampedOmegas(c: CornerParams): [number, number] {
  const { sprungMassKg: ms, unsprungMassKg: mu, springRateNPerM: ks, tireRateNPerM: kt } = c;
  const a = ms * mu;
  const b = ms * (ks + kt) + mu * ks;
  const disc = Math.sqrt(b * b - 4 * a * ks * kt);
  return [Math.sqrt((b - disc) / (2 * a)), Math.sqrt((b + disc) / (2 * a))];
}

/**
 * Coefficients [s³, s², s¹, s⁰] of Δ/(ms·mu), Δ the characteristic polynomial of the two-mass
 * model written out from its equations of motion (docs/methods.md "The corner model").
 */
function charPoly(c: CornerParams): number[] {
  const { sprungMassKg: ms, unsprungMassKg: mu, springRateNPerM: ks, dampingNsPerM: cs, tireRateNPerM: kt } = c;
  return [cs * (ms + mu), ms * (ks + kt) + mu * ks, cs * kt, ks * kt].map((v) => v / (ms * mu));
}

/** The same coefficients from the modes: (s² + 2ζb·ωb·s + ωb²)(s² + 2ζw·ωw·s + ωw²). */
function polyFromModes(c: CornerParams): number[] {
  const m = modes(c);
  const wb = 2 * Math.PI * m.bodyHz;
  const ww = 2 * Math.PI * m.wheelHz;
  const pb = 2 * m.bodyDampingRatio * wb;
  const pw = 2 * m.wheelDampingRatio * ww;
  return [pb + pw, wb * wb + ww * ww + pb * pw, pb * ww * ww + pw * wb * wb, wb * wb * ww * ww];
}

describe('stateSpace', () => {
  it('when A·x + B·u is formed for an arbitrary state and road velocity, then it equals the equations of motion written out (computed, docs/methods.md "The corner model")', () => {
    const c: CornerParams = { sprungMassKg: 410, unsprungMassKg: 47, springRateNPerM: 23000, dampingNsPerM: 1700, tireRateNPerM: 210000 };
    const { sprungMassKg: ms, unsprungMassKg: mu, springRateNPerM: ks, dampingNsPerM: cs, tireRateNPerM: kt } = c;
    const ss = stateSpace(c);
    const x = [0.013, -0.21, 0.0041, 0.37]; // zs − zu, zs', zu − zr, zu'
    const u = 0.29; // road velocity zr'
    const zsdd = (-ks * x[0] - cs * (x[1] - x[3])) / ms;
    const zudd = (ks * x[0] + cs * (x[1] - x[3]) - kt * x[2]) / mu;
    const expected = [x[1] - x[3], zsdd, x[3] - u, zudd];
    const dot = (row: ArrayLike<number>, off = 0): number => x.reduce((s, xi, j) => s + row[off + j] * xi, 0);
    for (let i = 0; i < 4; i++) {
      checkClose(dot(ss.A, 4 * i) + ss.B[i] * u, expected[i], { rel: 1e-12, abs: 1e-12 }, 'computed: equations of motion', { row: i });
    }
    checkThat(ss.n === 4, 'definition', `n = ${ss.n}`);
    checkClose(dot(ss.outputs.bodyAccel), zsdd, { rel: 1e-12 }, 'computed: zs″ from the equations of motion', {});
    checkClose(dot(ss.outputs.suspensionTravel), x[0], { rel: 1e-12 }, 'definition: travel zs − zu', {});
    checkClose(dot(ss.outputs.relativeVelocity), x[1] - x[3], { rel: 1e-12 }, 'definition: zs′ − zu′', {});
    checkClose(dot(ss.outputs.tireLoad), -kt * x[2], { rel: 1e-12 }, 'definition: −kt(zu − zr)', {});
  });

  it('when the static load is read, then it is (ms + mu)·g with standard gravity 9.80665 m/s² (computed: m·g; standard value, CGPM 1901)', () => {
    checkClose(stateSpace(CAR).staticLoadN, (400 + 45) * 9.80665, { rel: 1e-12 }, 'computed: m·g', CAR);
  });
});

describe('modes against closed forms', () => {
  it('when damping is nearly zero, then both natural frequencies are the roots of the undamped characteristic equation and both damping ratios are nearly zero (computed)', () => {
    for (const c of [{ ...CAR, dampingNsPerM: 1 }, { sprungMassKg: 2400, unsprungMassKg: 450, springRateNPerM: 600000, dampingNsPerM: 1, tireRateNPerM: 1600000 }]) {
      const m = modes(c);
      const [w1, w2] = undampedOmegas(c);
      checkClose(m.bodyHz, w1 / (2 * Math.PI), { rel: 1e-6 }, 'computed: undamped characteristic equation', c);
      checkClose(m.wheelHz, w2 / (2 * Math.PI), { rel: 1e-6 }, 'computed: undamped characteristic equation', c);
      checkRange(m.bodyDampingRatio, 1e-6, 1e-3, 'property: light damping, small positive ratio', c);
      checkRange(m.wheelDampingRatio, 1e-6, 1e-3, 'property: light damping, small positive ratio', c);
    }
  });

  it('when the modes are multiplied back into a polynomial, then it is the characteristic polynomial of the equations of motion, for light, usual, heavy and over-damped corners (computed: Vieta)', () => {
    // the last corner: a light body on a soft spring, over-damped, below a lightly damped wheel hop
    const corners: CornerParams[] = [5, 1800, 5000, 9000, 30000, 200000].map((cs) => ({ ...CAR, dampingNsPerM: cs }));
    corners.push({ sprungMassKg: 100, unsprungMassKg: 45, springRateNPerM: 35500, dampingNsPerM: 5000, tireRateNPerM: 400000 });
    for (const c of corners) {
      const cs = c.dampingNsPerM;
      const want = charPoly(c);
      const got = polyFromModes(c);
      for (let k = 0; k < 4; k++) checkClose(got[k], want[k], { rel: 1e-7 }, 'computed: characteristic polynomial', { cs, k });
      const m = modes(c);
      checkThat(m.bodyHz <= m.wheelHz, 'definition: body bounce is the lower mode', JSON.stringify(m));
    }
  });

  it('when the damper is stiff enough to over-damp a mode, then that mode reads ζ > 1 and the other is the whole corner bouncing on the tyre near √(kt/(ms+mu)) (computed: locked-damper limit)', () => {
    const c = { ...CAR, dampingNsPerM: 200000 };
    const m = modes(c);
    const ratios = [m.bodyDampingRatio, m.wheelDampingRatio].sort((a, b) => a - b);
    checkRange(ratios[0], 0, 0.1, 'computed: the locked mode is lightly damped (tyre has no damping)', m);
    checkRange(ratios[1], 1.0001, 1e3, 'property: over-damped mode has ζ > 1', m);
    const locked = Math.sqrt(c.tireRateNPerM / (c.sprungMassKg + c.unsprungMassKg)) / (2 * Math.PI);
    const hz = m.bodyDampingRatio < m.wheelDampingRatio ? m.bodyHz : m.wheelHz;
    checkClose(hz, locked, { rel: 0.01 }, 'computed: locked-damper limit √(kt/(ms+mu))/2π', m);
  });

  it('when every mass, stiffness and damping is multiplied by 7, then frequencies and damping ratios are unchanged (property: homogeneity)', () => {
    const m1 = modes(CAR);
    const m7 = modes({ sprungMassKg: 2800, unsprungMassKg: 315, springRateNPerM: 154000, dampingNsPerM: 12600, tireRateNPerM: 1400000 });
    for (const k of ['bodyHz', 'bodyDampingRatio', 'wheelHz', 'wheelDampingRatio'] as const) checkClose(m7[k], m1[k], { rel: 1e-9 }, 'property: scaling', { k });
  });

  it('when the unsprung mass is tiny, then body bounce tends to the single mass on ks and kt in series, √(ks·kt/(ks+kt)/ms)/2π (computed: mu → 0 limit)', () => {
    const c: CornerParams = { ...CAR, unsprungMassKg: 0.5, dampingNsPerM: 1 };
    const kSeries = (c.springRateNPerM * c.tireRateNPerM) / (c.springRateNPerM + c.tireRateNPerM);
    checkClose(modes(c).bodyHz, Math.sqrt(kSeries / c.sprungMassKg) / (2 * Math.PI), { rel: 1e-3 }, 'computed: single-mass limit', c);
  });
});

describe('cornerTransfer against closed forms', () => {
  it('when a damped corner is solved directly as a 2×2 complex system, then all four complex transfer values agree, real and imaginary parts (computed: Cramer\'s rule on the equations of motion)', () => {
    const { sprungMassKg: ms, unsprungMassKg: mu, springRateNPerM: ks, dampingNsPerM: cs, tireRateNPerM: kt } = CAR;
    type Cx = [number, number];
    const mul = (a: Cx, b: Cx): Cx => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
    const div = (a: Cx, b: Cx): Cx => {
      const d = b[0] * b[0] + b[1] * b[1];
      return [(a[0] * b[0] + a[1] * b[1]) / d, (a[1] * b[0] - a[0] * b[1]) / d];
    };
    for (const f of [0.7, 1.2, 4, 11, 30]) {
      const w = 2 * Math.PI * f;
      const k: Cx = [ks, w * cs];
      const a11: Cx = [ks - ms * w * w, w * cs];
      const a22: Cx = [ks + kt - mu * w * w, w * cs];
      const det = mul(a11, a22);
      const kk = mul(k, k);
      const d: Cx = [det[0] - kk[0], det[1] - kk[1]];
      const zs = div(mul(k, [kt, 0]), d);
      const zu = div(mul(a11, [kt, 0]), d);
      const travel: Cx = [zs[0] - zu[0], zs[1] - zu[1]];
      const want: Record<string, Cx> = {
        bodyAccel: [-w * w * zs[0], -w * w * zs[1]],
        suspensionTravel: travel,
        relativeVelocity: [-w * travel[1], w * travel[0]],
        tireLoad: [kt * (1 - zu[0]), -kt * zu[1]],
      };
      const t = cornerTransfer(CAR, f);
      for (const name of Object.keys(want) as (keyof typeof t)[]) {
        const scale = Math.hypot(...want[name]);
        for (const part of [0, 1]) checkClose(t[name][part], want[name][part], { abs: 1e-9 * scale }, 'computed: Cramer\'s rule', { f, name, part });
      }
    }
  });

  it('when the corner is undamped, then Zs/Zr = kt·ks/Δ and the tyre load is −kt(Zu/Zr − 1) with Δ real (computed from docs/methods.md "The corner model")', () => {
    const c: CornerParams = { ...CAR, dampingNsPerM: 1 };
    const { sprungMassKg: ms, unsprungMassKg: mu, springRateNPerM: ks, tireRateNPerM: kt } = c;
    for (const f of [0.5, 3, 7, 25]) {
      const w2 = (2 * Math.PI * f) ** 2;
      const d = ms * mu * w2 * w2 - (ms * (ks + kt) + mu * ks) * w2 + ks * kt;
      const t = cornerTransfer(c, f);
      const zs = (kt * ks) / d;
      const zu = (kt * (ks - ms * w2)) / d;
      checkClose(t.bodyAccel[0], -w2 * zs, { rel: 1e-3, abs: 1e-9 }, 'computed: undamped closed form', { f });
      checkClose(t.suspensionTravel[0], zs - zu, { rel: 1e-3, abs: 1e-9 }, 'computed: undamped closed form', { f });
      checkClose(t.tireLoad[0], -kt * (zu - 1), { rel: 1e-3, abs: 1e-6 }, 'computed: undamped closed form', { f });
      checkClose(t.relativeVelocity[1], Math.sqrt(w2) * (zs - zu), { rel: 1e-3, abs: 1e-9 }, 'computed: jω × travel', { f });
    }
  });

  it('when the frequency is far above wheel hop, then the tyre load tends to kt per metre and body acceleration to kt·cs/(ms·mu·ω) (computed: high-frequency limit of the transfer functions, the wheel stands still)', () => {
    const t = cornerTransfer(CAR, 2000);
    const w = 2 * Math.PI * 2000;
    checkClose(Math.hypot(...t.tireLoad), CAR.tireRateNPerM, { rel: 1e-3 }, 'computed: high-frequency limit', {});
    checkClose(Math.hypot(...t.bodyAccel), (CAR.tireRateNPerM * CAR.dampingNsPerM) / (CAR.sprungMassKg * CAR.unsprungMassKg * w), { rel: 1e-2 }, 'computed: high-frequency limit', {});
    const fr = frequencyResponse(CAR, [2000, 1]);
    checkThat(fr.freqsHz.length === 2 && fr.freqsHz[1] === 1 && fr.tireLoad.length === 2, 'definition', JSON.stringify(fr.freqsHz));
  });
});
