import { queryRoots } from '@/lib/query-keys';

export const rideReportKeys = {
  all: queryRoots.rideReports,
  scale: () => [...queryRoots.rideReports, 'scale'] as const,
  lists: () => [...queryRoots.rideReports, 'list'] as const,
  list: (params: Record<string, string | number | undefined>) => [...queryRoots.rideReports, 'list', params] as const,
  groups: (status: string) => [...queryRoots.rideReports, 'groups', status] as const,
  detail: (id: number) => [...queryRoots.rideReports, 'detail', id] as const,
  lines: () => [...queryRoots.rideReports, 'lines'] as const,
};

export interface RideReport {
  id: number;
  driverId: number;
  driverName: string | null;
  fleetNumber: string | null;
  routeId: number;
  routeName: string;
  segmentId: number;
  segmentSeq: number | null;
  segmentStartM: number | null;
  segmentEndM: number | null;
  segmentClass: string | null;
  segmentGdN0: number | null;
  segmentIri: number | null;
  segmentSource: string | null;
  lat: number;
  lon: number;
  positionSource: 'gps' | 'map';
  accuracyM: number | null;
  snappedLat: number;
  snappedLon: number;
  snapDistanceM: number;
  severity: number;
  felt: string[];
  note: string | null;
  hasPhoto: boolean;
  reportedAt: string;
  status: 'new' | 'accepted' | 'dismissed';
  decidedByName: string | null;
  decidedAt: string | null;
  dismissReason: string | null;
  classBefore: string | null;
  estimatedClass: string | null;
  estimatedGdN0: number | null;
  /** The segment's class and Gd(n0) just after the report was blended in (null for older decisions). */
  classAfter: string | null;
  gdN0After: number | null;
}

export const photoUrl = (id: number) => `/api/ride-reports/${id}/photo`;
