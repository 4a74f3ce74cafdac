import { EmptyState } from '@/components/ui/empty-state';
import { ErrorState } from '@/components/ui/error-state';
import { Facts } from '@/components/ui/facts';
import { LoadingState } from '@/components/ui/loading-state';
import { SimpleTable } from '@/components/ui/simple-table';
import { formatNumber } from '@/lib/format';

const shortDay = (day: string) => new Date(`${day}T12:00:00Z`).toLocaleDateString('en-GB', { weekday: 'short', day: 'numeric', month: 'short', timeZone: 'UTC' });
import { useExposure } from '../api/get-exposure';
import { ExposureCaution } from './exposure-caution';
import { ExposureChart } from './exposure-chart';
import { ExposureStatusBadge } from './exposure-status';

/** One driver's last 30 days (their own, or any driver's for a manager). */
export function DriverExposure({ driverId }: { driverId?: number }) {
  const q = useExposure({ driverId });
  if (q.isPending) return <LoadingState label="Loading exposure…" />;
  if (q.error) return <ErrorState error={q.error} what="the exposure" onRetry={() => void q.refetch()} />;
  const d = q.data;
  return (
    <div className="flex flex-col gap-4">
      <ExposureCaution text={d.caution} method={d.method} />
      <Facts
        items={[
          { label: 'Days driven', value: String(d.summary.daysDriven), numeric: true },
          { label: 'Days above the action value', value: String(d.summary.daysAboveAction), numeric: true },
          { label: 'Days above the limit value', value: String(d.summary.daysAboveLimit), numeric: true },
          { label: 'Highest A(8)', value: d.summary.maxA8 !== null ? `${formatNumber(d.summary.maxA8, 2)} m/s²` : '—', numeric: true },
        ]}
      />
      {d.days.length ? (
        <>
          <ExposureChart data={d} />
          <SimpleTable
            label="Daily exposure"
            rows={[...d.days].reverse()}
            getRowKey={(r) => r.day}
            columns={[
              { key: 'day', header: 'Day', rowHeader: true, cell: (r) => <span className="whitespace-nowrap">{shortDay(r.day)}</span> },
              { key: 'a8', header: 'A(8)', unit: 'm/s²', numeric: true, cell: (r) => formatNumber(r.a8, 2) },
              { key: 'seat', header: 'Floor to seat', numeric: true, cell: (r) => r.seatFactor ?? '—' },
              { key: 'status', header: 'Against the values', className: 'whitespace-nowrap', cell: (r) => <ExposureStatusBadge a8={r.a8} action={d.actionValue} limit={d.limitValue} /> },
              { key: 'hours', header: 'Driving', unit: 'h', numeric: true, cell: (r) => formatNumber(r.hours, 1) },
              { key: 'trips', header: 'Trips', numeric: true, cell: (r) => String(r.trips) },
            ]}
          />
        </>
      ) : (
        <EmptyState title="No exposure figures yet">Figures appear the morning after driving, once the nightly calculation has run over the day’s trips.</EmptyState>
      )}
    </div>
  );
}
