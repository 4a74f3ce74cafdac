import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ListParams, type ListResponse } from '@/lib/api-client';
import { routeKeys } from './route-keys';

export interface RouteListItem {
  id: number;
  name: string;
  lengthKm: number;
  segmentCount: number;
  /** Roughest ISO 8608 class on the route, `A`–`H`, or null when no segment has one. */
  worstClass: string | null;
}

export function getRoutes(params: ListParams, signal?: AbortSignal) {
  return api.get<ListResponse<RouteListItem>>('/api/routes', { query: { ...params }, signal });
}

export const routesQueryOptions = (params: ListParams) =>
  queryOptions({
    queryKey: routeKeys.list(params),
    queryFn: ({ signal }) => getRoutes(params, signal),
    placeholderData: keepPreviousData,
  });

export function useRoutes(params: ListParams) {
  return useQuery(routesQueryOptions(params));
}
