/**
 * The fleet's own damper life: the life model of each spec fitted to the fleet's removals
 * (server/reliability/life-model.ts), the life each damper's wear is measured against, the
 * damper-life page's figures and the back-test. See docs/methods.md, "Damper life model" and
 * "Back-test".
 *
 * - Removals for wear are failures; units still fitted, or removed for a reason that says
 *   nothing about their wear ({@link CENSORED_REASONS}), are right-censored.
 * - A damper's road mix: its own duty records (distance per severity) where they cover its
 *   life; the distance they do not cover takes the mix of its vehicle's recorded trips at the
 *   same position (ASSUMPTION: the vehicle drove the same kind of roads before the records),
 *   or severity 1 when the vehicle has no trips on record. So removals from before the records
 *   still teach the fit.
 * - A test-lane result on a damper (measured damping) calibrates that damper's own life: the
 *   factor that puts its life used at the test where the measured damping says (inverse of the
 *   wear model's linear fade), bounded to ⅓–3×.
 */
import { DAMPING_AT_END_OF_LIFE, formatKm, type LifeBasis, type LifeResolver } from '../wear/wear';
import {
  DEFAULT_PRIOR,
  fitLifeModel,
  lifeKmAt,
  lifeWearKm,
  meanLifeKmAt,
  modelFromJson,
  modelToJson,
  priorModel,
  wearKm,
  type LifeModel,
  type LifePrior,
  type LifeUnit,
} from '../reliability/life-model';
import { fitWeibull, weibullPlotPoints, type LifeObservation, type WeibullFit } from '../reliability/weibull';
import { lifeRepository } from './life-repository';
import { damperLives, specLifeUnits, toUnit, type DamperLife } from './life-units';

export { damperLives, specLifeUnits, type DamperLife };
import { workshopRepository } from './repository';

import { CENSORED_REASONS, WEAR_REASONS, type Backtest, type BacktestPoint } from '../contracts/workshop';

export { CENSORED_REASONS, REMOVAL_REASONS, WEAR_REASONS } from '../contracts/workshop';

/** Factor by which the model's and the fleet's mean lives may differ before the page warns. */
export const DISAGREEMENT_FACTOR = 1.5;

export interface LifeSettings {
  calendarYears: number;
  scheduleQuantile: number;
  prior: LifePrior;
}

/** Refits every spec's life model to its dampers and stores it; returns spec id → model. */
export async function refitLifeModels(settings: LifeSettings, now: Date, read?: { bandRows: number }): Promise<Map<number, LifeModel>> {
  const out = new Map<number, LifeModel>();
  for (const s of await workshopRepository.specs()) {
    const m = fitLifeModel(await specLifeUnits(s.id, read), settings.prior);
    out.set(s.id, m);
    await lifeRepository.storeModel(s.id, JSON.stringify(modelToJson(m)), m.failures, m.suspensions, now);
  }
  return out;
}

/** The stored model of every spec (the prior for a spec not fitted yet). */
export async function storedLifeModels(prior: LifePrior = DEFAULT_PRIOR): Promise<Map<number, LifeModel>> {
  const [specs, rows] = await Promise.all([workshopRepository.specs(), lifeRepository.storedModels()]);
  const stored = new Map(rows.map((r) => [r.spec_id, r.model]));
  const out = new Map<number, LifeModel>();
  for (const s of specs) {
    const text = stored.get(s.id);
    out.set(s.id, text ? modelFromJson(JSON.parse(text)) : priorModel(prior));
  }
  return out;
}

/** Words for a model: how it was fitted. */
export function modelNote(m: LifeModel): string {
  return m.source === 'fleet'
    ? `fitted to the fleet's own removals (${m.failures} for wear, ${m.suspensions} still fitted or removed for other reasons) from the trade's prior; ${m.classStepFactor.toFixed(2)}× shorter per ISO 8608 class step, Weibull shape ${m.shape.toFixed(1)}`
    : `the trade's prior (no removal for wear on record yet): the rated km on ISO 8608 class B at 80 km/h, ${m.classStepFactor.toFixed(2)}× shorter per class step, Weibull shape ${m.shape.toFixed(1)}`;
}

