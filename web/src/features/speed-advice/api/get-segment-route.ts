import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { queryRoots } from '@/lib/query-keys';

export const segmentRouteQueryOptions = (id: number) =>
  queryOptions({ queryKey: [...queryRoots.speedAdvice, 'segment', id], queryFn: ({ signal }) => api.get<{ segment: { id: number; routeId: number } }>(`/api/segments/${id}`, { signal }) });

export function useSegmentRoute(id: number | null) {
  return useQuery({ ...segmentRouteQueryOptions(id ?? 0), enabled: id !== null });
}
