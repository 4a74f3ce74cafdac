/**
 * Checks of the damper life model (server/reliability/life-model.ts). The synthetic fleets
 * draw lives from a known true law that differs from the prior in road sensitivity, scale
 * and shape (computed checks, docs/methods.md "Damper life model": the fit should recover the median per road class
 * within about 10–25 % from a few hundred censored dampers).
 */
import { describe, expect, it } from 'vitest';
import { seededRandom } from '../../../server/physics/iso8608';
import {
  fitLifeModel,
  gammaFn,
  lifeKmAt,
  logPosterior,
  meanLifeKmAt,
  modelFromJson,
  modelToJson,
  priorModel,
  type LifeUnit,
} from '../../../server/reliability/life-model';

const RATED = 90_000;
/** Severity of the ISO classes at 80 km/h (rod sliding ∝ √Gd(n0), computed): A ½, B 1, C 2, D 4. */
const CLASS_SEVERITY = { A: 0.5, B: 1, C: 2, D: 4 } as const;

/**
 * A fleet whose true life at severity s is Weibull(shape kTrue, scale RATED·cTrue·s^−bTrue),
 * each damper driving a mix of two classes, censored at a uniform random distance (running
 * units) or with probability 0.1 at a random share of its life (removed for another reason).
 */
function syntheticFleet(n: number, seed: number, truth = { bTrue: 1.0, cTrue: 1.3, kTrue: 3.5 }): LifeUnit[] {
  const rand = seededRandom(seed);
  const classes = Object.values(CLASS_SEVERITY);
  const units: LifeUnit[] = [];
  for (let i = 0; i < n; i++) {
    const s1 = classes[Math.floor(rand() * 4)];
    const s2 = classes[Math.floor(rand() * 4)];
    const share = rand();
    // wear km per km of this damper's mix under the true law
    const perKm = share * Math.pow(s1, truth.bTrue) + (1 - share) * Math.pow(s2, truth.bTrue);
    const lifeWear = RATED * truth.cTrue * Math.pow(-Math.log(1 - rand()), 1 / truth.kTrue);
    const lifeKm = lifeWear / perKm;
    const censorKm = rand() < 0.1 ? lifeKm * rand() : 250_000 * rand();
    const km = Math.min(lifeKm, censorKm);
    units.push({ ratedKm: RATED, failed: lifeKm <= censorKm, rows: [{ km: km * share, severity: s1 }, { km: km * (1 - share), severity: s2 }] });
  }
  return units;
}

describe('life model prior', () => {
  it('gives the rated km as median life on class B at 80 km/h (severity 1) — stated convention', () => {
    expect(lifeKmAt(priorModel(), RATED, 1, 0.5)).toBeCloseTo(RATED, 6);
  });

  it('shortens life on class D by the severe-service ratio: 1.5× per class step, 2.25× over two (common practice: severe service about halves intervals)', () => {
    const m = priorModel();
    const ratio = lifeKmAt(m, RATED, CLASS_SEVERITY.B, 0.5) / lifeKmAt(m, RATED, CLASS_SEVERITY.D, 0.5);
    expect(ratio).toBeCloseTo(2.25, 6);
    expect(ratio).toBeGreaterThan(1.8);
    expect(ratio).toBeLessThan(3);
  });

  it('returns the prior when no damper has failed', () => {
    const units = syntheticFleet(50, 3).map((u) => ({ ...u, failed: false }));
    const m = fitLifeModel(units);
    const p = priorModel();
    expect(m.source).toBe('prior');
    expect(m.beta0).toBe(p.beta0);
    expect(m.b).toBe(p.b);
    expect(m.suspensions).toBe(50);
  });

  it('Γ by Lanczos matches known values (Γ(5) = 24, Γ(½) = √π; published identities)', () => {
    expect(gammaFn(5)).toBeCloseTo(24, 10);
    expect(gammaFn(0.5)).toBeCloseTo(Math.sqrt(Math.PI), 10);
  });
});

describe('life model fit on a synthetic fleet with a known true law (computed)', () => {
  const truth = { bTrue: 1.0, cTrue: 1.3, kTrue: 3.5 };
  const units = syntheticFleet(400, 11, truth);
  const m = fitLifeModel(units);

  it('counts failures and suspensions', () => {
    expect(m.source).toBe('fleet');
    expect(m.failures + m.suspensions).toBe(400);
    expect(m.failures).toBeGreaterThan(100);
  });

  it.each(Object.entries(CLASS_SEVERITY))('recovers the median life on class %s within 25 %', (_cls, s) => {
    const trueMedian = (RATED * truth.cTrue * Math.pow(Math.log(2), 1 / truth.kTrue)) / Math.pow(s, truth.bTrue);
    const fitted = lifeKmAt(m, RATED, s, 0.5);
    expect(Math.abs(fitted / trueMedian - 1)).toBeLessThan(0.25);
  });

  it('moves the road sensitivity from the prior toward the truth', () => {
    const p = priorModel();
    expect(Math.abs(m.b - truth.bTrue)).toBeLessThan(Math.abs(p.b - truth.bTrue));
  });

  it('is the posterior mode: no point of a grid around it scores higher (independent search)', () => {
    const best = logPosterior(units, [m.beta0, m.b, Math.log(1 / m.shape)]);
    for (const d0 of [-0.02, 0, 0.02]) {
      for (const d1 of [-0.02, 0, 0.02]) {
        for (const d2 of [-0.02, 0, 0.02]) {
          if (!d0 && !d1 && !d2) continue;
          expect(logPosterior(units, [m.beta0 + d0, m.b + d1, Math.log(1 / m.shape) + d2])).toBeLessThan(best);
        }
      }
    }
  });

  it('moves more toward the data with more removals: 40 dampers stay nearer the prior than 400', () => {
    const small = fitLifeModel(syntheticFleet(40, 5, truth));
    const p = priorModel();
    expect(Math.abs(small.b - p.b)).toBeLessThan(Math.abs(m.b - p.b) + 0.05);
  });

  it('mean life is scale·Γ(1 + 1/k) (Weibull mean, published identity)', () => {
    const scale = RATED * Math.exp(m.beta0);
    expect(meanLifeKmAt(m, RATED, 1)).toBeCloseTo(scale * gammaFn(1 + 1 / m.shape), 6);
  });

  it('round-trips through JSON', () => {
    const back = modelFromJson(JSON.parse(JSON.stringify(modelToJson(m))));
    expect(back.beta0).toBe(m.beta0);
    expect(back.b).toBe(m.b);
    expect(back.shape).toBe(m.shape);
    expect(() => modelFromJson({ beta0: 0, roadSensitivity: 5, shape: 2 })).toThrow(/roadSensitivity/);
  });
});
