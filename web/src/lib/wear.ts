import type { StatusTone } from '@/components/ui/status-badge';

/**
 * How a damper's estimated life used reads on screen, from the inspection threshold the server
 * schedules by (`INSPECTION_THRESHOLD`, 0.8 unless configured): watch from three quarters of
 * it, inspect from it, past end of life from 100 % of the life expected on the damper's roads.
 * The wear page and the damper cards use the same bands.
 */
export const DEFAULT_INSPECTION_THRESHOLD = 0.8;

export function wearBands(threshold: number = DEFAULT_INSPECTION_THRESHOLD) {
  // rounded so that 0.8 × ¾ is 0.6, not 0.6000000000000001
  return { watchFrom: Math.round(threshold * 0.75 * 1e9) / 1e9, dueFrom: threshold, overdueFrom: 1.0 } as const;
}

export function wearTone(lifeUsedFraction: number | null | undefined, threshold: number = DEFAULT_INSPECTION_THRESHOLD): StatusTone {
  if (lifeUsedFraction === null || lifeUsedFraction === undefined || !Number.isFinite(lifeUsedFraction)) return 'neutral';
  const b = wearBands(threshold);
  if (lifeUsedFraction >= b.overdueFrom) return 'overdue';
  if (lifeUsedFraction >= b.dueFrom) return 'due';
  if (lifeUsedFraction >= b.watchFrom) return 'watch';
  return 'ok';
}

export const wearWords: Record<StatusTone, string> = {
  ok: 'Good',
  watch: 'Watch',
  due: 'Inspect now',
  overdue: 'Past end of life',
  neutral: 'No estimate',
};

const pct = (x: number) => `${Math.round(x * 100)} %`;

/** The rule behind the word, for the "because" line. */
export function wearRule(threshold: number = DEFAULT_INSPECTION_THRESHOLD): string {
  const b = wearBands(threshold);
  return `Watch from ${pct(b.watchFrom)}, inspect from ${pct(b.dueFrom)} of expected life used.`;
}
