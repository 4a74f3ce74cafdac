import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { SuspensionSpec } from '@/lib/suspension';
import type { VehicleListItem } from './get-vehicles';
import { vehicleKeys } from './vehicle-keys';

/** `FL`, `FR`, `RL`, `RR`, and for three-axle trucks also `ML`, `MR`. */
export type DamperPosition = string;

export interface Damper {
  id: number;
  position: DamperPosition;
  /** Index into the spec's axles, 0 at the front. */
  axleIndex: number;
  partNumber: string | null;
  installedAt: string;
  installedOdometerKm: number;
  removedAt: string | null;
  removedOdometerKm: number | null;
  removalReason: string | null;
  /** Distance driven on this damper: to removal, or to the present odometer reading [km]. */
  distanceKm: number;
  /** Estimated fraction of rated life used, 0–1 (may exceed 1). Meaningful once the wear run has estimated it. */
  lifeUsedFraction: number | null;
  /** When the wear run last estimated this damper; null until it has (absent from older servers). */
  wearUpdatedAt?: string | null;
  /** Present damping coefficient estimate [N·s/m]. */
  dampingNsPerM: number | null;
  /** Distance on it before the trips on record, included in life used as an estimate [km]; null until estimated. */
  openingKm?: number | null;
  /** What that estimate rests on, in words. */
  openingBasis?: string | null;
}

/** Whether the wear run has estimated this damper yet (a 0 before the first run is not an estimate). */
export function hasWearEstimate(d: Damper): boolean {
  if (d.wearUpdatedAt !== undefined) return d.wearUpdatedAt !== null;
  return typeof d.lifeUsedFraction === 'number' && d.lifeUsedFraction > 0;
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
  /** Fraction of rated life at which an inspection is due (the server's setting). */
  inspectionThreshold?: number;
}

export function getVehicle(id: number, signal?: AbortSignal) {
  return api.get<VehicleDetail>(`/api/vehicles/${id}`, { signal });
}

export const vehicleQueryOptions = (id: number) =>
  queryOptions({
    queryKey: vehicleKeys.detail(id),
    queryFn: ({ signal }) => getVehicle(id, signal),
    // The page's loader has just asked: a failure (a missing vehicle, say) is shown, not asked again on mount.
    retryOnMount: false,
  });

/** The vehicle's page data; waits while `id` is not known yet. */
export function useVehicle(id: number | undefined) {
  return useQuery({ ...vehicleQueryOptions(id ?? 0), enabled: id !== undefined });
}
