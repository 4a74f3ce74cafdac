import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { queryRoots } from '@/lib/query-keys';

export const exposureKeys = {
  all: queryRoots.exposure,
  driver: (q: { driverId?: number; from?: string; to?: string }) => [...queryRoots.exposure, 'driver', q] as const,
  overview: (q: { from?: string; to?: string }) => [...queryRoots.exposure, 'overview', q] as const,
};

export interface ExposureDays {
  actionValue: number;
  limitValue: number;
  caution: string;
  method: string;
  driver: { id: number; name: string };
  from: string;
  to: string;
  days: { day: string; a8: number; hours: number; trips: number; maxWeightedAccel: number; status: string; seatFactor: string | null }[];
  summary: { daysDriven: number; daysAboveAction: number; daysAboveLimit: number; maxA8: number | null };
}

export const exposureQueryOptions = (q: { driverId?: number; from?: string; to?: string }) =>
  queryOptions({ queryKey: exposureKeys.driver(q), queryFn: ({ signal }) => api.get<ExposureDays>('/api/exposure', { query: q, signal }) });

export function useExposure(q: { driverId?: number; from?: string; to?: string }, enabled = true) {
  return useQuery({ ...exposureQueryOptions(q), enabled });
}
