import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ListResponse } from '@/lib/api-client';
import { depotKeys } from './depot-keys';

export interface Depot {
  id: number;
  name: string;
  address?: string | null;
  lat: number;
  lon: number;
  vehicleCount: number;
}

/** Every depot; a fleet has few, so one page of the largest size holds them all. */
export function getDepots(signal?: AbortSignal) {
  return api.get<ListResponse<Depot>>('/api/depots', { query: { pageSize: 200 }, signal });
}

export const depotsQueryOptions = () =>
  queryOptions({
    queryKey: depotKeys.list(),
    queryFn: ({ signal }) => getDepots(signal),
    staleTime: 10 * 60 * 1000,
  });

export function useDepots() {
  return useQuery(depotsQueryOptions());
}
