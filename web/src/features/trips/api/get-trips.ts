import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ListParams, type ListResponse } from '@/lib/api-client';
import { queryRoots } from '@/lib/query-keys';

export interface TripItem {
  id: number;
  vehicleId: number;
  fleetNumber: string;
  routeId: number;
  routeName: string;
  driverId: number | null;
  driverName: string | null;
  startedAt: string;
  endedAt: string;
  distanceKm: number;
  meanSpeedKmh: number;
  payloadKg: number | null;
  processed: boolean;
}

export const TRIP_SORTS = ['startedAt', 'distanceKm', 'meanSpeedKmh', 'fleetNumber', 'routeName'] as const;

export interface TripListParams extends ListParams {
  vehicleId?: number;
  routeId?: number;
  from?: string;
  to?: string;
}

export const tripKeys = { all: queryRoots.trips, list: (p: TripListParams) => [...queryRoots.trips, 'list', p] as const, options: () => [...queryRoots.trips, 'options'] as const };

export const tripsQueryOptions = (p: TripListParams) =>
  queryOptions({ queryKey: tripKeys.list(p), queryFn: ({ signal }) => api.get<ListResponse<TripItem>>('/api/trips', { query: { ...p }, signal }), placeholderData: keepPreviousData });

export function useTrips(p: TripListParams) {
  return useQuery(tripsQueryOptions(p));
}
