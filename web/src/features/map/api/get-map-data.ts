import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export interface MapData {
  routes: { id: number; name: string }[];
  depots: { id: number; name: string; lat: number; lon: number; address: string | null }[];
  /** Parallel arrays, one entry per segment. */
  segments: { id: number[]; routeId: number[]; isoClass: (string | null)[]; coords: [number, number][][] };
}

export const mapKeys = { all: ['map'] as const, data: () => ['map', 'segments'] as const, config: () => ['map', 'config'] as const, segment: (id: number) => ['map', 'segment', id] as const };

export const mapDataQueryOptions = () => queryOptions({ queryKey: mapKeys.data(), queryFn: ({ signal }) => api.get<MapData>('/api/map/segments', { signal }), staleTime: 60_000 });

export function useMapData() {
  return useQuery(mapDataQueryOptions());
}
