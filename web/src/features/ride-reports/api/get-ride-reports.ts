import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ListResponse } from '@/lib/api-client';
import { rideReportKeys, type RideReport } from './ride-report-keys';

export interface RideReportParams {
  page?: number;
  pageSize?: number;
  sort?: string;
  status?: string;
  segmentId?: number;
  [k: string]: string | number | undefined;
}

export const rideReportsQueryOptions = (params: RideReportParams) =>
  queryOptions({
    queryKey: rideReportKeys.list(params),
    queryFn: ({ signal }) => api.get<ListResponse<RideReport>>('/api/ride-reports', { query: params, signal }),
    placeholderData: keepPreviousData,
  });

export function useRideReports(params: RideReportParams) {
  return useQuery(rideReportsQueryOptions(params));
}
