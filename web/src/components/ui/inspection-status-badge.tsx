import type { ReactNode } from 'react';
import { inspectionStatusTone, inspectionStatusWord } from '@/lib/inspection-status';
import { StatusBadge } from './status-badge';

/** An inspection's status in the app's one vocabulary, with anything that follows it (e.g. "· due 7 Dec 2026"). */
export function InspectionStatusBadge({ status, children, size }: { status: string; children?: ReactNode; size?: 'sm' | 'md' }) {
  return (
    <StatusBadge tone={inspectionStatusTone(status)} size={size}>
      {inspectionStatusWord(status)}
      {children}
    </StatusBadge>
  );
}
