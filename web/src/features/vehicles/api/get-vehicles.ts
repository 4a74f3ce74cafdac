import type { ListParams } from '@/lib/api-client';
import { pagedList } from '@/lib/list-query';
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

const vehicles = pagedList<VehicleListParams, VehicleListItem>('/api/vehicles', vehicleKeys.list);
export const getVehicles = vehicles.get;
export const vehiclesQueryOptions = vehicles.options;
export const useVehicles = vehicles.useList;
