import { StatusBadge } from '@/components/ui/status-badge';

const SEVERITY_WORD: Record<number, string> = { 1: 'Uneven', 2: 'Harsh', 3: 'Severe' };
export const severityWord = (n: number) => SEVERITY_WORD[n] ?? String(n);

/** Status of a report, with a word and a shape (never colour alone). */
export function ReportStatusBadge({ status }: { status: 'new' | 'accepted' | 'dismissed' }) {
  if (status === 'accepted') return <StatusBadge tone="ok">Accepted</StatusBadge>;
  if (status === 'dismissed') return <StatusBadge tone="neutral">Dismissed</StatusBadge>;
  return <StatusBadge tone="watch">Waiting for review</StatusBadge>;
}

export function SeverityBadge({ level }: { level: number }) {
  return <StatusBadge tone={level >= 3 ? 'overdue' : level === 2 ? 'due' : 'watch'}>{severityWord(level)}</StatusBadge>;
}
