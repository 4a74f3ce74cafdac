import { queryOptions, useQuery } from '@tanstack/react-query';
import type { VehicleWear } from '@contracts/wear';
import { api } from '@/lib/api-client';
import { queryRoots } from '@/lib/query-keys';

export type { DamperWear, LifeSource, RouteDuty, VehicleWear, WearDay, WearPrediction } from '@contracts/wear';

export const wearKeys = {
  all: queryRoots.wear,
  vehicle: (id: number) => [...wearKeys.all, 'vehicle', id] as const,
};

export const vehicleWearQueryOptions = (id: number) =>
  queryOptions({ queryKey: wearKeys.vehicle(id), queryFn: ({ signal }) => api.get<VehicleWear>(`/api/vehicles/${id}/wear`, { signal }) });

export function useVehicleWear(id: number) {
  return useQuery(vehicleWearQueryOptions(id));
}
