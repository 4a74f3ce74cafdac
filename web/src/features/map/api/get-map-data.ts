import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { queryRoots } from '@/lib/query-keys';

export interface MapData {
  routes: { id: number; name: string }[];
  depots: { id: number; name: string; lat: number; lon: number; address: string | null }[];
  /** Parallel arrays, one entry per segment. */
  segments: { id: number[]; routeId: number[]; isoClass: (string | null)[]; coords: [number, number][][] };
}

export const mapKeys = { all: queryRoots.map, data: () => [...queryRoots.map, 'segments'] as const, config: () => [...queryRoots.map, 'config'] as const, segment: (id: number) => [...queryRoots.map, 'segment', id] as const };

export const mapDataQueryOptions = () => queryOptions({ queryKey: mapKeys.data(), queryFn: ({ signal }) => api.get<MapData>('/api/map/segments', { signal }), staleTime: 60_000 });

export function useMapData() {
  return useQuery(mapDataQueryOptions());
}
