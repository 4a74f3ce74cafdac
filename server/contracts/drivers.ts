/** What the ride-report endpoints answer, as the client reads it. */
import type { RoughnessSource } from './roads';

export const RIDE_REPORT_STATUSES = ['new', 'accepted', 'dismissed'] as const;
export type RideReportStatus = (typeof RIDE_REPORT_STATUSES)[number];

/** Where the driver was, what they felt and what they wrote: what a ride report is filed with. */
export interface RideReportFiled {
  driverId: number;
  vehicleId: number | null;
  routeId: number;
  segmentId: number;
  /** Where the driver was (WGS 84 degrees) and how it was given. */
  lat: number;
  lon: number;
  positionSource: 'gps' | 'map';
  accuracyM: number | null;
  /** The nearest point on the segment and how far the report was moved to it [m]. */
  snappedLat: number;
  snappedLon: number;
  snapDistanceM: number;
  /** 1 uneven, 2 harsh, 3 severe. */
  severity: number;
  felt: string[];
  note: string | null;
  photoType: string | null;
  photoBytes: number | null;
}

/** A ride report in GET /api/ride-reports and /api/ride-reports/:id, with its segment and the manager's decision. */
export interface RideReportView extends RideReportFiled {
  id: number;
  driverName: string | null;
  fleetNumber: string | null;
  routeName: string;
  segmentSeq: number | null;
  segmentStartM: number | null;
  segmentEndM: number | null;
  segmentClass: string | null;
  segmentGdN0: number | null;
  segmentIri: number | null;
  segmentSource: RoughnessSource | null;
  hasPhoto: boolean;
  reportedAt: string;
  status: RideReportStatus;
  decidedByName: string | null;
  decidedAt: string | null;
  dismissReason: string | null;
  classBefore: string | null;
  estimatedClass: string | null;
  estimatedGdN0: number | null;
  /** The segment's class and Gd(n0) just after the report was blended in (null for older decisions). */
  classAfter: string | null;
  gdN0After: number | null;
  observationId: number | null;
}
