import type { VehicleListParams } from './get-vehicles';
import { queryRoots } from '@/lib/query-keys';

export const vehicleKeys = {
  all: queryRoots.vehicles,
  lists: () => [...vehicleKeys.all, 'list'] as const,
  list: (params: VehicleListParams) => [...vehicleKeys.lists(), params] as const,
  details: () => [...vehicleKeys.all, 'detail'] as const,
  detail: (id: number) => [...vehicleKeys.details(), id] as const,
};
