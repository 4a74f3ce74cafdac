/** What the fleet endpoints answer, as the client reads it. */

export const VEHICLE_STATUSES = ['in_service', 'workshop', 'retired'] as const;
export type VehicleStatus = (typeof VEHICLE_STATUSES)[number];

/** A vehicle in `GET /api/vehicles` (and the body of a saved vehicle). */
export interface VehicleListItem {
  id: number;
  fleetNumber: string;
  plate: string;
  status: VehicleStatus;
  odometerKm: number;
  specId: number;
  specName: string;
  depotId: number;
  depotName: string;
  driverId: number | null;
  driverName: string | null;
  /** The day it entered service (the interval rule counts from it until a first inspection), or null. */
  commissionedAt: string | null;
}
