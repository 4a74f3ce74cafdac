import { EmptyState } from '@/components/ui/empty-state';
import { DateCell } from '@/components/ui/date-cell';
import { SimpleTable } from '@/components/ui/simple-table';
import { InspectionStatusBadge as Badge } from '@/components/ui/inspection-status-badge';
import type { InspectionStatus, VehicleInspection } from '../api/get-vehicle';

export function InspectionStatusBadge({ status }: { status: InspectionStatus }) {
  return <Badge status={status} />;
}

/** The vehicle's inspections, soonest first, with why each was booked. */
export function VehicleInspections({ inspections }: { inspections: VehicleInspection[] }) {
  if (inspections.length === 0) {
    return (
      <EmptyState title="No inspections yet">
        When the nightly wear run finds a damper nearing its inspection point, or the km or months rule comes first, an
        inspection is booked and listed here with the reason.
      </EmptyState>
    );
  }
  return (
    <SimpleTable
      label="Inspections"
      rows={inspections}
      columns={[
        {
          key: 'due',
          header: 'Due',
          cell: (i) => <DateCell value={i.dueDate} />,
        },
        { key: 'status', header: 'Status', cell: (i) => <InspectionStatusBadge status={i.status} /> },
        { key: 'reason', header: 'Because', cell: (i) => i.reason ?? <span className="text-slate">No reason recorded</span> },
        {
          key: 'completed',
          header: 'Completed',
          cell: (i) =>
            i.completedAt ? (
              <DateCell value={i.completedAt} />
            ) : (
              <span className="text-slate">Not yet</span>
            ),
        },
      ]}
    />
  );
}