/** The life basis of a spec axle under a model. */
export function lifeBasis(m: LifeModel, ratedKm: number): LifeBasis {
  return {
    b: m.b,
    medianWearKm: lifeWearKm(m, ratedKm, 0.5),
    p10WearKm: lifeWearKm(m, ratedKm, 0.1),
    p90WearKm: lifeWearKm(m, ratedKm, 0.9),
    source: m.source,
    note: `median life ${formatKm(lifeWearKm(m, ratedKm, 0.5))} on the rated road (rated ${formatKm(ratedKm)}); ${modelNote(m)}`,
  };
}

/** Life used implied by a measured damping (inverse of the wear model's linear fade). */
export function lifeUsedFromDamping(measuredNsPerM: number, nominalNsPerM: number): number {
  const u = (1 - measuredNsPerM / nominalNsPerM) / (1 - DAMPING_AT_END_OF_LIFE);
  return Math.min(1, Math.max(0.01, u));
}

/**
 * The life resolver of the nightly job: each spec's stored model, then a damper's own
 * test-lane calibration when it has one. Loads everything up front; the returned function is
 * synchronous.
 */
export async function createWorkshopLifeResolver(prior: LifePrior = DEFAULT_PRIOR): Promise<LifeResolver> {
  const [models, measured] = await Promise.all([storedLifeModels(prior), workshopRepository.latestMeasurements()]);
  const meas = new Map(measured.map((m) => [m.damper_id, m]));
  const cache = new Map<string, LifeBasis>();
  return ({ damperId, specId, ratedDamperLifeKm }): LifeBasis => {
    const m = models.get(specId) ?? priorModel(prior);
    const key = `${specId}/${ratedDamperLifeKm}`;
    let base = cache.get(key);
    if (!base) {
      base = Object.freeze(lifeBasis(m, ratedDamperLifeKm));
      cache.set(key, base);
    }
    const t = meas.get(damperId);
    if (t) {
      const u = lifeUsedFromDamping(t.measured_damping_ns_per_m, t.nominal_damping_ns_per_m);
      const modelUsed = t.wear_km_at_test / base.medianWearKm;
      const f = Math.min(3, Math.max(1 / 3, modelUsed / u));
      // where the factor is bounded, an offset puts life used at the test where the lane says
      const offsetWearKm = u * f * base.medianWearKm - t.wear_km_at_test;
      return {
        b: base.b,
        medianWearKm: base.medianWearKm * f,
        p10WearKm: base.p10WearKm * f,
        p90WearKm: base.p90WearKm * f,
        offsetWearKm,
        source: 'test-lane',
        note: `calibrated by the test lane (inspection ${t.inspection_id}: ${Math.round(t.measured_damping_ns_per_m)} N·s/m measured ⇒ ${Math.round(u * 100)} % of life used where the model said ${Math.round(modelUsed * 100)} %): life ×${f.toFixed(2)}, bounded to ⅓–3×${Math.abs(offsetWearKm) > 1 ? `, the rest as ${formatKm(offsetWearKm)} of wear` : ''}; ${base.note}`,
      };
    }
    return base;
  };
}

/** The resolver under the prior alone (no database): for tools and tests. */
export function priorLifeResolver(prior: LifePrior = DEFAULT_PRIOR): LifeResolver {
  const m = priorModel(prior);
  return ({ ratedDamperLifeKm }) => lifeBasis(m, ratedDamperLifeKm);
}

const ISO_CLASSES = [
  { cls: 'A', severity: 0.5 },
  { cls: 'B', severity: 1 },
  { cls: 'C', severity: 2 },
  { cls: 'D', severity: 4 },
];

export interface SpecLife {
  specId: number;
  specName: string;
  model: ReturnType<typeof modelToJson> & { note: string };
  prior: ReturnType<typeof modelToJson>;
  ratedKm: { axleIndex: number; ratedKm: number }[];
  /** Median and P10–P90 life [km] per ISO class at 80 km/h, for the first axle's rated km, under the model and the prior. */
  lifeTable: { cls: string; severity: number; medianKm: number; p10Km: number; p90Km: number; priorMedianKm: number }[];
  /** What the removals alone say (Weibull in km, censored), and the points of its probability plot. */
  fleetKm: { fit: WeibullFit | null; reason: string | null; points: { life: number; unreliability: number }[] };
  /** Mean life [km] of the spec's dampers on their own road mix under the model, against the fleet's. */
  comparison: { modelMeanKm: number | null; fleetMeanKm: number | null; ratio: number | null; disagrees: boolean; warning: string | null };
  dampers: { total: number; failures: number; suspensions: number; withRecords: number };
  assumptions: string[];
}

