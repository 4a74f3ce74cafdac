import { useMemo } from 'react';
import { useQuery } from '@tanstack/react-query';
import { usersQueryOptions } from '@/features/users/api/get-users';
import { vehiclesQueryOptions } from '@/features/vehicles/api/get-vehicles';
import type { VehicleFormOptions } from '@/features/vehicles/components/vehicle-form';
import { useVehicleFilterOptions } from './use-vehicle-filter-options';

/**
 * Choices for the vehicle form: specs, depots, active drivers, and which drivers already drive a
 * vehicle (so they are not offered twice). A fleet's drivers and vehicles fit in one large page.
 */
/** `enabled`: only for managers, the only role that may list people. */
export function useVehicleFormOptions(enabled: boolean): VehicleFormOptions {
  const { depotOptions, specOptions } = useVehicleFilterOptions();
  const drivers = useQuery({ ...usersQueryOptions({ page: 1, pageSize: 200, sort: 'name', role: 'driver', active: true }), enabled });
  const vehicles = useQuery({ ...vehiclesQueryOptions({ page: 1, pageSize: 200, sort: 'fleetNumber' }), enabled });
  return useMemo(
    () => ({
      depotOptions,
      specOptions,
      drivers: (drivers.data?.items ?? []).map((u) => ({ id: u.id, name: u.name })),
      assignedDrivers: new Map((vehicles.data?.items ?? []).filter((v) => v.driverId !== null && v.status !== 'retired').map((v) => [v.driverId!, v.fleetNumber])),
    }),
    [depotOptions, specOptions, drivers.data, vehicles.data],
  );
}
