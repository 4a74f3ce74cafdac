import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { SegmentOnRoute } from '@contracts/roads';
import { mapKeys } from './get-map-data';

export interface SegmentDetail {
  segment: SegmentOnRoute & {
    /** The segment's own speed [km/h], none when it takes its route's. */
    speedKmh: number | null;
    /** The route's speed [km/h]. */
    defaultSpeedKmh: number | null;
  };
  observations: { id: number; iri: number | null; isoClass: string | null; source: string; observedOn: string; recordedByName: string | null; note: string | null }[];
  currentRule: string;
}

export const segmentQueryOptions = (id: number) => queryOptions({ queryKey: mapKeys.segment(id), queryFn: ({ signal }) => api.get<SegmentDetail>(`/api/segments/${id}`, { signal }) });

export function useSegment(id: number | null) {
  return useQuery({ ...segmentQueryOptions(id ?? 0), enabled: id !== null });
}
