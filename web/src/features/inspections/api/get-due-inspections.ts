import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { queryRoots } from '@/lib/query-keys';
import type { DueInspection } from '@contracts/inspections';

export type { DueInspection, OpenInspectionStatus } from '@contracts/inspections';

/** Order of the due list: by due date, or most-worn damper first. */
export type DueSort = 'due' | 'lifeUsed';

export interface DueInspections {
  items: DueInspection[];
  total: number;
  today: string;
  sort: DueSort;
  counts: { overdue: number; due: number; next30: number; next90: number; later: number };
  rules: { threshold: number; leadDays: number; intervalKm: number; intervalMonths: number; dueSoonDays: number; horizonDays: number };
}

export const inspectionKeys = {
  all: queryRoots.inspections,
  due: (depotId: number | null, sort: DueSort = 'due') => [...inspectionKeys.all, 'due', { depotId, sort }] as const,
};

export const dueInspectionsQueryOptions = (depotId: number | null, sort: DueSort = 'due') =>
  queryOptions({
    queryKey: inspectionKeys.due(depotId, sort),
    queryFn: ({ signal }) => api.get<DueInspections>('/api/inspections/due', { query: { depotId, sort }, signal }),
  });

export function useDueInspections(depotId: number | null, sort: DueSort = 'due') {
  return useQuery(dueInspectionsQueryOptions(depotId, sort));
}
