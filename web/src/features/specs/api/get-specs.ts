import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ListResponse } from '@/lib/api-client';
import type { SuspensionSpec } from '@/lib/suspension';
import { specKeys } from './spec-keys';

export interface SpecListItem extends SuspensionSpec {
  vehicleCount: number;
}

/** Every suspension spec; a fleet has a handful of vehicle types, so one page holds them all. */
export function getSpecs(signal?: AbortSignal) {
  return api.get<ListResponse<SpecListItem>>('/api/specs', { query: { pageSize: 200 }, signal });
}

export const specsQueryOptions = () =>
  queryOptions({
    queryKey: specKeys.list(),
    queryFn: ({ signal }) => getSpecs(signal),
    staleTime: 10 * 60 * 1000,
  });

export function useSpecs() {
  return useQuery(specsQueryOptions());
}
