import { describe, it } from 'vitest';
import { Matrix, solve, EigenvalueDecomposition } from 'ml-matrix';
import { expm, solveLinear, eigenvalues, lyapunov, discretizeZoh, identity, matMul, charPoly, norm1 } from '../../server/physics/linalg';
import { stateSpace } from '../../server/physics/quarter-car';
import { appendWk } from '../../server/physics/exposure';
import { checkClose, checkThat, CAR, errorOf } from './check';

const toMl = (a: Float64Array, n: number): Matrix => {
  const rows: number[][] = [];
  for (let i = 0; i < n; i++) rows.push(Array.from(a.subarray(i * n, i * n + n)));
  return new Matrix(rows);
};

describe('expm (scaling and squaring, Padé 6)', () => {
  it('when A is a rotation generator, then exp(A·t) is the rotation matrix (analytic)', () => {
    for (const t of [0.1, 1, 7.5, 40]) {
      const e = expm(new Float64Array([0, t, -t, 0]), 2);
      const exp = [Math.cos(t), Math.sin(t), -Math.sin(t), Math.cos(t)];
      e.forEach((v, i) => checkClose(v, exp[i], { abs: 1e-13 * Math.max(1, t) }, 'analytic: exp of skew 2×2', { t, i }));
    }
  });

  it('when A is nilpotent, then exp(A) = I + N + N²/2 (analytic)', () => {
    const n = new Float64Array([0, 2, 3, 0, 0, 5, 0, 0, 0]);
    const e = expm(n, 3);
    const exp = [1, 2, 3 + 5, 0, 1, 5, 0, 0, 1]; // N²/2 has only (0,2) = 2·5/2
    e.forEach((v, i) => checkClose(v, exp[i], { abs: 1e-14 }, 'analytic: nilpotent series terminates', { i }));
  });

  it('when the quarter-car A·dt is exponentiated, then exp(A·dt)·exp(−A·dt) = I (computed)', () => {
    const { A } = stateSpace(CAR);
    for (const dt of [0.001, 0.01, 0.05, 0.2]) {
      const p = expm(A.map((v) => v * dt), 4);
      const m = expm(A.map((v) => -v * dt), 4);
      const prod = matMul(p, m, 4);
      const id = identity(4);
      // rounding is amplified by ‖exp(−A·dt)‖ (the wheel-hop mode grows backwards in time)
      const tol = 1e-13 * norm1(p, 4) * norm1(m, 4);
      prod.forEach((v, i) => checkClose(v, id[i], { abs: tol }, 'computed: group property', { dt, i }));
    }
  });

  it('when a scalar system is discretised, then Ad = e^(a·dt) and Bd = (e^(a·dt) − 1)/a (analytic ZOH)', () => {
    const { Ad, Bd } = discretizeZoh(new Float64Array([-3]), new Float64Array([2]), 1, 0.2);
    checkClose(Ad[0], Math.exp(-0.6), { rel: 1e-14 }, 'analytic ZOH', { a: -3, b: 2, dt: 0.2 });
    checkClose(Bd[0], (2 * (Math.exp(-0.6) - 1)) / -3, { rel: 1e-14 }, 'analytic ZOH', { a: -3, b: 2, dt: 0.2 });
  });
});

