import { Link } from 'react-router';
import { Button } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';
import { SimpleTable } from '@/components/ui/simple-table';
import { formatNumber } from '@/lib/format';
import type { Depot } from '../api/get-depots';

/** Depots with their position and how many vehicles are based at each. */
export function DepotsTable({ depots, vehiclesPath, onEdit }: { depots: Depot[]; vehiclesPath: (depotId: number) => string; /** Offers an edit button per depot. */ onEdit?: (depot: Depot) => void }) {
  if (depots.length === 0) {
    return <EmptyState title="No depots yet">Add a depot first; every vehicle is based at one.</EmptyState>;
  }
  const total = depots.reduce((s, d) => s + d.vehicleCount, 0);
  return (
    <SimpleTable
      label="Depots"
      rows={depots}
      columns={[
        { key: 'name', header: 'Depot', rowHeader: true, cell: (d) => (d.address ? <>{d.name}<span className="block text-xs text-slate">{d.address}</span></> : d.name) },
        { key: 'lat', header: 'Latitude', unit: '°', numeric: true, cell: (d) => formatNumber(d.lat, 4) },
        { key: 'lon', header: 'Longitude', unit: '°', numeric: true, cell: (d) => formatNumber(d.lon, 4) },
        {
          key: 'vehicles',
          header: 'Vehicles',
          numeric: true,
          cell: (d) => (
            <Link to={vehiclesPath(d.id)} className="link" aria-label={`${d.vehicleCount} vehicles at ${d.name}`}>
              {formatNumber(d.vehicleCount)}
            </Link>
          ),
        },
        ...(onEdit
          ? [
              {
                key: 'edit',
                header: <span className="sr-only">Actions</span>,
                cell: (d: Depot) => (
                  <Button size="sm" variant="quiet" onClick={() => onEdit(d)} aria-label={`Edit ${d.name}`}>
                    Edit
                  </Button>
                ),
                className: 'w-px text-right',
              },
            ]
          : []),
      ]}
      footer={`${formatNumber(depots.length)} ${depots.length === 1 ? 'depot' : 'depots'}, ${formatNumber(total)} vehicles in service or in the workshop. Retired vehicles are not counted.`}
    />
  );
}
