import type { RouteListParams } from './get-routes';

export const routeKeys = {
  all: ['routes'] as const,
  lists: () => [...routeKeys.all, 'list'] as const,
  list: (params: RouteListParams) => [...routeKeys.lists(), params] as const,
};
