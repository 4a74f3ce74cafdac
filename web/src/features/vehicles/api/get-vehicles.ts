import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ListParams, type ListResponse } from '@/lib/api-client';
import { vehicleKeys } from './vehicle-keys';

export const VEHICLE_STATUSES = ['in_service', 'workshop', 'retired'] as const;
export type VehicleStatus = (typeof VEHICLE_STATUSES)[number];

export const VEHICLE_SORTS = ['fleetNumber', 'plate', 'odometerKm', 'status', 'depotName', 'specName'] as const;
export type VehicleSortField = (typeof VEHICLE_SORTS)[number];

export interface VehicleListItem {
  id: number;
  fleetNumber: string;
  plate: string;
  status: VehicleStatus;
  odometerKm: number;
  specId: number;
  specName: string;
  depotId: number;
  depotName: string;
  driverId: number | null;
  driverName: string | null;
}

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
