import type { StatusTone } from '@/components/ui/status-badge';

/**
 * How a damper's estimated life used reads on screen. Until inspection scheduling has its own
 * configurable threshold, these fixed bands give the word and shape beside the percentage.
 */
export const WEAR_BANDS = { watchFrom: 0.7, dueFrom: 0.9, overdueFrom: 1.0 } as const;

export function wearTone(lifeUsedFraction: number | null | undefined): StatusTone {
  if (lifeUsedFraction === null || lifeUsedFraction === undefined || !Number.isFinite(lifeUsedFraction)) return 'neutral';
  if (lifeUsedFraction >= WEAR_BANDS.overdueFrom) return 'overdue';
  if (lifeUsedFraction >= WEAR_BANDS.dueFrom) return 'due';
  if (lifeUsedFraction >= WEAR_BANDS.watchFrom) return 'watch';
  return 'ok';
}

export const wearWords: Record<StatusTone, string> = {
  ok: 'Good',
  watch: 'Watch',
  due: 'Inspect now',
  overdue: 'Past rated life',
  neutral: 'No estimate',
};

/** The rule behind the word, for the "because" line. */
export const wearRule = `Watch from ${WEAR_BANDS.watchFrom * 100} %, inspect from ${WEAR_BANDS.dueFrom * 100} % of rated life used.`;
