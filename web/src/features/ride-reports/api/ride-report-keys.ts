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

/** A ride report as the list and the review board read it. */
export type { RideReportView as RideReport } from '@contracts/drivers';

export const photoUrl = (id: number) => `/api/ride-reports/${id}/photo`;
