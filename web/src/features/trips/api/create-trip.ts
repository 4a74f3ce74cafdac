import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api, type ListResponse } from '@/lib/api-client';
import { tripKeys } from './get-trips';
import { queryRoots } from '@/lib/query-keys';

export interface TripBody {
  vehicleId: number;
  routeId: number;
  driverId: number | null;
  startedAt: string;
  endedAt: string;
  distanceKm: number;
  meanSpeedKmh: number;
  payloadKg: number | null;
}

export function useCreateTrip() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (b: TripBody) => api.post<{ id: number }>('/api/trips', b),
    onSuccess: () => void qc.invalidateQueries({ queryKey: queryRoots.trips }),
  });
}

/** Vehicles, routes and drivers to choose from in the trip form. */
export function useTripOptions() {
  return useQuery({
    queryKey: tripKeys.options(),
    queryFn: async ({ signal }) => {
      const [v, r, u] = await Promise.all([
        api.get<ListResponse<{ id: number; fleetNumber: string; status: string; driverId: number | null }>>('/api/vehicles', { query: { pageSize: 200 }, signal }),
        api.get<ListResponse<{ id: number; name: string; lengthKm: number; defaultSpeedKmh: number }>>('/api/routes', { query: { pageSize: 200 }, signal }),
        api.get<ListResponse<{ id: number; name: string; role: string; active: boolean }>>('/api/users', { query: { pageSize: 200 }, signal }),
      ]);
      return { vehicles: v.items.filter((x) => x.status !== 'retired'), routes: r.items, drivers: u.items.filter((x) => x.role === 'driver' && x.active) };
    },
    staleTime: 60_000,
  });
}
