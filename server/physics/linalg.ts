/**
 * Small dense linear-algebra helpers for the physics engine: row-major `Float64Array`
 * matrices of order n (n ≤ ~20), matrix exponential, linear solve, eigenvalues and the
 * continuous Lyapunov equation.
 *
 * One file of about 400 lines on purpose: the routines share one storage convention and build on
 * each other (the Lyapunov solve and the zero-order hold use the elimination and the matrix
 * exponential; the eigenvalues use the characteristic polynomial and its roots), and each is short.
 *
 * @module
 */
import { PhysicsNumericError } from './types';

/**
 * Identity matrix of order n (row-major).
 * @param n order
 * @returns a new n×n identity
 * @example
 * identity(2); // → Float64Array [1, 0, 0, 1]
 */
export function identity(n: number): Float64Array {
  const m = new Float64Array(n * n);
  for (let i = 0; i < n; i++) m[i * n + i] = 1;
  return m;
}

/**
 * Product of two n×n row-major matrices, written into `out` (which must not alias `a` or `b`).
 * @param a left factor
 * @param b right factor
 * @param n order
 * @param out destination (allocated when omitted)
 * @returns `out`
 * @example
 * matMul(new Float64Array([1, 2, 3, 4]), identity(2), 2); // → [1, 2, 3, 4]
 */
export function matMul(a: Float64Array, b: Float64Array, n: number, out = new Float64Array(n * n)): Float64Array {
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      let s = 0;
      for (let k = 0; k < n; k++) s += a[i * n + k] * b[k * n + j];
      out[i * n + j] = s;
    }
  }
  return out;
}

/**
 * Matrix 1-norm (largest absolute column sum).
 * @param a n×n matrix
 * @param n order
 * @returns ‖a‖₁ (NaN when an entry is NaN)
 * @example
 * norm1(new Float64Array([1, -2, 3, 4]), 2); // → 6
 */
export function norm1(a: Float64Array, n: number): number {
  let best = 0;
  for (let j = 0; j < n; j++) {
    let s = 0;
    for (let i = 0; i < n; i++) s += Math.abs(a[i * n + j]);
    // a NaN entry makes the norm NaN (a comparison alone would skip it), so the callers' finiteness checks see it
    if (Number.isNaN(s)) return NaN;
    if (s > best) best = s;
  }
  return best;
}

/**
 * Solve `A·X = B` for X by Gaussian elimination with partial pivoting.
 *
 * Method: LU with row pivoting (Golub & Van Loan, Matrix Computations, Alg. 3.4.1).
 *
 * @param a n×n coefficient matrix, row-major (not modified)
 * @param b right-hand side, n×m row-major (not modified)
 * @param n order of A
 * @param m number of right-hand-side columns (default 1)
 * @returns X, n×m row-major
 * @throws PhysicsNumericError when A is singular to working precision or a value is non-finite
 * @example
 * solveLinear(new Float64Array([2, 0, 0, 4]), new Float64Array([2, 8]), 2); // → [1, 2]
 */
export function solveLinear(a: Float64Array, b: Float64Array, n: number, m = 1): Float64Array {
  const lu = Float64Array.from(a);
  const x = Float64Array.from(b);
  const scale = norm1(a, n);
  if (!Number.isFinite(scale)) throw new PhysicsNumericError('matrix entry in solveLinear');
  for (let k = 0; k < n; k++) {
    let p = k;
    let big = Math.abs(lu[k * n + k]);
    for (let i = k + 1; i < n; i++) {
      const v = Math.abs(lu[i * n + k]);
      if (v > big) {
        big = v;
        p = i;
      }
    }
    if (big <= scale * 1e-15 || big === 0) {
      throw new PhysicsNumericError(`pivot (singular matrix of order ${n}) in solveLinear`);
    }
    if (p !== k) {
      for (let j = 0; j < n; j++) {
        const t = lu[k * n + j];
        lu[k * n + j] = lu[p * n + j];
        lu[p * n + j] = t;
      }
      for (let j = 0; j < m; j++) {
        const t = x[k * m + j];
        x[k * m + j] = x[p * m + j];
        x[p * m + j] = t;
      }
    }
    const piv = lu[k * n + k];
    for (let i = k + 1; i < n; i++) {
      const f = lu[i * n + k] / piv;
      if (f === 0) continue;
      for (let j = k + 1; j < n; j++) lu[i * n + j] -= f * lu[k * n + j];
      for (let j = 0; j < m; j++) x[i * m + j] -= f * x[k * m + j];
    }
  }
  for (let k = n - 1; k >= 0; k--) {
    const piv = lu[k * n + k];
    for (let j = 0; j < m; j++) {
      let s = x[k * m + j];
      for (let i = k + 1; i < n; i++) s -= lu[k * n + i] * x[i * m + j];
      x[k * m + j] = s / piv;
    }
  }
  for (let i = 0; i < x.length; i++) {
    if (!Number.isFinite(x[i])) throw new PhysicsNumericError('solution in solveLinear');
  }
  return x;
}

