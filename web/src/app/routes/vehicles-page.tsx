import { useCallback, useState } from 'react';
import { useNavigate } from 'react-router';
import { useQuery } from '@tanstack/react-query';
import { Button } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { meQueryOptions } from '@/features/auth/api/get-me';
import type { VehicleListItem } from '@/features/vehicles/api/get-vehicles';
import { VehicleFormDialog } from '@/features/vehicles/components/vehicle-form';
import { VehiclesTable } from '@/features/vehicles/components/vehicles-table';
import { useVehicleListParams } from '@/features/vehicles/hooks/use-vehicle-list-params';
import { vehiclePath } from '../navigation';
import { useVehicleFilterOptions } from './use-vehicle-filter-options';
import { useVehicleFormOptions } from './use-vehicle-form-options';

export function VehiclesPage() {
  const [params, update] = useVehicleListParams();
  const options = useVehicleFilterOptions();
  const me = useQuery(meQueryOptions());
  const isManager = me.data?.role === 'manager';
  const [form, setForm] = useState<{ open: boolean; vehicle?: VehicleListItem }>({ open: false });
  const formOptions = useVehicleFormOptions(isManager && form.open);
  const navigate = useNavigate();
  const onEdit = useCallback((vehicle: VehicleListItem) => setForm({ open: true, vehicle }), []);
  return (
    <>
      <title>Vehicles · Reboundry</title>
      <PageHeader
        title="Vehicles"
        description="Every vehicle in the fleet. Open one to see its dampers, trips and inspections."
        actions={
          isManager ? (
            <Button variant="primary" onClick={() => setForm({ open: true })}>
              Add a vehicle
            </Button>
          ) : null
        }
      />
      <VehiclesTable params={params} onParamsChange={update} vehiclePath={vehiclePath} {...options} onEdit={isManager ? onEdit : undefined} />
      {isManager ? (
        <VehicleFormDialog
          open={form.open}
          vehicle={form.vehicle}
          onClose={() => setForm({ open: false })}
          options={formOptions}
          onSaved={(v) => (form.vehicle ? undefined : void navigate(vehiclePath(v.id)))}
        />
      ) : null}
    </>
  );
}
