import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { DateCell } from '@/components/ui/date-cell';
import { EmptyState } from '@/components/ui/empty-state';
import { SimpleTable } from '@/components/ui/simple-table';
import { formatDateTime, formatHoursMinutes, formatNumber, formatQuantity, minutesBetween } from '@/lib/format';
import type { VehicleTrip } from '../api/get-vehicle';

/** The vehicle's latest trips: where, how far, how fast and how loaded — what its dampers went through. */
const COMPACT_FIRST = 5;

export function RecentTrips({ trips, compact }: { trips: VehicleTrip[]; /** A list for a phone, without drivers' names. */ compact?: boolean }) {
  const [showAll, setShowAll] = useState(false);
  if (trips.length === 0) {
    return (
      <EmptyState title="No trips recorded yet">
        Trips appear here once they are imported from the telematics export or entered by a fleet manager.
      </EmptyState>
    );
  }
  const totalKm = trips.reduce((sum, t) => sum + (t.distanceKm || 0), 0);
  const summary = `${formatNumber(trips.length)} ${trips.length === 1 ? 'trip' : 'trips'}, ${formatQuantity(totalKm, 'km')} in all`;
  if (compact) {
    return (
      <div>
        <ul className="divide-y divide-line rounded-md border border-line bg-surface">
          {(showAll ? trips : trips.slice(0, COMPACT_FIRST)).map((t) => (
            <li key={t.id} className="flex items-center justify-between gap-3 px-4 py-3">
              <span className="min-w-0">
                <span className="block truncate font-medium text-ink">{t.routeName}</span>
                <time dateTime={t.startedAt} className="tabular block text-sm text-slate">
                  {formatDateTime(t.startedAt)}
                </time>
              </span>
              <span className="tabular shrink-0 text-right">
                <span className="block font-medium text-ink">{formatQuantity(t.distanceKm, 'km', 1)}</span>
                <span className="block text-sm text-slate">{formatQuantity(t.meanSpeedKmh, 'km/h')}</span>
              </span>
            </li>
          ))}
        </ul>
        <div className="mt-2 flex flex-wrap items-center justify-between gap-2">
          <p className="text-sm text-slate">{summary}</p>
          {trips.length > COMPACT_FIRST ? (
            <Button variant="quiet" onClick={() => setShowAll((v) => !v)} aria-expanded={showAll}>
              {showAll ? `Show the latest ${COMPACT_FIRST}` : `Show all ${trips.length}`}
            </Button>
          ) : null}
        </div>
      </div>
    );
  }
  return (
    <SimpleTable
      label="Recent trips"
      rows={trips}
      columns={[
        {
          key: 'start',
          header: 'Started',
          cell: (t) => <DateCell value={t.startedAt} withTime />,
        },
        { key: 'route', header: 'Route', cell: (t) => t.routeName },
        { key: 'driver', header: 'Driver', cell: (t) => t.driverName ?? '—' },
        { key: 'distance', header: 'Distance', unit: 'km', numeric: true, cell: (t) => formatNumber(t.distanceKm, 1) },
        { key: 'duration', header: 'Time', unit: 'h:min', numeric: true, cell: (t) => formatHoursMinutes(minutesBetween(t.startedAt, t.endedAt)) },
        { key: 'speed', header: 'Mean speed', unit: 'km/h', numeric: true, cell: (t) => formatNumber(t.meanSpeedKmh) },
        { key: 'payload', header: 'Payload', unit: 'kg', numeric: true, cell: (t) => formatNumber(t.payloadKg) },
      ]}
      footer={summary}
    />
  );
}
