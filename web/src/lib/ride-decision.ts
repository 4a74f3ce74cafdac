/**
 * One wording of what accepting a ride report did to the road, for every place that tells of it
 * (the notice on accepting, the decisions table, the driver's list): the segment's class before
 * and after the report was blended in, and the report's own estimate, which counts half a
 * survey and so usually moves the segment only part of the way towards it.
 */
export interface AcceptedClasses {
  classBefore: string | null;
  estimatedClass: string | null;
  /** The segment's class just after; null for reports accepted before it was kept. */
  classAfter: string | null;
}

export function acceptedClassText(r: AcceptedClasses): string {
  const before = r.classBefore ?? 'B (assumed)';
  const estimate = `report’s estimate class ${r.estimatedClass ?? '—'}`;
  if (r.classAfter === null) return `segment was class ${before}; ${estimate}`;
  return r.classAfter === r.classBefore ? `segment stays class ${r.classAfter} (${estimate})` : `segment class ${before} → ${r.classAfter} (${estimate})`;
}