describe('solveLinear, eigenvalues', () => {
  it('when a random 6×6 system is solved, then it matches ml-matrix solve (independent library)', () => {
    let s = 3;
    const rnd = () => ((s = (s * 1103515245 + 12345) % 2147483648) / 2147483648) - 0.5;
    const a = Float64Array.from({ length: 36 }, rnd);
    const b = Float64Array.from({ length: 6 }, rnd);
    const x = solveLinear(a, b, 6);
    const ref = solve(toMl(a, 6), Matrix.columnVector(Array.from(b))).to1DArray();
    x.forEach((v, i) => checkClose(v, ref[i], { abs: 1e-12, rel: 1e-10 }, 'ml-matrix solve', { i }));
  });

  it('when a matrix is singular, then solveLinear throws a prefixed error', () => {
    const msg = errorOf(() => solveLinear(new Float64Array([1, 2, 2, 4]), new Float64Array([1, 1]), 2));
    checkThat(msg.startsWith('physics: non-finite'), 'convention 13', `expected prefixed error, got "${msg}"`);
  });

  it('when charPoly is taken of diag(2, 3), then it is λ² − 5λ + 6 (analytic)', () => {
    const c = charPoly(new Float64Array([2, 0, 0, 3]), 2);
    [1, -5, 6].forEach((v, i) => checkClose(c[i], v, { abs: 1e-14 }, 'analytic', { i }));
  });

  it('when the quarter-car and Wk-augmented eigenvalues are computed, then they match ml-matrix (independent library)', () => {
    const { A } = stateSpace(CAR);
    const cases: [Float64Array, number][] = [[A, 4]];
    const aug = appendWk(A, stateSpace(CAR).B, 4, stateSpace(CAR).outputs.bodyAccel);
    // the first 4 states plus the first Wk section (high-pass) form a 6×6 block lower-triangular system
    const sub6 = new Float64Array(36);
    for (let i = 0; i < 6; i++) for (let j = 0; j < 6; j++) sub6[i * 6 + j] = aug.A[i * aug.n + j];
    cases.push([sub6, 6]);
    for (const [m, n] of cases) {
      const ours = eigenvalues(m, n);
      const ev = new EigenvalueDecomposition(toMl(m, n));
      const refRe = ev.realEigenvalues;
      const refIm = ev.imaginaryEigenvalues;
      for (let i = 0; i < n; i++) {
        const d = refRe.map((r, j) => Math.hypot(r - ours.re[i], refIm[j] - ours.im[i]));
        const best = Math.min(...d);
        const mag = Math.hypot(ours.re[i], ours.im[i]);
        checkClose(best, 0, { abs: 1e-8 * Math.max(1, mag) }, 'ml-matrix EigenvalueDecomposition', { n, re: ours.re[i], im: ours.im[i] });
      }
    }
  });
});

describe('lyapunov', () => {
  /** Independent solve with ml-matrix: (I⊗A + A⊗I)·vec(P) = −vec(Q). */
  const kronSolve = (a: Float64Array, q: Float64Array, n: number): number[] => {
    const am = toMl(a, n);
    const id = Matrix.eye(n);
    const k = id.kroneckerProduct(am).add(am.kroneckerProduct(id));
    // column-major vec; Q symmetric so row-major = column-major
    const rhs = Matrix.columnVector(Array.from(q, (v) => -v));
    return solve(k, rhs).to1DArray();
  };

  it('when solving for the quarter car, then P matches an ml-matrix Kronecker solve (independent library)', () => {
    const { A, B } = stateSpace(CAR);
    const q = new Float64Array(16);
    for (let i = 0; i < 4; i++) for (let j = 0; j < 4; j++) q[i * 4 + j] = B[i] * B[j];
    const p = lyapunov(A, q, 4);
    const ref = kronSolve(A, q, 4);
    const scale = Math.max(...ref.map(Math.abs));
    p.forEach((v, i) => checkClose(v, ref[i], { abs: 1e-10 * scale }, 'ml-matrix Kronecker solve', { i, corner: CAR }));
  });

  it('when solving for the 12-state Wk-augmented system, then P matches an ml-matrix Kronecker solve (independent library)', () => {
    const ss = stateSpace(CAR);
    const aug = appendWk(ss.A, ss.B, 4, ss.outputs.bodyAccel);
    const n = aug.n;
    const q = new Float64Array(n * n);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) q[i * n + j] = aug.B[i] * aug.B[j];
    const p = lyapunov(aug.A, q, n);
    const ref = kronSolve(aug.A, q, n);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        const tol = 1e-7 * Math.sqrt(Math.abs(ref[i * n + i] * ref[j * n + j])) + 1e-300;
        checkClose(p[i * n + j], ref[i * n + j], { abs: tol }, 'ml-matrix Kronecker solve', { i, j, n });
      }
    }
  });
});
