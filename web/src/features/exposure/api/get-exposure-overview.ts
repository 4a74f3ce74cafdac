import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { exposureKeys } from './get-exposure';

interface Contributor {
  id: number;
  name: string;
  hours: number;
  meanWeightedAccel: number;
  sharePct: number;
  shareAbovePct: number;
  daysAbove: number;
}

export interface ExposureOverview {
  actionValue: number;
  limitValue: number;
  caution: string;
  method: string;
  from: string;
  to: string;
  drivers: { driverId: number; name: string; daysDriven: number; daysAboveAction: number; daysAboveLimit: number; maxA8: number; lastDay: string }[];
  daysAbove: { driverId: number; name: string; day: string; a8: number; hours: number; trips: number; status: string; seatFactor: string | null; topRoute: string | null; topVehicle: string | null }[];
  routes: Contributor[];
  vehicles: Contributor[];
}

export const exposureOverviewQueryOptions = (q: { from?: string; to?: string }) =>
  queryOptions({ queryKey: exposureKeys.overview(q), queryFn: ({ signal }) => api.get<ExposureOverview>('/api/exposure/overview', { query: q, signal }) });

export function useExposureOverview(q: { from?: string; to?: string }) {
  return useQuery(exposureOverviewQueryOptions(q));
}
