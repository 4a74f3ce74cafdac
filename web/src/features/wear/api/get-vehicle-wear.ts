import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { queryRoots } from '@/lib/query-keys';

export interface WearDay {
  day: string;
  distanceKm: number;
  /** The day's distance weighted by road severity: km on the rated road that did the same wear. */
  wearKm: number;
  /** Road severity of the day's driving [×]: 1 = ISO 8608 class B at 80 km/h; null on a day without distance. */
  severity: number | null;
  lifeUsedFraction: number;
  dampingNsPerM: number;
  springDamage: number;
}

/** Where a damper's life comes from: the trade's prior, the fit to the fleet's removals, or a test-lane result on it. */
export type LifeSource = 'prior' | 'fleet' | 'test-lane';

export interface WearPrediction {
  asOf: string;
  windowDays: number;
  windowKm: number;
  windowWearKm: number;
  kmPerDay: number;
  wearKmPerDay: number;
  /** Road severity of the window [×]: wear km per km; null without distance in the window. */
  severity: number | null;
  /** Median life and its P10–P90, in wear km (km on the rated road). */
  lifeWearKm: number | null;
  lifeP10WearKm: number | null;
  lifeP90WearKm: number | null;
  /** Median life [km] at the damper's own recent road mix. */
  lifeKm: number | null;
  roadSensitivity: number | null;
  lifeSource: LifeSource;
  /** Life used by the distance alone and by the calendar alone (life used is the larger). */
  distanceLifeUsed: number;
  calendarLifeUsed: number;
  thresholdFraction: number;
  /** Quantile of the life the inspection date is scheduled on (0.5 = median). */
  scheduleQuantile: number;
  thresholdDate: string | null;
  endOfLifeDate: string | null;
  endOfLifeP10Date: string | null;
  endOfLifeP90Date: string | null;
  /** Which limit sets the end of life. */
  governedBy: 'distance' | 'calendar';
  springRatePerDay: number;
  springThresholdDate: string | null;
  basis: { method: string; life: string; opening: string; calendar: string; damping: string; window: string } | null;
}

export interface DamperWear {
  id: number;
  position: string;
  axleIndex: number;
  partNumber: string | null;
  installedAt: string;
  springDamage: number;
  lifeUsedFraction: number;
  nominalDampingNsPerM: number;
  dampingNsPerM: number;
  ratedDamperLifeKm: number;
  /** Opening wear: km before the trips on record, its share of life with a range, and on what basis; null until estimated. */
  opening: { km: number; share: number; shareLow: number; shareHigh: number; basis: string } | null;
  lastDutyDay: string | null;
  prediction: WearPrediction | null;
  path: { day: string; lifeUsedFraction: number }[];
  history: WearDay[];
}

export interface RouteDuty {
  routeId: number;
  routeName: string;
  axleIndex: number;
  trips: number;
  km: number;
  /** Mean road severity of the route's trips [×], weighted by distance. */
  severity: number;
  springDamage: number;
  avgWeightedAccel: number;
}

export interface VehicleWear {
  vehicleId: number;
  thresholdFraction: number;
  windowDays: number;
  caution: string;
  assumptions: string[];
  dampers: DamperWear[];
  dutyByRoute: RouteDuty[];
  nextInspection: { id: number; dueDate: string; status: string; trigger: string | null; reason: string; basis: Record<string, unknown> | null; assigneeName: string | null } | null;
}

export const wearKeys = {
  all: queryRoots.wear,
  vehicle: (id: number) => [...wearKeys.all, 'vehicle', id] as const,
};

export const vehicleWearQueryOptions = (id: number) =>
  queryOptions({ queryKey: wearKeys.vehicle(id), queryFn: ({ signal }) => api.get<VehicleWear>(`/api/vehicles/${id}/wear`, { signal }) });

export function useVehicleWear(id: number) {
  return useQuery(vehicleWearQueryOptions(id));
}
