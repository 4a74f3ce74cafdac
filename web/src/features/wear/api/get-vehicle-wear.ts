import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export interface WearDay {
  day: string;
  distanceKm: number;
  energyJ: number;
  cumEnergyJ: number;
  lifeUsedFraction: number;
  dampingNsPerM: number;
  springDamage: number;
}

export interface DamperWear {
  id: number;
  position: string;
  axleIndex: number;
  partNumber: string | null;
  installedAt: string;
  energyJ: number;
  springDamage: number;
  lifeUsedFraction: number;
  nominalDampingNsPerM: number;
  dampingNsPerM: number;
  ratedDamperLifeKm: number;
  /** Opening wear: km before the trips on record, the energy charged for them [J] and on what basis; null until estimated. */
  opening: { km: number; energyJ: number; basis: string } | null;
  lastDutyDay: string | null;
  prediction: {
    asOf: string;
    windowDays: number;
    windowKm: number;
    windowEnergyJ: number;
    rateJPerDay: number;
    lifeEnergyJ: number;
    lifeSource: string;
    thresholdFraction: number;
    thresholdDate: string | null;
    endOfLifeDate: string | null;
    springRatePerDay: number;
    springThresholdDate: string | null;
    basis: Record<string, string> | null;
  } | null;
  path: { day: string; lifeUsedFraction: number }[];
  history: WearDay[];
}

export interface RouteDuty {
  routeId: number;
  routeName: string;
  axleIndex: number;
  trips: number;
  km: number;
  energyJ: number;
  energyJPerKm: number;
  sharePct: number;
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
  all: ['wear'] as const,
  vehicle: (id: number) => [...wearKeys.all, 'vehicle', id] as const,
};

export const vehicleWearQueryOptions = (id: number) =>
  queryOptions({ queryKey: wearKeys.vehicle(id), queryFn: ({ signal }) => api.get<VehicleWear>(`/api/vehicles/${id}/wear`, { signal }) });

export function useVehicleWear(id: number) {
  return useQuery(vehicleWearQueryOptions(id));
}
