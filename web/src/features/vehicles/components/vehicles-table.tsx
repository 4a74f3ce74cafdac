import { useMemo } from 'react';
import { Link } from 'react-router';
import { createColumnHelper } from '@tanstack/react-table';
import { Button } from '@/components/ui/button';
import { DataTable, pagedTableProps } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { SelectField, type Option } from '@/components/ui/field';
import { FilterBar } from '@/components/ui/filter-bar';
import { formatNumber } from '@/lib/format';
import { vehiclesExportUrl } from '../api/export-vehicles';
import { useVehicles, VEHICLE_STATUSES, type VehicleListItem, type VehicleListParams } from '../api/get-vehicles';
import { VehicleStatusBadge, vehicleStatusLabels } from './vehicle-status-badge';

const col = createColumnHelper<VehicleListItem>();

interface VehiclesTableProps {
  params: VehicleListParams;
  onParamsChange: (patch: Partial<VehicleListParams>) => void;
  depotOptions: Option[];
  specOptions: Option[];
  /** Where a vehicle's row links to. */
  vehiclePath: (id: number) => string;
  /** Larger rows for the workshop tablet. */
  roomy?: boolean;
  /** Offers an edit button on each row (managers). */
  onEdit?: (vehicle: VehicleListItem) => void;
}

/** The fleet's vehicles with search, filters, server-side paging and sorting, and a CSV download of every match. */
export function VehiclesTable({ params, onParamsChange, depotOptions, specOptions, vehiclePath, roomy, onEdit }: VehiclesTableProps) {
  const query = useVehicles(params);

  const columns = useMemo(
    () => [
      col.accessor('fleetNumber', {
        header: 'Fleet no.',
        meta: { label: 'Fleet number' },
        cell: (c) => (
          <Link to={vehiclePath(c.row.original.id)} className="link font-medium whitespace-nowrap">
            {c.getValue()}
          </Link>
        ),
      }),
      col.accessor('plate', {
        header: 'Plate',
        cell: (c) => <span className="font-mono text-[0.8125rem] tracking-wide whitespace-nowrap">{c.getValue()}</span>,
      }),
      col.accessor('status', {
        header: 'Status',
        cell: (c) => <VehicleStatusBadge status={c.getValue()} />,
      }),
      col.accessor('specName', { header: 'Spec' }),
      col.accessor('depotName', { header: 'Depot' }),
      col.accessor('driverName', {
        header: 'Driver',
        enableSorting: false,
        cell: (c) => c.getValue() ?? <span className="text-slate">Not assigned</span>,
      }),
      col.accessor('odometerKm', {
        header: 'Odometer',
        meta: { numeric: true, unit: 'km' },
        cell: (c) => formatNumber(c.getValue()),
      }),
      ...(onEdit
        ? [
            col.display({
              id: 'edit',
              header: () => <span className="sr-only">Actions</span>,
              meta: { className: 'w-px text-right' },
              cell: (c) => (
                <Button size="sm" variant="quiet" onClick={() => onEdit(c.row.original)} aria-label={`Edit ${c.row.original.fleetNumber}`}>
                  Edit
                </Button>
              ),
            }),
          ]
        : []),
    ],
    [vehiclePath, onEdit],
  );

  const filtered = Boolean(params.q || params.depotId || params.specId || params.status);
  const statusOptions: Option[] = [
    { value: '', label: 'Any status' },
    ...VEHICLE_STATUSES.map((s) => ({ value: s, label: vehicleStatusLabels[s] })),
  ];

  const toolbar = (
    <FilterBar
      label="Filter vehicles"
      columns="md:grid-cols-[minmax(12rem,1.4fr)_repeat(3,minmax(9rem,1fr))_auto]"
      search={{ label: 'Fleet number or plate', value: params.q ?? '', onChange: (q) => onParamsChange({ q: q || undefined }), placeholder: 'Part of a fleet number or plate' }}
      filtered={filtered}
      onClear={() => onParamsChange({ q: undefined, depotId: undefined, specId: undefined, status: undefined })}
    >
      <SelectField
        label="Depot"
        value={params.depotId ? String(params.depotId) : ''}
        onChange={(e) => onParamsChange({ depotId: e.target.value ? Number(e.target.value) : undefined })}
        options={[{ value: '', label: 'All depots' }, ...depotOptions]}
      />
      <SelectField
        label="Spec"
        value={params.specId ? String(params.specId) : ''}
        onChange={(e) => onParamsChange({ specId: e.target.value ? Number(e.target.value) : undefined })}
        options={[{ value: '', label: 'All specs' }, ...specOptions]}
      />
      <SelectField
        label="Status"
        value={params.status ?? ''}
        onChange={(e) => onParamsChange({ status: (e.target.value || undefined) as VehicleListParams['status'] })}
        options={statusOptions}
      />
    </FilterBar>
  );

  return (
    <DataTable
      columns={columns}
      {...pagedTableProps(query, params, onParamsChange, { noun: ['vehicle', 'vehicles'], exportUrl: vehiclesExportUrl(params) })}
      toolbar={toolbar}
      roomy={roomy}
      empty={
        filtered ? (
          <EmptyState title="No vehicles match these filters">
            Try a shorter search or clear a filter. The search looks at fleet numbers and plates.
          </EmptyState>
        ) : (
          <EmptyState title="No vehicles yet">
            Vehicles appear here once they are added to the fleet. A fleet manager can add them or import a list.
          </EmptyState>
        )
      }
    />
  );
}
