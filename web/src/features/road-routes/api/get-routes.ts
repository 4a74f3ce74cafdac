import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ListParams, type ListResponse } from '@/lib/api-client';
import { routeKeys } from './route-keys';

export interface RouteListItem {
  id: number;
  name: string;
  description: string | null;
  lengthKm: number;
  /** Usual speed on the route [km/h]. */
  defaultSpeedKmh: number | null;
  segmentCount: number;
  /** Roughest ISO 8608 class on the route, `A`–`H`, or null when no segment has one. */
  worstClass: string | null;
}

export const ROUTE_SORTS = ['name', 'lengthM'] as const;

export interface RouteListParams extends ListParams {
  /** Name, partial. */
  q?: string;
}

export function getRoutes(params: RouteListParams, signal?: AbortSignal) {
  return api.get<ListResponse<RouteListItem>>('/api/routes', { query: { ...params }, signal });
}

export const routesQueryOptions = (params: RouteListParams) =>
  queryOptions({
    queryKey: routeKeys.list(params),
    queryFn: ({ signal }) => getRoutes(params, signal),
    placeholderData: keepPreviousData,
  });

export function useRoutes(params: RouteListParams) {
  return useQuery(routesQueryOptions(params));
}
