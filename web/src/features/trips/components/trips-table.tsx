import { useMemo } from 'react';
import { Link } from 'react-router';
import { createColumnHelper } from '@tanstack/react-table';
import { DataTable, pagedTableProps } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { TextField } from '@/components/ui/field';
import { formatDateTime, formatNumber } from '@/lib/format';
import { positiveInt, useListSearchParams } from '@/lib/use-list-search-params';
import { tripsExportUrl } from '../api/export-trips';
import { TRIP_SORTS, useTrips, type TripItem } from '../api/get-trips';

const col = createColumnHelper<TripItem>();

function readFilters(s: URLSearchParams) {
  return { vehicleId: positiveInt(s.get('vehicleId')), routeId: positiveInt(s.get('routeId')), from: s.get('from') || undefined, to: s.get('to') || undefined };
}

/** Every trip, newest first, with server-side paging, sorting and date filters. */
export function TripsTable({ vehiclePath, routePath }: { vehiclePath: (id: number) => string; routePath: (id: number) => string }) {
  const [params, update] = useListSearchParams({ sorts: TRIP_SORTS, defaultSort: '-startedAt', readFilters });
  const q = useTrips(params);
  const columns = useMemo(
    () => [
      col.accessor('startedAt', { header: 'Started', cell: (c) => formatDateTime(c.getValue()) }),
      col.accessor('fleetNumber', { header: 'Vehicle', cell: (c) => <Link className="link" to={vehiclePath(c.row.original.vehicleId)}>{c.getValue()}</Link> }),
      col.accessor('routeName', { header: 'Route', cell: (c) => <Link className="link" to={routePath(c.row.original.routeId)}>{c.getValue()}</Link> }),
      col.accessor('driverName', { header: 'Driver', enableSorting: false, cell: (c) => c.getValue() ?? '—' }),
      col.accessor('distanceKm', { header: 'Distance', meta: { numeric: true, unit: 'km' }, cell: (c) => formatNumber(c.getValue(), 1) }),
      col.accessor('meanSpeedKmh', { header: 'Mean speed', meta: { numeric: true, unit: 'km/h' }, cell: (c) => formatNumber(c.getValue(), 1) }),
      col.accessor('payloadKg', { header: 'Payload', enableSorting: false, meta: { numeric: true, unit: 'kg' }, cell: (c) => formatNumber(c.getValue()) }),
    ],
    [vehiclePath, routePath],
  );
  return (
    <DataTable
      columns={columns}
      {...pagedTableProps(q, params, update, { noun: ['trip', 'trips'], exportUrl: tripsExportUrl(params) })}
      empty={<EmptyState title="No trips match">Change the dates, or import a trip file.</EmptyState>}
      toolbar={
        <div className="flex flex-wrap gap-3">
          <TextField label="From" type="date" value={params.from ?? ''} onChange={(e) => update({ from: e.target.value || undefined })} />
          <TextField label="To" type="date" value={params.to ?? ''} onChange={(e) => update({ to: e.target.value || undefined })} />
        </div>
      }
    />
  );
}
