import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { RouteDetail } from './get-route';
import { invalidateRoots, staleAfter } from '@/lib/query-keys';

export type LineInput = { format: 'coordinates'; coordinates: [number, number][] } | { format: 'geojson'; text: string } | { format: 'csv'; text: string };

export interface CreateRouteBody {
  name: string;
  description?: string;
  depotId?: number | null;
  defaultSpeedKmh: number;
  segmentLengthM: number;
  statedClass?: string | null;
  line: LineInput;
}

export interface RoutePreview {
  lengthM: number;
  pointCount: number;
  segments: { seq: number; startM: number; endM: number; coords: [number, number][] }[];
}

export function useCreateRoute() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (v: { body: CreateRouteBody; preview: boolean }): Promise<RoutePreview | RouteDetail> =>
      v.preview ? api.post<RoutePreview>('/api/routes?preview=true', v.body) : api.post<RouteDetail>('/api/routes', v.body),
    onSuccess: (_d, v) => {
      if (!v.preview) {
        void invalidateRoots(qc, staleAfter.roadData);
      }
    },
  });
}
