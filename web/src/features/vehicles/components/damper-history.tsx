import { SimpleTable } from '@/components/ui/simple-table';
import { formatDate, formatNumber } from '@/lib/format';
import type { Damper } from '../api/get-vehicle';
import { positionName } from './damper-corners';

/** Dampers taken off this vehicle, latest first, how far they ran and why they came off. */
export function DamperHistory({ dampers }: { dampers: Damper[] }) {
  const removed = dampers.filter((d) => d.removedAt).sort((a, b) => (b.removedAt ?? '').localeCompare(a.removedAt ?? ''));
  if (removed.length === 0) return <p className="text-sm text-slate">No dampers have been replaced on this vehicle yet.</p>;
  return (
    <SimpleTable
      label="Replaced dampers"
      rows={removed}
      columns={[
        { key: 'pos', header: 'Corner', rowHeader: true, cell: (d) => <span title={positionName(d.position)}>{d.position}</span> },
        { key: 'removed', header: 'Removed', cell: (d) => <span className="tabular whitespace-nowrap">{formatDate(d.removedAt)}</span> },
        { key: 'km', header: 'Ran', unit: 'km', numeric: true, cell: (d) => formatNumber(d.distanceKm) },
        { key: 'reason', header: 'Reason', cell: (d) => d.removalReason ?? <span className="text-slate">Not recorded</span> },
      ]}
    />
  );
}
