/**
 * The demo fleet's damper removal history: a law of its own, chosen for the demo and written
 * in docs/methods.md ("Demo fleet"), deliberately unlike the app's wear models (no energy, no
 * ISO class exponent, no Weibull): so that a model fitted to these removals is checked against
 * something it was not built from.
 *
 * - A damper's life for wear [km] is lognormal: `ln L ~ N(ln m, σ²)` with median
 *   `m = m0 · (1 − k · s)`, where `s` is the share of its vehicle's driven km on segments of
 *   ISO 8608 class {@link ROUGH_FROM_CLASS} or rougher (the vehicle's route mix) and `m0`, `k`, `σ` per spec
 *   ({@link DEMO_LIFE_LAWS}).
 * - Competing removals that say nothing about wear (right-censoring): accident damage to one
 *   corner (exponential, mean {@link ACCIDENT_MEAN_KM} km per corner) and dampers renewed with
 *   other suspension work on the axle (exponential, mean {@link OTHER_WORK_MEAN_KM} km per axle).
 * - When one damper of an axle is removed for wear or damage, its partner is renewed with it
 *   ("fitted as a pair") with probability {@link PAIR_SHARE} (common practice: dampers are
 *   replaced in axle pairs), otherwise it stays.
 * - Wear removals are split among the reasons mechanics record: low adhesion on the test lane,
 *   leaking, noise or knocking.
 */

export interface DemoLifeLaw {
  /** Median life on roads with no class D or rougher [km]. */
  medianKm: number;
  /** Fractional drop of the median per unit rough share (0–1). */
  roughSlope: number;
  /** Standard deviation of ln L. */
  sigma: number;
}

/** Per spec prefix (CV courier van, LV long-body van, RT rigid truck). */
export const DEMO_LIFE_LAWS: Record<string, DemoLifeLaw> = {
  CV: { medianKm: 94_000, roughSlope: 0.5, sigma: 0.45 },
  LV: { medianKm: 90_000, roughSlope: 0.5, sigma: 0.45 },
  RT: { medianKm: 132_000, roughSlope: 0.45, sigma: 0.4 },
};

/** The class from which a segment counts as rough in the route mix. */
export const ROUGH_FROM_CLASS = 'C';

export const ACCIDENT_MEAN_KM = 1_500_000;
export const OTHER_WORK_MEAN_KM = 1_500_000;
export const PAIR_SHARE = 0.75;
export const WEAR_REASONS = ['worn: low adhesion', 'leaking', 'noise or knocking'] as const;
export const CENSORING_REASONS = ['fitted as a pair', 'accident damage', 'fitted with other work', 'vehicle retired'] as const;

/** Median life for wear [km] under a law at a rough share `s` (0–1). */
export function demoMedianLifeKm(law: DemoLifeLaw, roughShare: number): number {
  return law.medianKm * (1 - law.roughSlope * Math.min(1, Math.max(0, roughShare)));
}

/** Mean of the lognormal life [km]: median · exp(σ²/2). */
export function demoMeanLifeKm(law: DemoLifeLaw, roughShare: number): number {
  return demoMedianLifeKm(law, roughShare) * Math.exp((law.sigma * law.sigma) / 2);
}

/** One damper's span on a corner: fitted at `fittedKm`, removed at `removedKm` (null: still fitted). */
export interface DemoDamperSpan {
  position: string;
  fittedKm: number;
  removedKm: number | null;
  reason: string | null;
  /** Index of the workshop visit that removed it (spans removed together share it). */
  visit: number | null;
}

/** A workshop visit of the history: where on the odometer, and why. */
export interface DemoVisit {
  km: number;
  kind: 'wear' | 'accident' | 'other_work';
  /** The corner whose wear or damage brought the axle in (null for other work). */
  cause: string | null;
}

const normal = (rand: () => number) => {
  const u = Math.max(1e-12, rand());
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * rand());
};
const exponential = (rand: () => number, mean: number) => -mean * Math.log(Math.max(1e-12, rand()));

/**
 * Simulates one axle's dampers from commissioning (0 km) to `odometerKm`: the spans on its two
 * corners and the workshop visits that ended them. Deterministic for a given `rand`.
 */
export function simulateAxleHistory(rand: () => number, law: DemoLifeLaw, roughShare: number, odometerKm: number, positions: [string, string]) {
  const median = demoMedianLifeKm(law, roughShare);
  const drawLife = () => median * Math.exp(law.sigma * normal(rand));
  const spans: DemoDamperSpan[] = [];
  const visits: DemoVisit[] = [];
  const fit = (position: string, km: number) => {
    const span: DemoDamperSpan = { position, fittedKm: km, removedKm: null, reason: null, visit: null };
    spans.push(span);
    return { span, wearAt: km + drawLife(), accidentAt: km + exponential(rand, ACCIDENT_MEAN_KM) };
  };
  const corners = positions.map((p) => fit(p, 0));
  let otherWorkAt = exponential(rand, OTHER_WORK_MEAN_KM);
  for (;;) {
    const next = Math.min(otherWorkAt, ...corners.flatMap((c) => [c.wearAt, c.accidentAt]));
    if (!(next < odometerKm)) break;
    const visit = visits.length;
    const remove = (i: number, reason: string) => {
      Object.assign(corners[i].span, { removedKm: next, reason, visit });
      corners[i] = fit(positions[i], next);
    };
    if (next === otherWorkAt) {
      visits.push({ km: next, kind: 'other_work', cause: null });
      remove(0, 'fitted with other work');
      remove(1, 'fitted with other work');
      otherWorkAt = next + exponential(rand, OTHER_WORK_MEAN_KM);
      continue;
    }
    const i = corners.findIndex((c) => c.wearAt === next || c.accidentAt === next);
    const worn = corners[i].wearAt === next;
    visits.push({ km: next, kind: worn ? 'wear' : 'accident', cause: positions[i] });
    remove(i, worn ? WEAR_REASONS[Math.floor(rand() * WEAR_REASONS.length)] : 'accident damage');
    if (rand() < PAIR_SHARE) remove(1 - i, 'fitted as a pair');
  }
  return { spans, visits };
}
