import 'leaflet/dist/leaflet.css';
import './map.css';
import { useQuery } from '@tanstack/react-query';
import { TileLayer } from 'react-leaflet';
import { api } from '@/lib/api-client';
import { queryRoots } from '@/lib/query-keys';

interface MapConfig {
  tileUrl: string;
  attribution: string;
  offline: boolean;
}

/** The base layer from /api/map-config: the app's own offline tiles unless MAP_TILE_URL is set. */
export function BaseLayer() {
  const cfg = useQuery({ queryKey: [...queryRoots.map, 'config'], queryFn: ({ signal }) => api.get<MapConfig>('/api/map-config', { signal }), staleTime: Infinity });
  if (!cfg.data) return null;
  return <TileLayer url={cfg.data.tileUrl} attribution={cfg.data.attribution} />;
}
