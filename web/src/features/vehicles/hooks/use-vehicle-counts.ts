import { useQueries } from '@tanstack/react-query';
import { vehiclesQueryOptions, VEHICLE_STATUSES, type VehicleStatus } from '../api/get-vehicles';

/**
 * How many vehicles are in each status, from the list endpoint's totals (one small request per
 * status, one row each).
 */
export function useVehicleCounts(filters: { depotId?: number } = {}) {
  return useQueries({
    queries: VEHICLE_STATUSES.map((status) => ({
      ...vehiclesQueryOptions({ page: 1, pageSize: 1, status, ...filters }),
      placeholderData: undefined,
    })),
    combine: (results) => ({
      counts: Object.fromEntries(VEHICLE_STATUSES.map((s, i) => [s, results[i]?.data?.total])) as Record<VehicleStatus, number | undefined>,
      isPending: results.some((r) => r.isPending),
      error: results.find((r) => r.error)?.error ?? null,
      refetch: () => results.forEach((r) => void r.refetch()),
    }),
  });
}
