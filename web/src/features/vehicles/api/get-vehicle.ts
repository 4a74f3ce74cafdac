import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { SuspensionSpec } from '@/lib/suspension';
import type { VehicleListItem } from './get-vehicles';
import { vehicleKeys } from './vehicle-keys';

export type DamperPosition = 'FL' | 'FR' | 'ML' | 'MR' | 'RL' | 'RR';

export interface Damper {
  id: number;
  position: DamperPosition;
  installedAt: string;
  installedOdometerKm: number;
  removedAt: string | null;
  removalReason: string | null;
  /** Estimated fraction of rated life used, 0–1 (may exceed 1). */
  lifeUsedFraction: number | null;
  /** Present damping coefficient estimate [N·s/m]. */
  dampingNsPerM: number | null;
}

export interface VehicleTrip {
  id: number;
  routeId: number;
  routeName: string;
  startedAt: string;
  endedAt: string;
  distanceKm: number;
  meanSpeedKmh: number;
  payloadKg: number;
  driverName: string | null;
}

export type InspectionStatus = 'scheduled' | 'due' | 'overdue' | 'done' | 'cancelled';

export interface VehicleInspection {
  id: number;
  dueDate: string;
  status: InspectionStatus;
  reason: string | null;
  completedAt: string | null;
}

export interface VehicleDetail {
  vehicle: VehicleListItem & { commissionedAt: string | null };
  spec: SuspensionSpec;
  depot: { id: number; name: string; lat: number; lon: number };
  driver: { id: number; name: string } | null;
  dampers: Damper[];
  recentTrips: VehicleTrip[];
  inspections: VehicleInspection[];
}

export function getVehicle(id: number, signal?: AbortSignal) {
  return api.get<VehicleDetail>(`/api/vehicles/${id}`, { signal });
}

export const vehicleQueryOptions = (id: number) =>
  queryOptions({
    queryKey: vehicleKeys.detail(id),
    queryFn: ({ signal }) => getVehicle(id, signal),
  });

/** The vehicle's page data; waits while `id` is not known yet. */
export function useVehicle(id: number | undefined) {
  return useQuery({ ...vehicleQueryOptions(id ?? 0), enabled: id !== undefined });
}
