import { describe, it } from 'vitest';
import { Matrix, solve, EigenvalueDecomposition } from 'ml-matrix';
import { expm, solveLinear, eigenvalues, lyapunov, discretizeZoh, identity, matMul, charPoly, norm1, polyRoots } from '../../server/physics/linalg';
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

describe('small helpers', () => {
  it('when norm1, identity and matMul are taken of small non-symmetric matrices, then they give the column-sum norm, the identity and the row-by-column product (analytic)', () => {
    checkThat(norm1(new Float64Array([1, -2, 3, 4]), 2) === 6, 'analytic: largest column sum |−2| + |4| (row sums would give 7)', '');
    checkThat(norm1(new Float64Array([-5, 1, 0, 1]), 2) === 5, 'analytic: the first column may be the largest', '');
    checkThat(norm1(new Float64Array(4), 2) === 0, 'analytic', '');
    checkThat(Number.isNaN(norm1(new Float64Array([1, 2, Number.NaN, 4]), 2)) && Number.isNaN(norm1(new Float64Array([1, Number.NaN, 3, 4]), 2)), 'definition: a NaN entry has no norm', '');
    checkThat(identity(3).join(',') === '1,0,0,0,1,0,0,0,1', 'analytic', identity(3).join(','));
    const p = matMul(new Float64Array([1, 2, 3, 4]), new Float64Array([5, 6, 7, 8]), 2);
    checkThat(p.join(',') === '19,22,43,50', 'analytic: [[1,2],[3,4]]·[[5,6],[7,8]]', p.join(','));
    const out = new Float64Array(4);
    checkThat(matMul(new Float64Array([0, 1, 1, 0]), new Float64Array([1, 2, 3, 4]), 2, out) === out && out.join(',') === '3,4,1,2', 'analytic: row swap', out.join(','));
  });

  it('when the characteristic polynomial of a companion matrix is taken, then it returns the polynomial the matrix was built from (analytic)', () => {
    // companion of λ⁴ + 2λ³ − 3λ² + 5λ − 7: last row −[c4, c3, c2, c1], ones on the superdiagonal
    const c = [1, 2, -3, 5, -7];
    const a = new Float64Array([0, 1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1, 7, -5, 3, -2]);
    const got = charPoly(a, 4);
    c.forEach((v, i) => checkClose(got[i], v, { abs: 1e-12 }, 'analytic: companion matrix', { i }));
  });

  it('when the eigenvalues of a 4×4 with a known spectrum are computed, then they are 1, −2 and ±3i (analytic)', () => {
    // block diagonal: diag(1, −2) and the rotation generator [[0, 3], [−3, 0]] (±3i)
    const a = new Float64Array([1, 0, 0, 0, 0, -2, 0, 0, 0, 0, 0, 3, 0, 0, -3, 0]);
    const ev = eigenvalues(a, 4);
    const want = [[1, 0], [-2, 0], [0, 3], [0, -3]];
    for (const [re, im] of want) {
      const d = Math.min(...Array.from(ev.re, (r, i) => Math.hypot(r - re, ev.im[i] - im)));
      checkClose(d, 0, { abs: 1e-10 }, 'analytic', { re, im });
    }
  });

  it('when a polynomial has a zero leading coefficient, then polyRoots refuses it (definition)', () => {
    checkThat(errorOf(() => polyRoots(new Float64Array([0, 1, 2]))) === 'physics: non-finite leading coefficient in polyRoots', 'definition', '');
    checkThat(errorOf(() => polyRoots(new Float64Array([Number.NaN, 1]))) === 'physics: non-finite leading coefficient in polyRoots', 'definition', '');
    const r = polyRoots(new Float64Array([2, -2, -12])); // 2(x − 3)(x + 2)
    const roots = Array.from(r.re).sort((x, y) => x - y);
    checkClose(roots[0], -2, { abs: 1e-12 }, 'analytic', {});
    checkClose(roots[1], 3, { abs: 1e-12 }, 'analytic', {});
    r.im.forEach((v) => checkClose(v, 0, { abs: 1e-12 }, 'analytic: real roots', {}));
  });
});

