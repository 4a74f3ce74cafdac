/**
 * Damper life model: a Weibull accelerated-failure-time (AFT) regression of life on road
 * severity, fitted per suspension spec to the fleet's own removals (censored maximum
 * likelihood), starting from a prior that states what the trade knows. See docs/methods.md,
 * "Damper life model".
 *
 * Life of a damper that spends its whole life at severity `s` (server/wear/life-law.ts):
 *
 *     ln(T / R) = β0 − b·ln(s) + σ·ε,   ε standard smallest-extreme-value
 *
 * with R the spec axle's rated km, so T is Weibull with shape k = 1/σ and scale
 * R·e^β0·s^(−b). A damper whose severity varies is handled by the cumulative-exposure rule:
 * its "wear km" W = Σ km·s^b is the distance at reference severity that did the same wear, and
 * it fails when W reaches a Weibull(R·e^β0, k) draw. The likelihood of a damper removed for
 * wear after wear km W (or still running / removed for another reason, right-censored) is
 * that of W.
 *
 * Prior (stated assumptions, common practice where marked): the median life at severity 1
 * (ISO 8608 class B at 80 km/h) is the rated km; one ISO class step rougher (severity ×2,
 * rod sliding ∝ √Gd(n0)) shortens life by a factor 1.5, so class D at the same speed gives
 * 2.25× shorter life — makers' severe-service schedules commonly halve intervals (common
 * practice); Weibull shape 2.5 (wear-out). The fit is the posterior mode (MAP) with normal
 * priors on β0, b and ln σ: the prior on β0 weighs as much as `priorRemovals` removals, so
 * the fleet's data outweigh it from about that many removals on.
 *
 * @module
 */
import { gamma } from '../physics/gamma';

/** Distance [km] a damper ran at one road severity [1]. */
export interface ExposureRow {
  km: number;
  severity: number;
}

/** One damper as the fit sees it. */
export interface LifeUnit {
  rows: ExposureRow[];
  /** Removed for wear (a failure); false = still fitted or removed for another reason. */
  failed: boolean;
  /** The spec axle's rated km. */
  ratedKm: number;
}

export interface LifePrior {
  /** Life ratio per ISO 8608 class step (severity ×2) [1]. */
  classStepFactor: number;
  /** Weibull shape [1]. */
  shape: number;
  /** How many removals the prior on the life scale weighs [1]. */
  removals: number;
  /** Prior standard deviations of the road sensitivity b and of ln σ. */
  sdB: number;
  sdLogSigma: number;
}

export const DEFAULT_PRIOR: LifePrior = Object.freeze({ classStepFactor: 1.5, shape: 2.5, removals: 5, sdB: 0.25, sdLogSigma: 0.3 });

/** Bounds of the road sensitivity b (life ∝ s^−b): 0 = roads do not matter; 1.25 ≈ 2.4× per class step. */
export const B_MIN = 0;
export const B_MAX = 1.25;

export interface LifeModel {
  /** ln of the Weibull scale at severity 1, relative to the rated km. */
  beta0: number;
  /** Road sensitivity: life ∝ severity^(−b). */
  b: number;
  /** Weibull shape k = 1/σ. */
  shape: number;
  /** 'prior' when no removal for wear is on record, else 'fleet'. */
  source: 'prior' | 'fleet';
  failures: number;
  suspensions: number;
  /** Life ratio per ISO class step under this model, 2^b. */
  classStepFactor: number;
  prior: LifePrior;
}

const LN2 = Math.log(2);

/** The prior's parameters. */
export function priorModel(prior: LifePrior = DEFAULT_PRIOR): LifeModel {
  const sigma = 1 / prior.shape;
  const b = Math.log(prior.classStepFactor) / LN2;
  // median e^β0·(ln 2)^σ = 1 (rated km at severity 1)
  const beta0 = -sigma * Math.log(Math.log(2));
  return { beta0, b, shape: prior.shape, source: 'prior', failures: 0, suspensions: 0, classStepFactor: prior.classStepFactor, prior };
}

