import { useState } from 'react';
import { useNavigate } from 'react-router';
import { useQuery } from '@tanstack/react-query';
import { Button } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { meQueryOptions } from '@/features/auth/api/get-me';
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
  const [adding, setAdding] = useState(false);
  const formOptions = useVehicleFormOptions(isManager);
  const navigate = useNavigate();
  return (
    <>
      <title>Vehicles · Reboundry</title>
      <PageHeader
        title="Vehicles"
        description="Every vehicle in the fleet. Open one to see its dampers, trips and inspections."
        actions={
          isManager ? (
            <Button variant="primary" onClick={() => setAdding(true)}>
              Add a vehicle
            </Button>
          ) : null
        }
      />
      <VehiclesTable params={params} onParamsChange={update} vehiclePath={vehiclePath} {...options} />
      {isManager ? <VehicleFormDialog open={adding} onClose={() => setAdding(false)} options={formOptions} onSaved={(v) => void navigate(vehiclePath(v.id))} /> : null}
    </>
  );
}