/** Coefficients of the diagonal [6/6] Padé approximant of exp: c_k = (12−k)!·6! / (12!·k!·(6−k)!). */
const PADE6: readonly number[] = (() => {
  const q = 6;
  const c = [1];
  for (let k = 1; k <= q; k++) c.push((c[k - 1] * (q - k + 1)) / (k * (2 * q - k + 1)));
  return c;
})();

/**
 * Matrix exponential `exp(A)` of a small dense matrix.
 *
 * Method: scaling and squaring with the diagonal [6/6] Padé approximant, scaling so that
 * ‖A/2^s‖₁ ≤ 1/2 (Golub & Van Loan, Matrix Computations, Alg. 11.3.1; Moler & Van Loan,
 * "Nineteen dubious ways to compute the exponential of a matrix", SIAM Review 2003). The
 * truncation error bound for that norm is below 1e-16 relative.
 *
 * @param a n×n matrix, row-major (not modified)
 * @param n order
 * @returns exp(A), n×n row-major
 * @throws PhysicsNumericError on non-finite input
 * @example
 * expm(new Float64Array([0, 1, -1, 0]), 2); // → [cos 1, sin 1, −sin 1, cos 1] ≈ [0.5403, 0.8415, −0.8415, 0.5403]
 */
export function expm(a: Float64Array, n: number): Float64Array {
  const nrm = norm1(a, n);
  if (!Number.isFinite(nrm)) throw new PhysicsNumericError('matrix entry in expm');
  const s = nrm > 0.5 ? Math.max(0, Math.ceil(Math.log2(nrm / 0.5))) : 0;
  const scale = 2 ** -s;
  const as = new Float64Array(n * n);
  for (let i = 0; i < as.length; i++) as[i] = a[i] * scale;
  // Horner-free evaluation: N = Σ c_k X^k, D = Σ (−1)^k c_k X^k.
  const num = identity(n);
  const den = identity(n);
  let pow = identity(n);
  const tmp = new Float64Array(n * n);
  for (let k = 1; k < PADE6.length; k++) {
    matMul(pow, as, n, tmp);
    pow = Float64Array.from(tmp);
    const ck = PADE6[k];
    const sign = k % 2 === 0 ? 1 : -1;
    for (let i = 0; i < pow.length; i++) {
      num[i] += ck * pow[i];
      den[i] += sign * ck * pow[i];
    }
  }
  let r = solveLinear(den, num, n, n);
  for (let k = 0; k < s; k++) {
    r = matMul(r, r, n);
  }
  return r;
}

/** Complex eigenvalues as separate real and imaginary parts. */
export interface Eigenvalues {
  /** Real parts [same unit as the matrix entries]. */
  re: Float64Array;
  /** Imaginary parts. */
  im: Float64Array;
}

/**
 * Characteristic polynomial coefficients of an n×n matrix, highest power first:
 * `det(λI − A) = λⁿ + c[1]λⁿ⁻¹ + … + c[n]`.
 *
 * Method: Faddeev–LeVerrier recursion (adequate for the small, well-scaled matrices used
 * here; not for large n).
 *
 * @param a n×n matrix
 * @param n order
 * @returns coefficients, length n+1, c[0] = 1
 * @example
 * charPoly(new Float64Array([2, 0, 0, 3]), 2); // → [1, −5, 6]
 */
