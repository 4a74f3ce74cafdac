import type { ListParams } from '@/lib/api-client';

export const routeKeys = {
  all: ['routes'] as const,
  lists: () => [...routeKeys.all, 'list'] as const,
  list: (params: ListParams) => [...routeKeys.lists(), params] as const,
};
