/** What the inspection endpoints answer, as the client reads it. */

export type OpenInspectionStatus = 'scheduled' | 'due' | 'overdue';

/** An open inspection in `GET /api/inspections/due` (the due list and the due map). */
export interface DueInspection {
  id: number;
  vehicleId: number;
  fleetNumber: string;
  plate: string;
  vehicleStatus: string;
  depotId: number;
  depotName: string;
  depotLat: number;
  depotLon: number;
  dueDate: string;
  status: OpenInspectionStatus;
  /** prediction | interval_km | interval_months | manual | follow_up, null for ones entered before the nightly job. */
  trigger: string | null;
  reason: string;
  basis: Record<string, unknown> | null;
  assignee: { id: number; name: string } | null;
  /** Days from today to the due date (negative when overdue) [days]. */
  daysLeft: number;
  /** Highest consumed life among the vehicle's fitted dampers [1]. */
  maxLifeUsed: number | null;
  firstThresholdDate: string | null;
  /** Routes the vehicle drove in the 90 days before today (for the due map). */
  routeIds: number[];
}
