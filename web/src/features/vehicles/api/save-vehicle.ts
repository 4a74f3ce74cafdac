import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { VehicleListItem, VehicleStatus } from './get-vehicles';
import { vehicleKeys } from './vehicle-keys';
import { queryRoots } from '@/lib/query-keys';

export interface VehicleInput {
  fleetNumber: string;
  plate: string;
  specId: number;
  depotId: number;
  driverId: number | null;
  odometerKm: number;
}

export type VehiclePatch = Partial<VehicleInput> & { status?: VehicleStatus };

export function createVehicle(body: VehicleInput) {
  return api.post<{ vehicle: VehicleListItem }>('/api/vehicles', body);
}

export function updateVehicle(id: number, patch: VehiclePatch) {
  return api.patch<{ vehicle: VehicleListItem }>(`/api/vehicles/${id}`, patch);
}

/** Adds a vehicle (`id` undefined) or changes one; lists, the vehicle's page and depot counts refresh. */
export function useSaveVehicle(id: number | undefined) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: VehicleInput | VehiclePatch) => (id === undefined ? createVehicle(body as VehicleInput) : updateVehicle(id, body)),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: vehicleKeys.all });
      void queryClient.invalidateQueries({ queryKey: queryRoots.depots });
    },
  });
}
