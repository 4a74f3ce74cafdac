import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ListResponse } from '@/lib/api-client';
import { workshopKeys, type InspectionListItem } from './types';

export interface InspectionQuery {
  status?: string;
  assignee?: string;
  depotId?: number;
  pageSize?: number;
  page?: number;
}

export const inspectionsQueryOptions = (q: InspectionQuery) =>
  queryOptions({
    queryKey: workshopKeys.inspections({ ...q }),
    queryFn: ({ signal }) => api.get<ListResponse<InspectionListItem>>('/api/inspections', { query: { ...q }, signal }),
  });

export const useInspections = (q: InspectionQuery) => useQuery(inspectionsQueryOptions(q));