/** Mean life [km] of a damper on its own road mix under a model: mean wear-km life / wear km per km. */
export function meanLifeOnMix(m: LifeModel, d: Pick<DamperLife, 'rows' | 'ratedKm'>): number | null {
  const km = d.rows.reduce((s, r) => s + r.km, 0);
  if (!(km > 0)) return null;
  return meanLifeKmAt(m, d.ratedKm, 1) / (wearKm(d.rows, m.b) / km);
}

export async function specLife(specId: number, specName: string, settings: LifeSettings): Promise<SpecLife> {
  const [lives, models, axles] = await Promise.all([
    damperLives(specId),
    storedLifeModels(settings.prior),
    lifeRepository.ratedLives(specId),
  ]);
  const m = models.get(specId)!;
  const p = priorModel(settings.prior);
  const rated = axles[0]?.rated_damper_life_km ?? 0;
  const used = lives.filter((d) => d.lifeKm > 0);
  const obs: LifeObservation[] = used.map((d) => ({ life: d.lifeKm, failed: d.failed }));
  let fit: WeibullFit | null = null;
  let reason: string | null = null;
  try {
    fit = fitWeibull(obs);
  } catch (e) {
    reason = (e as Error).message.replace(/^weibull: /, '');
  }
  const means = used.map((d) => meanLifeOnMix(m, d)).filter((x): x is number => x !== null);
  const modelMeanKm = means.length ? means.reduce((s, x) => s + x, 0) / means.length : null;
  const fleetMeanKm = fit?.mean ?? null;
  const ratio = modelMeanKm && fleetMeanKm ? modelMeanKm / fleetMeanKm : null;
  const disagrees = ratio !== null && (ratio > DISAGREEMENT_FACTOR || ratio < 1 / DISAGREEMENT_FACTOR);
  return {
    specId,
    specName,
    model: { ...modelToJson(m), note: modelNote(m) },
    prior: modelToJson(p),
    ratedKm: axles.map((a) => ({ axleIndex: a.axle_index, ratedKm: a.rated_damper_life_km })),
    lifeTable: ISO_CLASSES.map(({ cls, severity }) => ({
      cls,
      severity,
      medianKm: lifeKmAt(m, rated, severity, 0.5),
      p10Km: lifeKmAt(m, rated, severity, 0.1),
      p90Km: lifeKmAt(m, rated, severity, 0.9),
      priorMedianKm: lifeKmAt(p, rated, severity, 0.5),
    })),
    fleetKm: { fit, reason, points: weibullPlotPoints(obs) },
    comparison: {
      modelMeanKm,
      fleetMeanKm,
      ratio,
      disagrees,
      warning: disagrees
        ? `The model's mean life on these dampers' own roads (${formatKm(modelMeanKm!)}) and the fleet's removal history (${formatKm(fleetMeanKm!)}) differ by more than ${DISAGREEMENT_FACTOR}×: treat the predicted dates with caution and check the removal reasons and odometers on record.`
        : null,
    },
    dampers: { total: lives.length, failures: used.filter((d) => d.failed).length, suspensions: used.filter((d) => !d.failed).length, withRecords: lives.filter((d) => d.recordedKm > 0).length },
    assumptions: [
      'Severity 1 is ISO 8608 class B (mean) at 80 km/h, unladen: the road the rated km is stated on. Severity follows the rod sliding distance per km (twice per ISO class step) with a heat factor above 16× the reference damper power.',
      `Prior: median life = rated km at severity 1; ${settings.prior.classStepFactor}× shorter per class step (makers' severe-service schedules commonly halve intervals); Weibull shape ${settings.prior.shape}; it weighs as much as ${settings.prior.removals} removals.`,
      `Removals for wear (recorded as: ${WEAR_REASONS.join('; ')}) count as failures; removals recorded as ${CENSORED_REASONS.join('; ')}, and dampers still fitted, count as still running (censored).`,
      "A damper's road mix is its own duty record where it has one; the distance before the records takes its vehicle's recorded mix at the same position, or severity 1 when the vehicle has no trips on record.",
      `Calendar limit: ${settings.calendarYears} years from fitting whatever the distance (common practice: 5–7 years).`,
      'A prediction is a planning aid, not a verdict on a damper: a qualified inspection, the maker\'s requirements and local regulations decide whether a damper stays in service.',
    ],
  };
}

