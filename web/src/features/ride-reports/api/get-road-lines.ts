import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { rideReportKeys } from './ride-report-keys';

/** The road segments to tap on (the same data the road map draws). */
export interface RoadLines {
  segments: { id: number[]; routeId: number[]; isoClass: (string | null)[]; coords: [number, number][][] };
}

export const roadLinesQueryOptions = () => queryOptions({ queryKey: rideReportKeys.lines(), queryFn: ({ signal }) => api.get<RoadLines>('/api/map/segments', { signal }), staleTime: 5 * 60_000 });

export function useRoadLines() {
  return useQuery(roadLinesQueryOptions());
}
