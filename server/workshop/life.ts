/**
 * The fleet's own damper life, learned from replacements and test-lane results.
 *
 * - Per suspension spec, a Weibull fit (server/reliability/weibull.ts) to every damper ever
 *   fitted: removed units are failures unless removed for a reason that says nothing about wear
 *   ({@link CENSORED_REASONS}: those and still-installed units are right-censored). Lives in km
 *   (odometer at removal, or now, minus odometer at fitting) and in dissipated energy.
 * - Energy life (stated rule): the damper's duty records may not cover its whole life (trips
 *   before the fleet joined Reboundry); when they cover part of it, the energy is scaled up by
 *   life km / covered km. Dampers with no duty records are left out of the energy fit.
 * - Blending rule (credibility weighting): once a spec has at least `FLEET_LIFE_MIN_REMOVALS`
 *   failures, the life km used for each axle is (1 − z)·rated km + z·fleet mean km with
 *   z = n / (n + k), n = failures, k = `FLEET_LIFE_CREDIBILITY_K`; the nightly job's life energy
 *   is the rated life energy at that km (the rated-life method of the physics engine).
 * - A test-lane result on a damper (measured damping) sets that damper's own life: the energy
 *   that puts its consumed life, at the moment of the test, where the measured damping says
 *   (inverse of the wear model's linear fade), bounded to ⅓–3× the spec life.
 */
import { ratedLife, DAMPING_AT_END_OF_LIFE, type LifeResolver, type LifeEnergy } from '../wear/wear';
import { fitWeibull, weibullPlotPoints, weibullSurvival, type LifeObservation, type WeibullFit } from '../reliability/weibull';
import { workshopRepository } from './repository';
import type { WorkshopConfig } from './config';

/** Removal reasons that are not wear: such units count as suspensions (right-censored). */
export const CENSORED_REASONS = ['accident damage', 'fitted with other work', 'vehicle retired'];

export const REMOVAL_REASONS = ['worn: low adhesion', 'leaking', 'mount or bush damage', 'noise or knocking', 'fitted as a pair', ...CENSORED_REASONS] as const;

export interface FitView {
  fit: WeibullFit | null;
  /** Why there is no fit (too few failures …). */
  reason: string | null;
  unit: string;
  points: { life: number; unreliability: number }[];
  /** Survival curve R(t) of the fit. */
  curve: { life: number; survival: number }[];
  excluded: number;
}

export interface SpecLife {
  specId: number;
  specName: string;
  km: FitView;
  energy: FitView;
  blend: {
    used: boolean;
    weight: number;
    failures: number;
    minRemovals: number;
    k: number;
    fleetMeanKm: number | null;
    axles: { axleIndex: number; ratedKm: number; usedKm: number }[];
    rule: string;
  };
}

const fitView = (data: LifeObservation[], unit: string, excluded: number): FitView => {
  const points = weibullPlotPoints(data);
  try {
    const fit = fitWeibull(data);
    const top = Math.max(...data.map((d) => d.life), fit.scale * 2);
    const curve = Array.from({ length: 41 }, (_, i) => {
      const life = (top * i) / 40;
      return { life, survival: weibullSurvival(life, fit.shape, fit.scale) };
    });
    return { fit, reason: null, unit, points, curve, excluded };
  } catch (e) {
    return { fit: null, reason: (e as Error).message.replace(/^weibull: /, ''), unit, points, curve: [], excluded };
  }
};

export async function specLife(specId: number, specName: string, cfg: WorkshopConfig): Promise<SpecLife> {
  const rows = await workshopRepository.lifeRecords(specId);
  const km: LifeObservation[] = [];
  const energy: LifeObservation[] = [];
  let exKm = 0;
  let exE = 0;
  const rated = new Map<number, number>();
  for (const r of rows) {
    rated.set(r.axle_index, r.rated_damper_life_km);
    const failed = r.removed_at !== null && !CENSORED_REASONS.includes(r.removal_reason ?? '');
    const lifeKm = (r.removed_odometer_km ?? r.odometer_km) - r.installed_odometer_km;
    if (!(lifeKm > 0)) {
      exKm++;
      exE++;
      continue;
    }
    km.push({ life: lifeKm, failed });
    const dutyKm = Number(r.duty_km ?? 0);
    if (r.energy_j > 0 && dutyKm > 0) energy.push({ life: r.energy_j * Math.max(1, lifeKm / dutyKm), failed });
    else exE++;
  }
  const kmView = fitView(km, 'km', exKm);
  const eView = fitView(energy, 'J', exE);
  const n = kmView.fit?.failures ?? km.filter((d) => d.failed).length;
  const used = kmView.fit !== null && n >= cfg.fleetLifeMinRemovals;
  const z = used ? n / (n + cfg.fleetLifeCredibilityK) : 0;
  const fleetMean = kmView.fit?.mean ?? null;
  const axles = [...rated.entries()]
    .sort((a, b) => a[0] - b[0])
    .map(([axleIndex, ratedKm]) => ({ axleIndex, ratedKm, usedKm: used && fleetMean ? (1 - z) * ratedKm + z * fleetMean : ratedKm }));
  return {
    specId,
    specName,
    km: kmView,
    energy: eView,
    blend: {
      used,
      weight: z,
      failures: n,
      minRemovals: cfg.fleetLifeMinRemovals,
      k: cfg.fleetLifeCredibilityK,
      fleetMeanKm: fleetMean,
      axles,
      rule: `From ${cfg.fleetLifeMinRemovals} removals on, life km = (1 − z) × rated + z × fleet mean life, z = n / (n + ${cfg.fleetLifeCredibilityK}) with n removals for wear.`,
    },
  };
}