describe('solveLinear and expm edges', () => {
  it('when there are several right-hand sides and rows must be swapped, then every column is solved (analytic)', () => {
    // [[0, 1], [2, 0]]·X = [[1, 2], [4, 6]] → X = [[2, 3], [1, 2]]
    const x = solveLinear(new Float64Array([0, 1, 2, 0]), new Float64Array([1, 2, 4, 6]), 2, 2);
    checkThat(x.join(',') === '2,3,1,2', 'analytic', x.join(','));
    // a 3×3 needing a swap at the second column too
    const a = new Float64Array([1, 2, 3, 2, 4, 7, 3, 5, 6]);
    const want = [1, -2, 3];
    const b = new Float64Array([1 * 1 + 2 * -2 + 3 * 3, 2 * 1 + 4 * -2 + 7 * 3, 3 * 1 + 5 * -2 + 6 * 3]);
    solveLinear(a, b, 3).forEach((v, i) => checkClose(v, want[i], { abs: 1e-13 }, 'analytic', { i }));
    checkThat(a.join(',') === '1,2,3,2,4,7,3,5,6' && b.join(',') === '6,15,11', 'definition: inputs not modified', `${a.join(',')} / ${b.join(',')}`);
  });

  it('when a matrix is nearly singular (pivot ≤ 1e-15·‖A‖₁) or holds a non-finite value, then solveLinear refuses it with the reason (definition)', () => {
    checkThat(errorOf(() => solveLinear(new Float64Array([1, 1, 1, 1 + 1e-17]), new Float64Array([1, 2]), 2)) === 'physics: non-finite pivot (singular matrix of order 2) in solveLinear', 'definition', '');
    checkThat(errorOf(() => solveLinear(new Float64Array([0, 0, 0, 0]), new Float64Array([1, 2]), 2)) === 'physics: non-finite pivot (singular matrix of order 2) in solveLinear', 'definition', '');
    checkThat(errorOf(() => solveLinear(new Float64Array([1, Number.NaN, 0, 1]), new Float64Array([1, 2]), 2)) === 'physics: non-finite matrix entry in solveLinear', 'definition', '');
    checkThat(errorOf(() => solveLinear(new Float64Array([1, 0, 0, 1]), new Float64Array([Number.POSITIVE_INFINITY, 2]), 2)) === 'physics: non-finite solution in solveLinear', 'definition', '');
    // [[1, 1], [1, 1 + ε]] with ε = 2⁻⁵²: its second pivot is ε ≠ 0, below 1e-15·‖A‖₁ = 1e-15·(2 + ε)
    const eps = Number.EPSILON;
    checkThat(1 + eps !== 1, 'IEEE 754 double: 1 + 2⁻⁵² is representable', '');
    checkThat(errorOf(() => solveLinear(new Float64Array([1, 1, 1, 1 + eps]), new Float64Array([1, 2]), 2)) === 'physics: non-finite pivot (singular matrix of order 2) in solveLinear', 'definition: a non-zero pivot at or below 1e-15·‖A‖₁ is refused', '');
    // a small but regular pivot is accepted: diag(1, 1e-12)
    const x = solveLinear(new Float64Array([1, 0, 0, 1e-12]), new Float64Array([1, 1e-12]), 2);
    checkThat(x[0] === 1 && Math.abs(x[1] - 1) < 1e-12, 'analytic', x.join(','));
  });

  it('when expm gets a diagonal matrix of any norm, then it returns the exponentials of the diagonal to rounding; a non-finite entry is refused (analytic)', () => {
    for (const d of [0.3, 0.5, 0.7, 3, -20, 45]) {
      const e = expm(new Float64Array([d, 0, 0, -d / 2]), 2);
      checkClose(e[0], Math.exp(d), { rel: 1e-14 }, 'analytic: exp of a diagonal', { d });
      checkClose(e[3], Math.exp(-d / 2), { rel: 1e-14 }, 'analytic: exp of a diagonal', { d });
      checkThat(e[1] === 0 && e[2] === 0, 'analytic', '');
    }
    checkThat(errorOf(() => expm(new Float64Array([Number.NaN, 0, 0, 1]), 2)) === 'physics: non-finite matrix entry in expm', 'definition', '');
    checkThat(expm(new Float64Array(4), 2).join(',') === '1,0,0,1', 'analytic: exp(0) = I', '');
  });

  it('when a double integrator is discretised, then Ad = [[1, dt], [0, 1]] and Bd = [dt²/2, dt] (analytic ZOH)', () => {
    for (const dt of [0.01, 0.5, 3]) {
      const { Ad, Bd } = discretizeZoh(new Float64Array([0, 1, 0, 0]), new Float64Array([0, 1]), 2, dt);
      [1, dt, 0, 1].forEach((v, i) => checkClose(Ad[i], v, { abs: 1e-14 * Math.max(1, dt) }, 'analytic ZOH', { dt, i }));
      checkClose(Bd[0], (dt * dt) / 2, { rel: 1e-13 }, 'analytic ZOH', { dt });
      checkClose(Bd[1], dt, { rel: 1e-13 }, 'analytic ZOH', { dt });
    }
  });

  it('when a 2×2 non-symmetric Lyapunov equation is solved, then A·P + P·Aᵀ + Q = 0 and P is symmetric (definition)', () => {
    const a = new Float64Array([-1, 2, 0, -3]);
    const q = new Float64Array([1, 0.5, 0.5, 2]);
    const p = lyapunov(a, q, 2);
    const ap = matMul(a, p, 2);
    const at = new Float64Array([a[0], a[2], a[1], a[3]]);
    const pat = matMul(p, at, 2);
    for (let i = 0; i < 4; i++) checkClose(ap[i] + pat[i] + q[i], 0, { abs: 1e-14 }, 'definition', { i });
    checkThat(p[1] === p[2], 'definition: symmetric', p.join(','));
  });
});
