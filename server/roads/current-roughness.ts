/**
 * The rule that picks a segment's current roughness from its history of observations.
 *
 * Rule: the newest observation is current; on the same date a measured profile survey beats a
 * value set by hand (stated class or IRI), which beats an estimate from drivers' reports; on a
 * full tie the later-recorded one wins. So a new survey always takes over, and a manager can
 * still record that a road was resurfaced after its last survey.
 */
import type { RoughnessSource } from '../db/models';

export const CURRENT_RULE_TEXT =
  'The newest observation is current; on the same date a measured profile survey beats a value set by hand, which beats an estimate from drivers’ reports.';

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
