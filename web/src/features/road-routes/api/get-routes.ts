import type { ListParams } from '@/lib/api-client';
import { pagedList } from '@/lib/list-query';
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

const routes = pagedList<RouteListParams, RouteListItem>('/api/routes', routeKeys.list);
export const getRoutes = routes.get;
export const routesQueryOptions = routes.options;
export const useRoutes = routes.useList;
