import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { mapKeys } from './get-map-data';

export interface MapConfig {
  tileUrl: string;
  attribution: string;
  offline: boolean;
}

export const mapConfigQueryOptions = () => queryOptions({ queryKey: mapKeys.config(), queryFn: ({ signal }) => api.get<MapConfig>('/api/map-config', { signal }), staleTime: Infinity });

export function useMapConfig() {
  return useQuery(mapConfigQueryOptions());
}
