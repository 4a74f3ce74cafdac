import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ListResponse } from '@/lib/api-client';
import { rideReportKeys } from './ride-report-keys';

export interface RideReportGroup {
  segmentId: number;
  routeId: number;
  routeName: string;
  seq: number;
  startM: number;
  endM: number;
  isoClass: string | null;
  gdN0: number | null;
  roughnessSource: string | null;
  coords: [number, number][];
  mid: [number, number];
  count: number;
  maxSeverity: number;
  firstAt: string;
  lastAt: string;
  reportIds: number[];
}

export const rideReportGroupsQueryOptions = (status = 'new') =>
  queryOptions({ queryKey: rideReportKeys.groups(status), queryFn: ({ signal }) => api.get<ListResponse<RideReportGroup>>('/api/ride-reports/by-segment', { query: { status }, signal }) });

export function useRideReportGroups(status = 'new') {
  return useQuery(rideReportGroupsQueryOptions(status));
}
