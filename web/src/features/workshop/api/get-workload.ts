import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { workshopKeys } from './types';

export interface Workload {
  weekStarts: string[];
  depots: { depotId: number; depotName: string; mechanics: number; overdue: number; later: number; unassigned: number; weeks: { weekStart: string; inspections: number }[] }[];
}

export const workloadQueryOptions = (weeks = 8) =>
  queryOptions({ queryKey: workshopKeys.workload(weeks), queryFn: ({ signal }) => api.get<Workload>('/api/workload', { query: { weeks }, signal }) });

export const useWorkload = (weeks = 8) => useQuery(workloadQueryOptions(weeks));