/** The life in km used per spec and axle (rated, or blended with the fleet's own). */
export async function usedLifeKm(cfg: WorkshopConfig): Promise<Map<number, SpecLife>> {
  const out = new Map<number, SpecLife>();
  for (const s of await workshopRepository.specs()) out.set(s.id, await specLife(s.id, s.name, cfg));
  return out;
}

/** Consumed life implied by a measured damping (inverse of the wear model's linear fade). */
export function lifeUsedFromDamping(measuredNsPerM: number, nominalNsPerM: number): number {
  const u = (1 - measuredNsPerM / nominalNsPerM) / (1 - DAMPING_AT_END_OF_LIFE);
  return Math.min(1, Math.max(0.01, u));
}

/**
 * The life resolver for the nightly job (issue 5's hook): fleet-blended life per spec and
 * axle, then a damper's own test-lane calibration when it has one. Loads everything up front;
 * the returned function is synchronous.
 */
export async function createWorkshopLifeResolver(cfg: WorkshopConfig): Promise<LifeResolver> {
  const [lives, damperSpecs, measured] = await Promise.all([usedLifeKm(cfg), workshopRepository.damperSpecs(), workshopRepository.latestMeasurements()]);
  const specOf = new Map(damperSpecs.map((d) => [d.id, d]));
  const meas = new Map(measured.map((m) => [m.damper_id, m]));
  const fleetLives = new Map<string, LifeEnergy>();
  return ({ damperId, corner, ratedDamperLifeKm }): LifeEnergy => {
    const ds = specOf.get(damperId);
    const life = ds ? lives.get(ds.spec_id) : undefined;
    const axle = life?.blend.axles.find((a) => a.axleIndex === ds!.axle_index);
    let base = ratedLife({ damperId, corner, ratedDamperLifeKm });
    if (life?.blend.used && axle) {
      // one per spec axle and corner: the same for every damper sharing them
      const key = `${ds!.spec_id}/${axle.axleIndex}/${ratedDamperLifeKm}/${base.energyJ}`;
      let fleet = fleetLives.get(key);
      if (!fleet) {
        fleet = Object.freeze({
          energyJ: ratedLife({ damperId, corner, ratedDamperLifeKm: axle.usedKm }).energyJ,
          source: 'fleet',
          note: `fleet-blended life: ${Math.round(axle.usedKm).toLocaleString('en-GB')} km (rated ${Math.round(ratedDamperLifeKm).toLocaleString('en-GB')} km, weight ${(life.blend.weight * 100).toFixed(0)} % on ${life.blend.failures} removals), as energy on ISO 8608 class B at 80 km/h`,
        });
        fleetLives.set(key, fleet);
      }
      base = fleet;
    }
    const m = meas.get(damperId);
    if (m) {
      const u = lifeUsedFromDamping(m.measured_damping_ns_per_m, m.nominal_damping_ns_per_m);
      const e = Math.min(3 * base.energyJ, Math.max(base.energyJ / 3, m.energy_j_at_test / u));
      return {
        energyJ: e,
        source: 'test-lane',
        note: `calibrated by the test lane (inspection ${m.inspection_id}: ${Math.round(m.measured_damping_ns_per_m)} N·s/m measured ⇒ ${(u * 100).toFixed(0)} % of life used at ${(m.energy_j_at_test / 1e6).toFixed(1)} MJ), bounded to ⅓–3× the ${base.source} life`,
      };
    }
    return base;
  };
}
