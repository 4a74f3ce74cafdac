import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { rideReportKeys } from './ride-report-keys';

export interface RideScale {
  severities: { level: number; key: string; label: string; description: string; classSteps: number }[];
  felt: { key: string; label: string }[];
  maxSnapM: number;
  estimateRule: string;
}

export const rideScaleQueryOptions = () => queryOptions({ queryKey: rideReportKeys.scale(), queryFn: ({ signal }) => api.get<RideScale>('/api/ride-reports/scale', { signal }), staleTime: Infinity });

export function useRideScale() {
  return useQuery(rideScaleQueryOptions());
}