export function charPoly(a: Float64Array, n: number): Float64Array {
  const c = new Float64Array(n + 1);
  c[0] = 1;
  let mk = new Float64Array(n * n); // M_0 = 0
  const am = new Float64Array(n * n);
  for (let k = 1; k <= n; k++) {
    // M_k = A·M_{k−1} + c_{k−1} I
    matMul(a, mk, n, am);
    const next = Float64Array.from(am);
    for (let i = 0; i < n; i++) next[i * n + i] += c[k - 1];
    mk = next;
    matMul(a, mk, n, am);
    let tr = 0;
    for (let i = 0; i < n; i++) tr += am[i * n + i];
    c[k] = -tr / k;
  }
  return c;
}

/**
 * Roots of a real polynomial given highest power first (leading coefficient non-zero).
 *
 * Method: Durand–Kerner (Weierstrass) simultaneous iteration, then Newton polishing of each
 * root on the original polynomial.
 *
 * @param coeffs polynomial coefficients, highest power first
 * @returns the roots (complex)
 * @example
 * polyRoots(new Float64Array([1, 0, 1])); // → ±i: re [0, 0], im [1, −1] (order may vary)
 */
export function polyRoots(coeffs: Float64Array): Eigenvalues {
  const deg = coeffs.length - 1;
  const lead = coeffs[0];
  if (lead === 0 || !Number.isFinite(lead)) throw new PhysicsNumericError('leading coefficient in polyRoots');
  const p = Float64Array.from(coeffs, (v) => v / lead);
  let bound = 0;
  for (let i = 1; i <= deg; i++) bound = Math.max(bound, Math.abs(p[i]) ** (1 / i));
  const radius = 2 * bound || 1;
  const re = new Float64Array(deg);
  const im = new Float64Array(deg);
  for (let i = 0; i < deg; i++) {
    const ang = (2 * Math.PI * i) / deg + 0.4;
    re[i] = radius * 0.9 * Math.cos(ang);
    im[i] = radius * 0.9 * Math.sin(ang);
  }
  const evalP = (xr: number, xi: number): [number, number, number, number] => {
    // Horner for p and p'
    let pr = 1;
    let pi = 0;
    let dr = 0;
    let di = 0;
    for (let k = 1; k <= deg; k++) {
      const ndr = dr * xr - di * xi + pr;
      const ndi = dr * xi + di * xr + pi;
      dr = ndr;
      di = ndi;
      const npr = pr * xr - pi * xi + p[k];
      const npi = pr * xi + pi * xr;
      pr = npr;
      pi = npi;
    }
    return [pr, pi, dr, di];
  };
  for (let iter = 0; iter < 2000; iter++) {
    let change = 0;
    for (let i = 0; i < deg; i++) {
      const [pr, pi] = evalP(re[i], im[i]);
      let qr = 1;
      let qi = 0;
      for (let j = 0; j < deg; j++) {
        if (j === i) continue;
        const dr = re[i] - re[j];
        const di = im[i] - im[j];
        const nr = qr * dr - qi * di;
        qi = qr * di + qi * dr;
        qr = nr;
      }
      const den = qr * qr + qi * qi;
      if (den === 0) continue;
      const sr = (pr * qr + pi * qi) / den;
      const si = (pi * qr - pr * qi) / den;
      re[i] -= sr;
      im[i] -= si;
      change = Math.max(change, Math.hypot(sr, si) / (Math.hypot(re[i], im[i]) + 1e-300));
    }
    if (change < 1e-15) break;
  }
  for (let i = 0; i < deg; i++) {
    for (let k = 0; k < 5; k++) {
      const [pr, pi, dr, di] = evalP(re[i], im[i]);
      const den = dr * dr + di * di;
      if (den === 0) break;
      re[i] -= (pr * dr + pi * di) / den;
      im[i] -= (pi * dr - pr * di) / den;
    }
    if (!Number.isFinite(re[i]) || !Number.isFinite(im[i])) throw new PhysicsNumericError('root in polyRoots');
  }
  return { re, im };
}

