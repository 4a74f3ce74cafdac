/**
 * Roughness as of the trip's day: the duty of a trip is computed on the roads as they were on
 * the day it was driven, not as they are when the nightly job runs, so a survey recorded later
 * does not rewrite wear already charged (docs/methods.md, "Roughness as of the trip's day").
 *
 * - On a day, a segment's value is the current-value rule (server/roads/current-roughness.ts,
 *   {@link currentValue}) applied to its observations dated on or before that day: the newest
 *   survey or hand-set value, with the drivers' reports newer than it blended in.
 * - A segment with no observation by then takes its earliest one (the rule applied to the
 *   observations of its first observed day) — an assumption: the first thing known of a road
 *   is taken to have held before it too.
 * - A segment with no observations at all keeps the value stored on the segment.
 * - A measured profile is used on the days its survey is the value in force.
 *
 * Pure (no I/O). The repository builds, per route, the versions of its segments from the first
 * day the run needs on; {@link segmentsOnDay} picks the version for a trip's day.
 */
import { currentValue, type CurrentValue, type ObservationValue } from '../roads/current-roughness';
import { classifyGd } from '../physics/iso8608';
import { iriFromGd } from '../physics/iri';
import type { RouteInput, SegmentInput } from './duty';

/** The roughness in force on a day, and whether it rests on the earliest-observation assumption. */
export interface ValueOnDay extends CurrentValue {
  /** True when no observation was dated on or before the day and the earliest one was taken. */
  assumedFromLater: boolean;
}

/**
 * The roughness of a segment in force on `day` (YYYY-MM-DD), from its observation history;
 * null when it has none. See the module doc for the rule.
 */
export function roughnessOnDay<T extends ObservationValue>(observations: readonly T[], day: string): ValueOnDay | null {
  if (!observations.length) return null;
  const known = observations.filter((o) => o.observedOn <= day);
  if (known.length) return { ...currentValue(known, classifyGd, iriFromGd)!, assumedFromLater: false };
  let first = observations[0].observedOn;
  for (const o of observations) if (o.observedOn < first) first = o.observedOn;
  return { ...currentValue(observations.filter((o) => o.observedOn === first), classifyGd, iriFromGd)!, assumedFromLater: true };
}

/** A segment as the job sees it, with the survey behind its value (its profile is attached later). */
export type DatedSegment = SegmentInput & { surveyId?: number | null };

/** The segments of a route as they stood from `from` (YYYY-MM-DD) on. */
export interface RouteVersion {
  from: string;
  segments: DatedSegment[];
}

/** A route with the later versions of its segments: `segments` holds before the first of `later`. */
export type DatedRoute = RouteInput & { later?: RouteVersion[] };

/**
 * The segments of a route in force on `day`: the last version starting on or before it, else
 * the route's own `segments`. Versions are in ascending `from` order.
 */
export function segmentsOnDay(route: DatedRoute, day: string): SegmentInput[] {
  const later = route.later;
  if (!later?.length || day < later[0].from) return route.segments;
  let lo = 0;
  let hi = later.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (later[mid].from <= day) lo = mid;
    else hi = mid - 1;
  }
  return later[lo].segments;
}

/** Every segment object of a route, over all its versions (each once). */
export function allSegments(route: DatedRoute): DatedSegment[] {
  const seen = new Set<DatedSegment>(route.segments);
  for (const v of route.later ?? []) for (const s of v.segments) seen.add(s);
  return [...seen];
}

/** A segment's fixed part and the value stored on it (used when it has no observations). */
export interface SegmentBase {
  id: number;
  startM: number;
  endM: number;
  speedKmh: number | null;
  gdN0: number | null;
  surveyId: number | null;
}

/**
 * The versions of a route's segments from `fromDay` on: the segments in force on `fromDay`,
 * then a version on each later day an observation of one of them is dated (up to `toDay`), when
 * it changes anything. Segments whose value does not change keep the same object.
 * @param segments the route's segments in order, with their stored value
 * @param history each segment's observations (by segment id)
 */
export function routeVersions(segments: readonly SegmentBase[], history: ReadonlyMap<number, readonly ObservationValue[]>, fromDay: string, toDay: string): { segments: DatedSegment[]; later: RouteVersion[] } {
  const days = new Set<string>();
  for (const s of segments) for (const o of history.get(s.id) ?? []) if (o.observedOn > fromDay && o.observedOn <= toDay) days.add(o.observedOn);
  const valueOn = (s: SegmentBase, day: string, prev: DatedSegment | null): DatedSegment => {
    const obs = history.get(s.id);
    let gdN0 = s.gdN0;
    let surveyId = s.surveyId;
    if (obs?.length) {
      const v = roughnessOnDay(obs, day)!;
      gdN0 = v.gdN0;
      surveyId = v.source === 'survey' ? v.surveyId : null;
    }
    if (prev && prev.gdN0 === gdN0 && (prev.surveyId ?? null) === surveyId) return prev;
    return { id: s.id, startM: s.startM, endM: s.endM, speedKmh: s.speedKmh, gdN0, profile: null, surveyId };
  };
  const first = segments.map((s) => valueOn(s, fromDay, null));
  const later: RouteVersion[] = [];
  let prev = first;
  for (const day of [...days].sort()) {
    const next = segments.map((s, i) => valueOn(s, day, prev[i]));
    if (next.some((s, i) => s !== prev[i])) later.push({ from: day, segments: next });
    prev = next;
  }
  return { segments: first, later };
}

/** Attaches each segment's measured profile (by the survey behind its value), over all versions. */
export function attachProfiles(routes: Iterable<DatedRoute>, profiles: ReadonlyMap<number, { dxM: number; startM: number; elevationsM: Float64Array }>) {
  for (const route of routes) {
    for (const seg of allSegments(route)) {
      const p = seg.surveyId ? profiles.get(seg.surveyId) : undefined;
      seg.profile = p && seg.surveyId ? { surveyId: seg.surveyId, ...p } : null;
    }
  }
}
