import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { workshopKeys, type InspectionDetail } from './types';

export const inspectionQueryOptions = (id: number) =>
  queryOptions({ queryKey: workshopKeys.inspection(id), queryFn: ({ signal }) => api.get<InspectionDetail>(`/api/inspections/${id}`, { signal }) });

export const useInspection = (id: number) => useQuery(inspectionQueryOptions(id));
