/**
 * The rule that picks a segment's current roughness from its history of observations.
 *
 * Rule: the newest observation is current; on the same date a measured profile survey beats a
 * value set by hand (stated class or IRI), which beats an estimate from drivers' reports; on a
 * full tie the later-recorded one wins. So a new survey always takes over, and a manager can
 * still record that a road was resurfaced after its last survey.
 *
 * Drivers' reports count with a lower weight than a survey — see {@link currentValue},
 * which the repository applies.
 */
import type { RoughnessSource } from '../db/models';

export const CURRENT_RULE_TEXT =
  'The newest observation is current; on the same date a measured profile survey beats a value set by hand, which beats an estimate from drivers’ reports. ' +
  'Accepted drivers’ reports newer than the last survey or hand-set value pull it towards their estimate with half the weight of a survey; a newer survey or hand-set value replaces them.';

const RANK: Record<RoughnessSource, number> = { survey: 3, stated: 2, driver_report: 1 };

export interface ObservationLike {
  id: number;
  source: RoughnessSource;
  observedOn: string;
}

/** Orders observations so that the current one comes first. */
export function compareForCurrent(a: ObservationLike, b: ObservationLike): number {
  if (a.observedOn !== b.observedOn) return a.observedOn < b.observedOn ? 1 : -1;
  if (RANK[a.source] !== RANK[b.source]) return RANK[b.source] - RANK[a.source];
  return b.id - a.id;
}

/** The current observation of a segment (null when it has none). */
export function pickCurrent<T extends ObservationLike>(observations: readonly T[]): T | null {
  let best: T | null = null;
  for (const o of observations) if (!best || compareForCurrent(o, best) < 0) best = o;
  return best;
}

/**
 * Weight of each source when a segment's current value is blended. A profile survey
 * and a value set by hand count fully; an accepted driver's report is an estimate from how the
 * ride felt, so it counts half as much as a survey.
 */
export const SOURCE_WEIGHT: Record<RoughnessSource, number> = { survey: 1, stated: 1, driver_report: 0.5 };

export interface ObservationValue extends ObservationLike {
  gdN0: number | null;
  iri: number | null;
  isoClass: string | null;
  surveyId?: number | null;
}

export interface CurrentValue {
  gdN0: number | null;
  iri: number | null;
  isoClass: string | null;
  source: RoughnessSource;
  observedOn: string;
  surveyId: number | null;
  /** The observation the value rests on (the base survey/stated one when reports are blended in). */
  baseId: number;
  /** Driver reports blended into the value. */
  blendedReports: number;
}

/**
 * The current roughness of a segment with drivers' reports weighted below surveys.
 *
 * Base: the current observation among surveys and hand-set values ({@link pickCurrent}). Reports
 * observed after the base (on the same date the base wins, as in {@link pickCurrent}) are blended
 * in: `ln Gd = (w_base·ln Gd_base + Σ w_r·ln Gd_r) / (w_base + Σ w_r)` with {@link SOURCE_WEIGHT};
 * the class follows from the blended Gd(n0) (`classify`) and the IRI from it (`iriFromGd`). With no
 * newer reports this is exactly {@link pickCurrent}; with reports only, their geometric mean.
 * @param classify Gd(n0) [m³] → ISO 8608 class
 * @param iriFromGd Gd(n0) [m³] → IRI [m/km]
 */
export function currentValue<T extends ObservationValue>(
  observations: readonly T[],
  classify: (gdN0: number) => string,
  iriFromGd: (gdN0: number) => number,
): CurrentValue | null {
  const base = pickCurrent(observations.filter((o) => o.source !== 'driver_report'));
  const reports = observations.filter((o) => o.source === 'driver_report' && o.gdN0 !== null && o.gdN0 > 0 && (!base || o.observedOn > base.observedOn));
  if (base && (!reports.length || base.gdN0 === null || !(base.gdN0 > 0))) {
    return { gdN0: base.gdN0, iri: base.iri, isoClass: base.isoClass, source: base.source, observedOn: base.observedOn, surveyId: base.source === 'survey' ? (base.surveyId ?? null) : null, baseId: base.id, blendedReports: 0 };
  }
  if (!reports.length) {
    const only = pickCurrent(observations);
    return only ? { gdN0: only.gdN0, iri: only.iri, isoClass: only.isoClass, source: only.source, observedOn: only.observedOn, surveyId: null, baseId: only.id, blendedReports: 0 } : null;
  }
  let num = 0;
  let den = 0;
  if (base) {
    num += SOURCE_WEIGHT[base.source] * Math.log(base.gdN0!);
    den += SOURCE_WEIGHT[base.source];
  }
  for (const r of reports) {
    num += SOURCE_WEIGHT.driver_report * Math.log(r.gdN0!);
    den += SOURCE_WEIGHT.driver_report;
  }
  const gdN0 = Math.exp(num / den);
  const newest = reports.reduce((a, b) => (compareForCurrent(a, b) <= 0 ? a : b));
  return {
    gdN0,
    iri: Math.round(iriFromGd(gdN0) * 100) / 100,
    isoClass: classify(gdN0),
    source: 'driver_report',
    observedOn: newest.observedOn,
    surveyId: null,
    baseId: base?.id ?? newest.id,
    blendedReports: reports.length,
  };
}
