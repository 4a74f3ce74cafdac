/**
 * Two-parameter Weibull life distribution fitted by maximum likelihood to failures and
 * right-censored units (suspensions: still running, or removed for a reason that is not wear).
 * Pure functions, no I/O.
 *
 * Model: F(t) = 1 − exp(−(t/η)^β), shape β, scale η (same unit as the lives).
 * Log-likelihood with r failures t_i and suspensions s_j:
 *   ℓ = Σ_fail [ln β − β ln η + (β − 1) ln t_i] − Σ_all (t/η)^β
 * For a given β the best η is η̂(β) = (Σ_all t^β / r)^(1/β); β̂ solves the profile score
 *   g(β) = Σ t^β ln t / Σ t^β − 1/β − (1/r) Σ_fail ln t_i = 0,
 * which increases monotonically in β (a standard result for the Weibull MLE, e.g. Lawless,
 * "Statistical Models and Methods for Lifetime Data"; from memory), so bisection on ln β is safe.
 *
 * Confidence bounds: Fisher-matrix (Wald) bounds on ln β, ln η and ln B10 from the observed
 * information (the negative Hessian of ℓ in (ln β, ln η), by central differences), two-sided at
 * the stated level; they are approximate and widen as failures get few.
 *
 * @module
 */
import { CsvSyntaxError, readCsv, type CsvRow } from '../lib/csv';
import type { WeibullFit } from '../contracts/workshop';
import { gamma } from '../physics/gamma';

/** A fit's figures, kept with the contracts: the fleet life page shows them. */
export type { WeibullFit } from '../contracts/workshop';

/** One unit's life and whether it ended in a failure (true) or is censored (false). */
export interface LifeObservation {
  /** Life [any positive unit: km, J]. */
  life: number;
  /** True for a failure (removal for wear), false for a suspension (right-censored). */
  failed: boolean;
}

export class WeibullInputError extends Error {
  constructor(message: string) {
    super(`weibull: ${message}`);
    this.name = 'WeibullInputError';
  }
}

/**
 * Weibull log-likelihood of failures and suspensions.
 *
 * @param data lives [unit] with failure flags
 * @param shape β [1]
 * @param scale η [unit]
 * @returns ℓ (natural log)
 * @example
 * weibullLogLikelihood([{ life: 1, failed: true }], 1, 1); // → -1
 */
export function weibullLogLikelihood(data: readonly LifeObservation[], shape: number, scale: number): number {
  let l = 0;
  const lb = Math.log(shape);
  const le = Math.log(scale);
  for (const d of data) {
    const lt = Math.log(d.life);
    if (d.failed) l += lb - shape * le + (shape - 1) * lt;
    l -= Math.exp(shape * (lt - le));
  }
  return l;
}

/** Standard normal quantile for the two-sided levels we offer (common values, from tables). */
const Z: Record<string, number> = { '0.8': 1.2815515655, '0.9': 1.6448536270, '0.95': 1.9599639845, '0.99': 2.5758293035 };

/**
 * Maximum-likelihood Weibull fit with right censoring.
 *
 * @param data lives [unit] > 0 with failure flags; needs at least 2 failures with different lives
 * @param opts two-sided confidence level of the bounds: 0.8, 0.9, 0.95 (default) or 0.99
 * @returns shape, scale, B10, mean, counts and Fisher-matrix bounds
 * @throws WeibullInputError on non-positive or non-finite lives or too few distinct failures
 * @example
 * fitWeibull([{life: 1, failed: true}, {life: 2, failed: true}, {life: 3, failed: false}]).shape; // → ≈ 2.1
 */