/**
 * Eigenvalues of a small real matrix.
 *
 * Method: characteristic polynomial by Faddeev–LeVerrier ({@link charPoly}), roots by
 * Durand–Kerner with Newton polishing ({@link polyRoots}). Meant for n ≤ ~6 with well
 * separated eigenvalues (the quarter car has n = 4).
 *
 * @param a n×n matrix, row-major
 * @param n order
 * @returns eigenvalues (complex), unordered
 * @example
 * eigenvalues(new Float64Array([0, 1, -4, 0]), 2); // → ±2i
 */
export function eigenvalues(a: Float64Array, n: number): Eigenvalues {
  return polyRoots(charPoly(a, n));
}

/**
 * Solve the continuous Lyapunov equation `A·P + P·Aᵀ + Q = 0` for symmetric P.
 *
 * Method: half-vectorisation of the Kronecker form `(I⊗A + A⊗I)·vec P = −vec Q` restricted
 * to the n(n+1)/2 independent entries of P, solved by {@link solveLinear}. Requires A stable
 * (all eigenvalues in the open left half-plane) for a unique, positive semi-definite P.
 *
 * @param a n×n system matrix [1/s]
 * @param q n×n symmetric input matrix (e.g. B·Bᵀ)
 * @param n order
 * @returns P, n×n row-major, symmetric
 * @example
 * lyapunov(new Float64Array([-1]), new Float64Array([2]), 1); // → [1]  (−P − P + 2 = 0)
 */
export function lyapunov(a: Float64Array, q: Float64Array, n: number): Float64Array {
  const idx = new Int32Array(n * n);
  let m = 0;
  for (let i = 0; i < n; i++) {
    for (let j = i; j < n; j++) {
      idx[i * n + j] = m;
      idx[j * n + i] = m;
      m++;
    }
  }
  const k = new Float64Array(m * m);
  const rhs = new Float64Array(m);
  let row = 0;
  for (let i = 0; i < n; i++) {
    for (let j = i; j < n; j++) {
      // (A P)_{ij} + (P Aᵀ)_{ij} = Σ_l A_il P_lj + Σ_l P_il A_jl
      for (let l = 0; l < n; l++) {
        k[row * m + idx[l * n + j]] += a[i * n + l];
        k[row * m + idx[i * n + l]] += a[j * n + l];
      }
      rhs[row] = -q[i * n + j];
      row++;
    }
  }
  const v = solveLinear(k, rhs, m);
  const p = new Float64Array(n * n);
  for (let i = 0; i < n * n; i++) p[i] = v[idx[i]];
  return p;
}

/** Discrete-time pair of a sampled linear system. */
export interface DiscreteSystem {
  /** State transition exp(A·dt), n×n row-major. */
  Ad: Float64Array;
  /** Input vector ∫₀^dt exp(A·τ)dτ·B, length n. */
  Bd: Float64Array;
}

/**
 * Exact zero-order-hold discretisation of `x' = A·x + B·u` for a sample interval dt:
 * `Ad = exp(A·dt)`, `Bd = A⁻¹(Ad − I)·B`, computed without inverting A from the block
 * exponential `exp([[A, B], [0, 0]]·dt) = [[Ad, Bd], [0, 1]]`.
 *
 * Source: Van Loan, "Computing integrals involving the matrix exponential", IEEE TAC 1978;
 * Franklin, Powell & Workman, Digital Control of Dynamic Systems, §4.3.
 *
 * @param a n×n system matrix [1/s]
 * @param b input vector, length n
 * @param n order
 * @param dtS sample interval [s], > 0
 * @returns Ad and Bd
 * @example
 * discretizeZoh(new Float64Array([-1]), new Float64Array([1]), 1, 0.5); // → Ad = [e^−0.5 ≈ 0.6065], Bd = [1 − e^−0.5 ≈ 0.3935]
 */
export function discretizeZoh(a: Float64Array, b: Float64Array, n: number, dtS: number): DiscreteSystem {
  const m = n + 1;
  const big = new Float64Array(m * m);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) big[i * m + j] = a[i * n + j] * dtS;
    big[i * m + n] = b[i] * dtS;
  }
  const e = expm(big, m);
  const Ad = new Float64Array(n * n);
  const Bd = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) Ad[i * n + j] = e[i * m + j];
    Bd[i] = e[i * m + n];
  }
  return { Ad, Bd };
}
