import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { mapKeys } from './get-map-data';

export interface SegmentDetail {
  segment: {
    id: number;
    routeId: number;
    routeName: string;
    seq: number;
    startM: number;
    endM: number;
    speedKmh: number | null;
    defaultSpeedKmh: number | null;
    iri: number | null;
    gdN0: number | null;
    isoClass: string | null;
    roughnessSource: string | null;
    roughnessDate: string | null;
  };
  observations: { id: number; iri: number | null; isoClass: string | null; source: string; observedOn: string; recordedByName: string | null; note: string | null }[];
  currentRule: string;
}

export const segmentQueryOptions = (id: number) => queryOptions({ queryKey: mapKeys.segment(id), queryFn: ({ signal }) => api.get<SegmentDetail>(`/api/segments/${id}`, { signal }) });

export function useSegment(id: number | null) {
  return useQuery({ ...segmentQueryOptions(id ?? 0), enabled: id !== null });
}