/** Wear km of a damper's exposure under road sensitivity b: Σ km·s^b. */
export function wearKm(rows: readonly ExposureRow[], b: number): number {
  let w = 0;
  for (const r of rows) if (r.km > 0) w += r.km * Math.pow(r.severity > 0 ? r.severity : 1, b);
  return w;
}

/** Quantile q of life in wear km (distance at severity 1) for rated km R. */
export function lifeWearKm(m: LifeModel, ratedKm: number, q: number): number {
  return ratedKm * Math.exp(m.beta0) * Math.pow(-Math.log(1 - q), 1 / m.shape);
}

/** Quantile q of the life [km] of a damper that runs its whole life at severity s. */
export function lifeKmAt(m: LifeModel, ratedKm: number, severity: number, q: number): number {
  return lifeWearKm(m, ratedKm, q) / Math.pow(severity, m.b);
}

/** Mean life [km] at severity s: scale·Γ(1 + 1/k). */
export function meanLifeKmAt(m: LifeModel, ratedKm: number, severity: number): number {
  return (ratedKm * Math.exp(m.beta0) * gamma(1 + 1 / m.shape)) / Math.pow(severity, m.b);
}

/** Probability that a damper at wear km w fails before w + dw, given it has survived to w. */
export function conditionalFailure(m: LifeModel, ratedKm: number, w: number, dw: number): number {
  const scale = ratedKm * Math.exp(m.beta0);
  const h = (x: number) => Math.pow(Math.max(0, x) / scale, m.shape);
  return 1 - Math.exp(-(h(w + dw) - h(w)));
}

/**
 * Log posterior (up to a constant) of θ = (β0, b, ln σ) given the units. Per unit, with
 * w = (ln(W/R) − β0)/σ: a failure adds −ln σ + w − e^w, a censored unit −e^w (the −ln T term
 * of a failure's density does not depend on θ and is left out).
 */
export function logPosterior(units: readonly LifeUnit[], theta: readonly [number, number, number], prior: LifePrior = DEFAULT_PRIOR): number {
  const [beta0, b, ls] = theta;
  const sigma = Math.exp(ls);
  let ll = 0;
  for (const u of units) {
    const W = wearKm(u.rows, b) / u.ratedKm;
    if (!(W > 0)) continue;
    const w = (Math.log(W) - beta0) / sigma;
    ll += (u.failed ? -ls + w : 0) - Math.exp(w);
  }
  const p = priorModel(prior);
  const sigmaP = 1 / prior.shape;
  const sdBeta0 = sigmaP / Math.sqrt(prior.removals);
  const z = (x: number, mu: number, sd: number) => ((x - mu) / sd) ** 2;
  return ll - 0.5 * (z(beta0, p.beta0, sdBeta0) + z(b, p.b, prior.sdB) + z(ls, Math.log(sigmaP), prior.sdLogSigma));
}

/**
 * Fits the model to a spec's dampers: the posterior mode by Newton's method on θ with
 * finite-difference derivatives and a backtracking line search, b kept within [B_MIN, B_MAX].
 * With no failure on record it returns the prior.
 */