export function fitWeibull(data: readonly LifeObservation[], opts: { level?: 0.8 | 0.9 | 0.95 | 0.99 } = {}): WeibullFit {
  data.forEach((d, i) => {
    if (!Number.isFinite(d.life) || d.life <= 0) throw new WeibullInputError(`row ${i + 1}: life must be a positive number (got ${d.life})`);
  });
  const fails = data.filter((d) => d.failed);
  const r = fails.length;
  if (r < 2) throw new WeibullInputError(`needs at least 2 failures to fit (got ${r})`);
  if (new Set(fails.map((d) => d.life)).size < 2) throw new WeibullInputError('needs failures at two or more different lives');
  // scale the lives to ~1 for numerical safety; shape is scale-free
  const ref = Math.exp(fails.reduce((s, d) => s + Math.log(d.life), 0) / r);
  const lt = data.map((d) => Math.log(d.life / ref));
  const sumLnFail = data.reduce((s, d, i) => s + (d.failed ? lt[i] : 0), 0);
  const score = (b: number): number => {
    let s0 = 0, s1 = 0;
    for (const x of lt) {
      const w = Math.exp(b * x);
      s0 += w;
      s1 += w * x;
    }
    return s1 / s0 - 1 / b - sumLnFail / r;
  };
  let lo = Math.log(0.01);
  let hi = Math.log(100);
  if (score(Math.exp(lo)) > 0 || score(Math.exp(hi)) < 0) throw new WeibullInputError('the shape is outside 0.01–100; the data do not look like a Weibull life sample');
  for (let i = 0; i < 200 && hi - lo > 1e-13; i++) {
    const m = (lo + hi) / 2;
    if (score(Math.exp(m)) < 0) lo = m;
    else hi = m;
  }
  const shape = Math.exp((lo + hi) / 2);
  const sumW = lt.reduce((s, x) => s + Math.exp(shape * x), 0);
  const scale = ref * Math.pow(sumW / r, 1 / shape);
  const kB10 = Math.log(-Math.log(0.9));
  const b10 = scale * Math.exp(kB10 / shape);
  const level = opts.level ?? 0.95;
  const z = Z[String(level)];
  const ll = (a: number, c: number) => weibullLogLikelihood(data, Math.exp(a), Math.exp(c));
  const a0 = Math.log(shape);
  const c0 = Math.log(scale);
  // observed information in (ln β, ln η) by central differences
  const h = 1e-4;
  const f0 = ll(a0, c0);
  const haa = (ll(a0 + h, c0) - 2 * f0 + ll(a0 - h, c0)) / (h * h);
  const hcc = (ll(a0, c0 + h) - 2 * f0 + ll(a0, c0 - h)) / (h * h);
  const hac = (ll(a0 + h, c0 + h) - ll(a0 + h, c0 - h) - ll(a0 - h, c0 + h) + ll(a0 - h, c0 - h)) / (4 * h * h);
  const det = haa * hcc - hac * hac;
  let bounds: WeibullFit['bounds'] = null;
  if (det > 0 && haa < 0) {
    // covariance = inverse of the information (−H)
    const vaa = -hcc / det;
    const vcc = -haa / det;
    const vac = hac / det;
    const sa = Math.sqrt(vaa);
    const sc = Math.sqrt(vcc);
    // ln B10 = ln η + k/β → gradient wrt (ln β, ln η) = (−k/β, 1)
    const ga = -kB10 / shape;
    const sb = Math.sqrt(Math.max(0, ga * ga * vaa + 2 * ga * vac + vcc));
    bounds = {
      level,
      method: 'Fisher matrix (Wald) on ln β, ln η and ln B10',
      shape: [shape * Math.exp(-z * sa), shape * Math.exp(z * sa)],
      scale: [scale * Math.exp(-z * sc), scale * Math.exp(z * sc)],
      b10: [b10 * Math.exp(-z * sb), b10 * Math.exp(z * sb)],
    };
  }
  return { shape, scale, b10, mean: scale * gamma(1 + 1 / shape), failures: r, suspensions: data.length - r, logLikelihood: f0, bounds };
}

/** Weibull reliability (survival) R(t) = exp(−(t/η)^β). */
export const weibullSurvival = (t: number, shape: number, scale: number): number => Math.exp(-Math.pow(t / scale, shape));

/**
 * Plotting positions for a Weibull probability plot with censoring: Johnson's adjusted ranks
 * with Bernard's median-rank approximation F ≈ (j − 0.3)/(n + 0.4) (common practice).
 *
 * @returns one point per failure: life and estimated unreliability F [1]
 * @example
 * weibullPlotPoints([{life: 1, failed: true}, {life: 2, failed: true}]); // → F ≈ 0.29, 0.71
 */
export function weibullPlotPoints(data: readonly LifeObservation[]): { life: number; unreliability: number }[] {
  const sorted = [...data].sort((a, b) => a.life - b.life || Number(b.failed) - Number(a.failed));
  const n = sorted.length;
  let prev = 0;
  const out: { life: number; unreliability: number }[] = [];
  sorted.forEach((d, i) => {
    if (!d.failed) return;
    const reverseRank = n - i;
    const j = prev + (n + 1 - prev) / (1 + reverseRank);
    prev = j;
    out.push({ life: d.life, unreliability: (j - 0.3) / (n + 0.4) });
  });
  return out;
}

/**
 * Parses the CLI's CSV: a header with `life` and `failed` (1 removal, 0 still running).
 *
 * @throws WeibullInputError naming the row of a bad value
 */
export function parseLifeCsv(text: string): LifeObservation[] {
  let rows: CsvRow[];
  try {
    rows = readCsv(text);
  } catch (e) {
    if (e instanceof CsvSyntaxError) throw new WeibullInputError(`${e.line !== null ? `row ${e.line}: ` : ''}${e.message}`);
    throw e;
  }
  if (!rows.length) throw new WeibullInputError('the file is empty');
  const head = rows[0].cells.map((h) => h.toLowerCase());
  const iLife = head.indexOf('life');
  const iFailed = head.indexOf('failed');
  if (iLife < 0 || iFailed < 0) throw new WeibullInputError('the header must name the columns life and failed');
  return rows.slice(1).map(({ line, cells }) => {
    const life = Number(cells[iLife]);
    const f = cells[iFailed];
    if (cells[iLife] === undefined || cells[iLife] === '' || !Number.isFinite(life) || life <= 0) throw new WeibullInputError(`row ${line}: life must be a positive number (got "${cells[iLife] ?? ''}")`);
    if (f !== '0' && f !== '1') throw new WeibullInputError(`row ${line}: failed must be 1 or 0 (got "${f ?? ''}")`);
    return { life, failed: f === '1' };
  });
}
