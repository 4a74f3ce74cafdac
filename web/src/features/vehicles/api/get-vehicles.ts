import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ListParams, type ListResponse } from '@/lib/api-client';
import type { VehicleListItem, VehicleStatus } from '@contracts/fleet';
import { vehicleKeys } from './vehicle-keys';

export { VEHICLE_STATUSES, type VehicleListItem, type VehicleStatus } from '@contracts/fleet';

export const VEHICLE_SORTS = ['fleetNumber', 'plate', 'odometerKm', 'status', 'depotName', 'specName'] as const;
export type VehicleSortField = (typeof VEHICLE_SORTS)[number];


export interface VehicleListParams extends ListParams {
  /** Fleet number or plate, partial. */
  q?: string;
  depotId?: number;
  specId?: number;
  status?: VehicleStatus;
}

export function getVehicles(params: VehicleListParams, signal?: AbortSignal) {
  return api.get<ListResponse<VehicleListItem>>('/api/vehicles', { query: { ...params }, signal });
}

export const vehiclesQueryOptions = (params: VehicleListParams) =>
  queryOptions({
    queryKey: vehicleKeys.list(params),
    queryFn: ({ signal }) => getVehicles(params, signal),
    placeholderData: keepPreviousData,
  });

export function useVehicles(params: VehicleListParams) {
  return useQuery(vehiclesQueryOptions(params));
}
