import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export interface SpeedAdviceParams {
  specId?: number;
  comfort?: string;
  powerLimitW?: number;
  segmentId?: number;
}

export interface SpeedAdvice {
  route: { id: number; name: string; defaultSpeedKmh: number };
  spec: { id: number; name: string };
  comfort: { key: string; label: string; range: string; limit: number };
  comfortBands: { key: string; label: string; range: string; limit: number }[];
  powerLimitW: number;
  rangeKmh: [number, number];
  segments: { id: number; seq: number; startM: number; endM: number; isoClass: string | null; gdN0: number | null; postedKmh: number; advisedKmh: number | null; comfortKmh: number | null; powerKmh: number | null; limitedBy: string; belowMinimum: boolean }[];
  summary: { lowestKmh: number | null; segmentsBelowPosted: number };
  chart: { segmentId: number; seq: number; isoClass: string | null; gdN0: number; points: { speedKmh: number; weightedAccel: number; damperPowerW: number; powerAxle: string }[] } | null;
  caution: string;
  method: string;
}

export const speedAdviceKeys = { all: ['speed-advice'] as const, route: (routeId: number, p: SpeedAdviceParams) => ['speed-advice', routeId, p] as const };

export const speedAdviceQueryOptions = (routeId: number, p: SpeedAdviceParams) =>
  queryOptions({
    queryKey: speedAdviceKeys.route(routeId, p),
    queryFn: ({ signal }) => api.get<SpeedAdvice>(`/api/routes/${routeId}/speed-advice`, { query: { ...p }, signal }),
    placeholderData: keepPreviousData,
  });

export function useSpeedAdvice(routeId: number | null, p: SpeedAdviceParams) {
  return useQuery({ ...speedAdviceQueryOptions(routeId ?? 0, p), enabled: routeId !== null });
}
