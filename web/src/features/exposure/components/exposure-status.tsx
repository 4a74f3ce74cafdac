import { StatusBadge } from '@/components/ui/status-badge';

export function ExposureStatusBadge({ a8, action, limit }: { a8: number; action: number; limit: number }) {
  if (a8 > limit) return <StatusBadge tone="overdue">Above limit value</StatusBadge>;
  if (a8 > action) return <StatusBadge tone="due">Above action value</StatusBadge>;
  return <StatusBadge tone="ok">Within action value</StatusBadge>;
}
