import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { queryRoots } from '@/lib/query-keys';

export interface SpeedAdviceParams {
  specId?: number;
  comfort?: string;
  /** Damper limit as a multiple of each damper's own mean power on class B at 80 km/h. */
  damperMultiple?: number;
  load?: 'laden' | 'unladen';
  /** Hours a day at the advised level, for the daily-exposure limit. */
  exposureHours?: number;
  segmentId?: number;
}

export interface SpeedAdviceBand {
  key: string;
  label: string;
  range: string;
  limit: number;
}

export interface SpeedAdvice {
  route: { id: number; name: string; defaultSpeedKmh: number };
  spec: { id: number; name: string; vehicleClass: string };
  comfort: SpeedAdviceBand;
  comfortBands: SpeedAdviceBand[];
  damper: { multiple: number | null; absoluteW: number | null; axles: { label: string; referencePowerW: number; limitW: number }[] };
  load: { case: 'laden' | 'unladen'; payloadKg: number; text: string };
  seat: { factor: number; seat: number; seatSource: string; cab: number; track: number; correlation: number };
  exposureHours: number;
  rangeKmh: [number, number];
  segments: {
    id: number;
    seq: number;
    startM: number;
    endM: number;
    isoClass: string | null;
    gdN0: number | null;
    postedKmh: number;
    advisedKmh: number | null;
    rideKmh: number | null;
    powerKmh: number | null;
    limitedBy: string;
    powerAxle: string | null;
    belowMinimum: boolean;
  }[];
  summary: { lowestKmh: number | null; highestKmh: number | null; segmentsNeedingAttention: number; segmentsBelowPosted: number };
  chart: { segmentId: number; seq: number; isoClass: string | null; gdN0: number; points: { speedKmh: number; seatWeightedAccel: number; floorWeightedAccel: number; damperPowerW: number; damperPowerRatio: number; powerAxle: string }[] } | null;
  assumptions: string[];
  attention: string;
  caution: string;
  method: string;
}

export const speedAdviceKeys = { all: queryRoots.speedAdvice, route: (routeId: number, p: SpeedAdviceParams) => [...queryRoots.speedAdvice, routeId, p] as const };

export const speedAdviceQueryOptions = (routeId: number, p: SpeedAdviceParams) =>
  queryOptions({
    queryKey: speedAdviceKeys.route(routeId, p),
    queryFn: ({ signal }) => api.get<SpeedAdvice>(`/api/routes/${routeId}/speed-advice`, { query: { ...p }, signal }),
    placeholderData: keepPreviousData,
  });

export function useSpeedAdvice(routeId: number | null, p: SpeedAdviceParams) {
  return useQuery({ ...speedAdviceQueryOptions(routeId ?? 0, p), enabled: routeId !== null });
}