export function fitLifeModel(units: readonly LifeUnit[], prior: LifePrior = DEFAULT_PRIOR): LifeModel {
  const usable = units.filter((u) => u.ratedKm > 0 && wearKm(u.rows, 0) > 0);
  const failures = usable.filter((u) => u.failed).length;
  const suspensions = usable.length - failures;
  const p0 = priorModel(prior);
  if (failures === 0) return { ...p0, suspensions };
  const f = (t: number[]) => logPosterior(usable, [t[0], clampB(t[1]), t[2]], prior);
  let theta = [p0.beta0, p0.b, Math.log(1 / p0.shape)];
  let fx = f(theta);
  const h = 1e-4;
  for (let iter = 0; iter < 100; iter++) {
    const g = [0, 0, 0];
    const H = [[0, 0, 0], [0, 0, 0], [0, 0, 0]];
    for (let i = 0; i < 3; i++) {
      const tp = theta.slice(); tp[i] += h;
      const tm = theta.slice(); tm[i] -= h;
      const fp = f(tp), fm = f(tm);
      g[i] = (fp - fm) / (2 * h);
      H[i][i] = (fp - 2 * fx + fm) / (h * h);
      for (let j = 0; j < i; j++) {
        const a = theta.slice(); a[i] += h; a[j] += h;
        const bb = theta.slice(); bb[i] += h; bb[j] -= h;
        const c = theta.slice(); c[i] -= h; c[j] += h;
        const d = theta.slice(); d[i] -= h; d[j] -= h;
        H[i][j] = H[j][i] = (f(a) - f(bb) - f(c) + f(d)) / (4 * h * h);
      }
    }
    // Newton step on −f (H negative definite near the mode); fall back to gradient ascent
    let step = solve3(H.map((r) => r.map((x) => -x)), g);
    if (!step || step.reduce((s, x, i) => s + x * g[i], 0) <= 0) step = g.map((x) => x * 0.01);
    let t = 1;
    let next = theta;
    let fn = fx;
    for (let k = 0; k < 30; k++) {
      const cand = theta.map((x, i) => x + t * step[i]);
      cand[1] = clampB(cand[1]);
      const fc = f(cand);
      if (fc > fx) {
        next = cand;
        fn = fc;
        break;
      }
      t /= 2;
    }
    const moved = Math.max(...next.map((x, i) => Math.abs(x - theta[i])));
    theta = next;
    const gain = fn - fx;
    fx = fn;
    if (moved < 1e-9 || gain < 1e-12) break;
  }
  const shape = Math.exp(-theta[2]);
  const b = clampB(theta[1]);
  return { beta0: theta[0], b, shape, source: 'fleet', failures, suspensions, classStepFactor: Math.pow(2, b), prior };
}

const clampB = (b: number) => Math.min(B_MAX, Math.max(B_MIN, b));

function solve3(A: number[][], y: number[]): number[] | null {
  const m = A.map((r, i) => [...r, y[i]]);
  for (let c = 0; c < 3; c++) {
    let piv = c;
    for (let r = c + 1; r < 3; r++) if (Math.abs(m[r][c]) > Math.abs(m[piv][c])) piv = r;
    if (Math.abs(m[piv][c]) < 1e-14) return null;
    [m[c], m[piv]] = [m[piv], m[c]];
    for (let r = 0; r < 3; r++) {
      if (r === c) continue;
      const k = m[r][c] / m[c][c];
      for (let j = c; j < 4; j++) m[r][j] -= k * m[c][j];
    }
  }
  return m.map((r, i) => r[3] / m[i][i]);
}

/** The model as stored and printed (readable by {@link modelFromJson}). */
export function modelToJson(m: LifeModel) {
  return {
    beta0: m.beta0,
    roadSensitivity: m.b,
    shape: m.shape,
    classStepFactor: m.classStepFactor,
    source: m.source,
    failures: m.failures,
    suspensions: m.suspensions,
    prior: { ...m.prior },
  };
}

export function modelFromJson(j: unknown): LifeModel {
  const o = j as Record<string, unknown>;
  const num = (k: string) => {
    const v = o?.[k];
    if (typeof v !== 'number' || !Number.isFinite(v)) throw new Error(`life model: "${k}" must be a finite number`);
    return v;
  };
  const beta0 = num('beta0');
  const b = num('roadSensitivity');
  const shape = num('shape');
  if (!(shape > 0)) throw new Error('life model: "shape" must be positive');
  if (b < B_MIN || b > B_MAX) throw new Error(`life model: "roadSensitivity" must be within ${B_MIN}–${B_MAX}`);
  const pr = (o.prior ?? {}) as Partial<LifePrior>;
  const prior = { ...DEFAULT_PRIOR, ...Object.fromEntries(Object.entries(pr).filter(([, v]) => typeof v === 'number' && Number.isFinite(v))) } as LifePrior;
  return {
    beta0,
    b,
    shape,
    source: o.source === 'fleet' ? 'fleet' : 'prior',
    failures: typeof o.failures === 'number' ? o.failures : 0,
    suspensions: typeof o.suspensions === 'number' ? o.suspensions : 0,
    classStepFactor: Math.pow(2, b),
    prior,
  };
}
