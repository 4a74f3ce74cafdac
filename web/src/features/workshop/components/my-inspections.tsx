import { Link } from 'react-router';
import { EmptyState } from '@/components/ui/empty-state';
import { ErrorState } from '@/components/ui/error-state';
import { LoadingState } from '@/components/ui/loading-state';
import { InspectionStatusBadge } from '@/components/ui/inspection-status-badge';
import { formatDate } from '@/lib/format';
import { useInspections } from '../api/get-inspections';
import { CornerChips } from './corner-chips';


/** Inspections assigned to the signed-in mechanic or their depot, soonest first; big targets for a tablet. */
export function MyInspections({ inspectionPath }: { inspectionPath: (id: number) => string }) {
  const q = useInspections({ status: 'open', pageSize: 50 });
  if (q.isPending) return <LoadingState label="Loading your inspections…" />;
  if (q.error) return <ErrorState error={q.error} what="your inspections" onRetry={() => void q.refetch()} />;
  if (!q.data.items.length) return <EmptyState title="No inspections for you or your depot">When one is assigned to you or your depot, it appears here with its corners.</EmptyState>;
  return (
    <ul className="grid gap-3 md:grid-cols-2" aria-label="My inspections">
      {q.data.items.map((i) => (
        <li key={i.id}>
          <Link to={inspectionPath(i.id)} className="block rounded-md border border-line bg-surface p-4 hover:border-slate focus-visible:outline-2">
            <div className="flex flex-wrap items-baseline justify-between gap-2">
              <span className="text-lg font-semibold text-ink">
                {i.vehicle.fleetNumber} <span className="font-mono text-sm text-slate">{i.vehicle.plate}</span>
              </span>
              <InspectionStatusBadge status={i.status}> · due {formatDate(i.dueDate)}</InspectionStatusBadge>
            </div>
            <p className="mt-1 text-sm text-ink">{i.reason}</p>
            <p className="mb-2 text-sm text-slate">
              {i.assignee ? `Assigned to ${i.assignee.name}` : `For the ${i.depot.name} depot`}
              {i.resultsRecorded ? ' · results recorded' : ''}
            </p>
            <CornerChips corners={i.corners} />
          </Link>
        </li>
      ))}
    </ul>
  );
}
