import type { RouteListParams } from './get-routes';
import { queryRoots } from '@/lib/query-keys';

export const routeKeys = {
  all: queryRoots.routes,
  lists: () => [...routeKeys.all, 'list'] as const,
  list: (params: RouteListParams) => [...routeKeys.lists(), params] as const,
};
