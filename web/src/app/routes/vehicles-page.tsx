import { PageHeader } from '@/components/ui/page-header';
import { VehiclesTable } from '@/features/vehicles/components/vehicles-table';
import { useVehicleListParams } from '@/features/vehicles/hooks/use-vehicle-list-params';
import { vehiclePath } from '../navigation';
import { useVehicleFilterOptions } from './use-vehicle-filter-options';

export function VehiclesPage() {
  const [params, update] = useVehicleListParams();
  const options = useVehicleFilterOptions();
  return (
    <>
      <title>Vehicles · Reboundry</title>
      <PageHeader title="Vehicles" description="Every vehicle in the fleet. Open one to see its dampers, trips and inspections." />
      <VehiclesTable params={params} onParamsChange={update} vehiclePath={vehiclePath} {...options} />
    </>
  );
}