/**
 * Replays the removals for wear in date order: for each, the model fitted only to what was
 * known the day before (dampers fitted by then; those removed since, or still fitted, as running
 * at the share of their life driven by then, their road mix taken as even over their life)
 * predicts its life on its own road mix, against what happened. Pure.
 */
export function replayRemovals(lives: DamperLife[], asOf: string, prior: LifePrior = DEFAULT_PRIOR): { points: BacktestPoint[]; priorPoints: BacktestPoint[] } {
  const days = (a: string, b: string) => (Date.parse(`${b}T00:00:00Z`) - Date.parse(`${a}T00:00:00Z`)) / 86_400_000;
  const failures = lives.filter((d) => d.failed && d.removedAt && d.lifeKm > 0).sort((a, b) => (a.removedAt! < b.removedAt! ? -1 : 1));
  const points: BacktestPoint[] = [];
  const priorPoints: BacktestPoint[] = [];
  const p = priorModel(prior);
  for (const f of failures) {
    const cut = f.removedAt!;
    const units: LifeUnit[] = [];
    let trainedOn = 0;
    for (const d of lives) {
      if (d.id === f.id || d.installedAt >= cut || !(d.lifeKm > 0)) continue;
      const known = d.removedAt !== null && d.removedAt < cut;
      if (known) {
        units.push(toUnit(d));
        if (d.failed) trainedOn++;
        continue;
      }
      // the share of its life (to its removal, or to today) it had driven by the cut
      const span = days(d.installedAt, d.removedAt ?? asOf);
      const share = span > 0 ? Math.min(1, days(d.installedAt, cut) / span) : 0;
      if (!(share > 0)) continue;
      units.push({ rows: d.rows.map((r) => ({ km: r.km * share, severity: r.severity })), failed: false, ratedKm: d.ratedKm });
    }
    const m = fitLifeModel(units, prior);
    const point = (model: LifeModel): BacktestPoint => {
      const km = f.rows.reduce((s, r) => s + r.km, 0);
      const perKm = wearKm(f.rows, model.b) / km;
      const med = lifeWearKm(model, f.ratedKm, 0.5) / perKm;
      const lo = lifeWearKm(model, f.ratedKm, 0.1) / perKm;
      const hi = lifeWearKm(model, f.ratedKm, 0.9) / perKm;
      return {
        damperId: f.id,
        vehicleId: f.vehicleId,
        removedAt: cut,
        actualKm: f.lifeKm,
        predictedMedianKm: med,
        p10Km: lo,
        p90Km: hi,
        inside: f.lifeKm >= lo && f.lifeKm <= hi,
        errorPct: (Math.abs(med - f.lifeKm) / f.lifeKm) * 100,
        trainedOn,
      };
    };
    points.push(point(m));
    priorPoints.push(point(p));
  }
  return { points, priorPoints };
}

const median = (xs: number[]) => {
  if (!xs.length) return null;
  const s = xs.slice().sort((a, b) => a - b);
  const k = Math.floor(s.length / 2);
  return s.length % 2 ? s[k] : (s[k - 1] + s[k]) / 2;
};

export const summarizeBacktest = (pts: BacktestPoint[]) => ({
  mdape: median(pts.map((x) => x.errorPct)),
  insideShare: pts.length ? pts.filter((x) => x.inside).length / pts.length : null,
});

export async function backtest(specId: number, settings: LifeSettings, asOf: string): Promise<Backtest> {
  const lives = await damperLives(specId);
  const { points, priorPoints } = replayRemovals(lives, asOf, settings.prior);
  return {
    specId,
    points,
    ...summarizeBacktest(points),
    prior: summarizeBacktest(priorPoints),
    method:
      'For each removal for wear, in date order, the life model is fitted only to what was known the day before it (dampers removed earlier as they were; dampers still running then as running, at the share of their life driven by then). Its median and P10–P90 life on the damper\'s own road mix are compared with the distance it actually ran. MdAPE = median absolute percentage error of the median.',
  };
}
