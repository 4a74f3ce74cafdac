import type { StatusTone } from '@/components/ui/status-badge';

/**
 * The one set of words and tones for an inspection's status, used on every page that shows one
 * (due list, due map, vehicle page, planning, the mechanic's list and the inspection itself).
 */
export type InspectionStatusKey = 'scheduled' | 'due' | 'overdue' | 'done' | 'cancelled';

export const inspectionStatusWords: Record<InspectionStatusKey, string> = {
  scheduled: 'Scheduled',
  due: 'Due',
  overdue: 'Overdue',
  done: 'Done',
  cancelled: 'Cancelled',
};

export const inspectionStatusTones: Record<InspectionStatusKey, StatusTone> = {
  scheduled: 'watch',
  due: 'due',
  overdue: 'overdue',
  done: 'ok',
  cancelled: 'neutral',
};

export const inspectionStatusWord = (s: string) => inspectionStatusWords[s as InspectionStatusKey] ?? s;
export const inspectionStatusTone = (s: string): StatusTone => inspectionStatusTones[s as InspectionStatusKey] ?? 'neutral';
