import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export type OpenInspectionStatus = 'scheduled' | 'due' | 'overdue';

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
  /** prediction | interval_km | interval_months | manual, null for ones entered before the nightly job. */
  trigger: string | null;
  reason: string;
  basis: Record<string, unknown> | null;
  assignee: { id: number; name: string } | null;
  /** Days from today to the due date (negative when overdue) [days]. */
  daysLeft: number;
  maxLifeUsed: number | null;
  firstThresholdDate: string | null;
  /** Routes the vehicle drove in the 90 days before today. */
  routeIds: number[];
}

export interface DueInspections {
  items: DueInspection[];
  total: number;
  today: string;
  counts: { overdue: number; due: number; next30: number; next90: number; later: number };
  rules: { threshold: number; leadDays: number; intervalKm: number; intervalMonths: number; dueSoonDays: number; horizonDays: number };
}

export const inspectionKeys = {
  all: ['inspections'] as const,
  due: (depotId: number | null) => [...inspectionKeys.all, 'due', { depotId }] as const,
};

export const dueInspectionsQueryOptions = (depotId: number | null) =>
  queryOptions({
    queryKey: inspectionKeys.due(depotId),
    queryFn: ({ signal }) => api.get<DueInspections>('/api/inspections/due', { query: { depotId }, signal }),
  });

export function useDueInspections(depotId: number | null) {
  return useQuery(dueInspectionsQueryOptions(depotId));
}
